/**
 * What a battery does for one home over the typical year: the dispatch (battery.ts) turned into
 * the utility bill through the plan's own bill calculation (rates.ts), beside the bill with
 * solar alone and without solar; self-consumption, self-sufficiency, cycles; backup hours for
 * the picked critical loads (battery-backup.ts).
 *
 * The bill with a battery is billed from each hour's grid purchase (to the home and to the
 * battery) and export: the bill calculation nets them per hour, so it sees exactly the meter.
 */
import { backupHours, type BackupResult, type CriticalLoadsInput } from "./battery-backup";
import { makeBatteryDispatcher, type BatterySpecInput, type DispatchResult, type DispatchSettingsInput, type DispatchTotals } from "./battery";
import { makeBillCalculator, type AnnualBill, type RatePlanInput } from "./rates";
import { HOURS_PER_YEAR, type YearClock } from "./year-calendar";

export type BatteryReportInput = {
  plan: RatePlanInput;
  clock?: YearClock;
  loadHourlyKwh: ArrayLike<number>;
  productionHourlyKwh: ArrayLike<number>;
  clippedDcHourlyKwh?: ArrayLike<number> | null;
  battery: BatterySpecInput;
  settings: DispatchSettingsInput;
  /** Critical loads for the backup estimate (omit: no backup figures). */
  criticalLoads?: CriticalLoadsInput;
};

export type BatteryReport = {
  bills: {
    withoutSolarCents: number;
    solarOnlyCents: number;
    solarAndBatteryCents: number;
    /** What the battery adds to the solar's savings in year 1 (may be negative under net metering). */
    batterySavingsCents: number;
    solarSavingsCents: number;
  };
  withBattery: DispatchTotals;
  solarOnly: DispatchTotals;
  backup: BackupResult | null;
  notes: string[];
  /** The year-1 bills, for callers that show months. */
  annual: { withoutSolar: AnnualBill; solarOnly: AnnualBill; solarAndBattery: AnnualBill };
  dispatch: DispatchResult;
};

/** Each hour's grid purchase and export, as the bill calculation's usage and production. */
export function meterOf(d: DispatchResult): { importKwh: Float64Array; exportKwh: Float64Array } {
  const importKwh = new Float64Array(HOURS_PER_YEAR);
  for (let h = 0; h < HOURS_PER_YEAR; h++) importKwh[h] = d.hours.gridToLoad[h] + d.hours.gridToBattery[h];
  return { importKwh, exportKwh: d.hours.exported };
}

/** The report for one home (validates the plan and computes its calendar on each call). */
export function batteryReport(input: BatteryReportInput): BatteryReport {
  return makeBatteryReporter(input.plan, input.clock)(input);
}

/**
 * A reporter for one plan and clock: the plan's time-of-use calendar is computed once for the
 * dispatch and once for the bill, so an offer preview that changes the battery or its mode pays
 * only the year's loops.
 */
export function makeBatteryReporter(plan: RatePlanInput, clock: YearClock = { calendarYear: 2023, timeZone: null }): (input: Omit<BatteryReportInput, "plan" | "clock">) => BatteryReport {
  const dispatch = makeBatteryDispatcher(plan, clock);
  const bill = makeBillCalculator(plan, clock);
  return (input) => {
    const base = { loadHourlyKwh: input.loadHourlyKwh, productionHourlyKwh: input.productionHourlyKwh, clippedDcHourlyKwh: input.clippedDcHourlyKwh, settings: input.settings };
    const withBattery = dispatch({ ...base, battery: input.battery });
    const solarOnly = dispatch({ ...base, battery: null });
    const withoutSolar = bill(input.loadHourlyKwh, null);
    const meterSolar = meterOf(solarOnly);
    const meterBattery = meterOf(withBattery);
    const solarOnlyBill = bill(meterSolar.importKwh, meterSolar.exportKwh);
    const batteryBill = bill(meterBattery.importKwh, meterBattery.exportKwh);
    const backup = input.criticalLoads ? backupHours({ battery: input.battery, loads: input.criticalLoads, productionHourlyKwh: input.productionHourlyKwh }) : null;
    const notes = [...withBattery.notes];
    if (batteryBill.totalCents > solarOnlyBill.totalCents) notes.push("Under this rate plan the battery does not lower the bill: its charging losses cost more than the energy it moves is worth.");
    return {
      bills: {
        withoutSolarCents: withoutSolar.totalCents,
        solarOnlyCents: solarOnlyBill.totalCents,
        solarAndBatteryCents: batteryBill.totalCents,
        batterySavingsCents: solarOnlyBill.totalCents - batteryBill.totalCents,
        solarSavingsCents: withoutSolar.totalCents - solarOnlyBill.totalCents,
      },
      withBattery: withBattery.totals,
      solarOnly: solarOnly.totals,
      backup,
      notes,
      annual: { withoutSolar, solarOnly: solarOnlyBill, solarAndBattery: batteryBill },
      dispatch: withBattery,
    };
  };
}
