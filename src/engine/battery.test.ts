import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { makeBatteryDispatcher, type BatterySpecInput, type DispatchResult, type DispatchSettingsInput } from "./battery";
import { EngineInputError } from "./errors";
import { touPeriodByHour, ratePlanSchema, type RatePlanInput } from "./rates";
import { HOURS_PER_YEAR } from "./year-calendar";

// Round-trip 81 % splits into ηc = ηd = √0.81 = 0.9, which keeps the hand arithmetic exact.
const battery: BatterySpecInput = { usableKwh: 10, continuousKw: 5, peakKw: 7, roundTripEfficiencyPct: 81, minSocPct: 10, maxSocPct: 100, coupling: "ac" };
const flatPlan: RatePlanInput = { name: "flat", energy: { kind: "flat", centsPerKwh: 20 }, compensation: { kind: "net-billing", exportCentsPerKwh: 5 } };
const peakHours = { startHour: 16, endHour: 21, periodId: "peak" };
const touPlan = (gridCharging: boolean): RatePlanInput => ({
  name: "peak 16–21 every day",
  energy: {
    kind: "tou",
    periods: [{ id: "off", centsPerKwh: 10 }, { id: "peak", centsPerKwh: 40 }],
    seasons: [{ name: "all", months: [1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12], otherHoursPeriodId: "off", weekday: [peakHours], weekend: [peakHours] }],
  },
  compensation: { kind: "no-export" },
  batteryGridChargingAllowed: gridCharging,
});

/** 1 January only; every later hour is 0 (nothing moves after day 1). */
function firstDay(day: number[]): Float64Array {
  const out = new Float64Array(HOURS_PER_YEAR);
  out.set(day, 0);
  return out;
}
const load = firstDay(new Array(24).fill(1));
//                        0  1  2  3  4  5  6  7  8  9 10 11 12 13 14 15 16 17 18 19 20 21 22 23
const pv = firstDay([0, 0, 0, 0, 0, 0, 0, 0, 1, 2, 4, 6, 7, 6, 4, 2, 0, 0, 0, 0, 0, 0, 0, 0]);
const day1 = (xs: Float64Array) => Array.from(xs.slice(0, 24), (v) => Math.round(v * 1e6) / 1e6);

describe("a hand-worked day (self-consumption, AC-coupled, 10 kWh, 5 kW, 81 % round trip, floor 10 %)", () => {
  const run = makeBatteryDispatcher(flatPlan)({ loadHourlyKwh: load, productionHourlyKwh: pv, battery, settings: { mode: "self-consumption" } });

  it("charges from the surplus within power and room, and covers the evening", () => {
    // Start at the floor: 10 % of 10 kWh = 1 kWh. Hours 0–7: the floor gives nothing, the grid 1 kWh each.
    // 9: surplus 1 → stored 1, soc 1 + 0.9 = 1.9. 10: surplus 3 → soc 1.9 + 2.7 = 4.6.
    // 11: surplus 5 (= power) → soc 4.6 + 4.5 = 9.1. 12: room (10 − 9.1)/0.9 = 1 → stored 1, soc 10, export 6 − 1 = 5.
    // 13–15: full, export 5, 3, 1. 16–23: 1 kWh each from the battery, taking 1/0.9 each:
    // soc 10 − k/0.9; after 8 h 10 − 8.888889 = 1.111111 (the floor is not reached).
    expect(day1(run.hours.storedFromSolar)).toEqual([0, 0, 0, 0, 0, 0, 0, 0, 0, 1, 3, 5, 1, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0]);
    expect(day1(run.hours.exported)).toEqual([0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 5, 5, 3, 1, 0, 0, 0, 0, 0, 0, 0, 0]);
    expect(day1(run.hours.batteryOut)).toEqual([0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 1, 1, 1, 1, 1, 1, 1, 1]);
    expect(day1(run.hours.gridToLoad)).toEqual([1, 1, 1, 1, 1, 1, 1, 1, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0]);
    expect(day1(run.hours.soc).slice(8, 17)).toEqual([1, 1.9, 4.6, 9.1, 10, 10, 10, 10, 8.888889]);
    expect(run.hours.soc[23]).toBeCloseTo(1.111111, 6);
    expect(run.hours.soc[HOURS_PER_YEAR - 1]).toBeCloseTo(1.111111, 6);
  });

  it("totals: solar 32 = 8 used + 10 stored + 14 exported; load 24 = 8 + 8 + 8", () => {
    const t = run.totals;
    expect([t.solarKwh, t.solarUsedKwh, t.storedFromSolarKwh, t.exportedKwh, t.clippedKwh]).toEqual([32, 8, 10, 14, 0]);
    expect([t.loadKwh, t.batteryOutKwh, t.gridToLoadKwh]).toEqual([24, 8, 8]);
    // Cells gave 8/0.9 = 8.888889 kWh → 0.888889 equivalent full cycles of 10 kWh.
    expect(t.equivalentFullCycles).toBeCloseTo(0.888889, 6);
    // Self-consumption (32 − 14)/32 = 56.25 %; self-sufficiency (24 − 8)/24 = 66.67 %.
    expect(t.selfConsumptionPct).toBeCloseTo(56.25, 9);
    expect(t.selfSufficiencyPct).toBeCloseTo(66.666667, 5);
  });

  it("an export limit of 4 kW clips what the meter may not take: hours 12 and 13 clip 1 kWh each", () => {
    const limited = makeBatteryDispatcher(flatPlan)({ loadHourlyKwh: load, productionHourlyKwh: pv, battery, settings: { mode: "self-consumption", exportLimitKw: 4 } });
    expect(day1(limited.hours.exported).slice(12, 16)).toEqual([4, 4, 3, 1]);
    expect(day1(limited.hours.clipped).slice(12, 16)).toEqual([1, 1, 0, 0]);
  });

  it("DC-coupled: energy beyond the inverter is stored first (hour 12: 1 kWh of 2 clipped fits)", () => {
    const clip = firstDay([0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 2, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0]);
    const dc = makeBatteryDispatcher(flatPlan)({
      loadHourlyKwh: load,
      productionHourlyKwh: pv,
      clippedDcHourlyKwh: clip,
      battery: { ...battery, coupling: "dc" },
      settings: { mode: "self-consumption" },
    });
    // Hour 12: room 1 kWh, taken from the clipped 2; the AC surplus 6 is all exported; 1 kWh stays clipped.
    expect([day1(dc.hours.storedFromSolar)[12], day1(dc.hours.exported)[12], day1(dc.hours.clipped)[12]]).toEqual([1, 6, 1]);
    expect(dc.totals.solarKwh).toBe(34);
  });

  it("backup mode keeps the reserve: 30 % of 10 kWh is never spent on the evening", () => {
    const backup = makeBatteryDispatcher(flatPlan)({ loadHourlyKwh: load, productionHourlyKwh: pv, battery, settings: { mode: "backup", reservePct: 30 } });
    // Floor 3 kWh: the day starts at 3; by the evening the battery is full and may give (10 − 3)·0.9 = 6.3 kWh.
    expect(backup.hours.soc[7]).toBe(3);
    expect(backup.totals.batteryOutKwh).toBeCloseTo(6.3, 9);
    expect(Math.min(...backup.hours.soc)).toBeGreaterThanOrEqual(3 - 1e-9);
  });
});

describe("time-of-use mode (peak 16–21 at 40 ¢, other hours 10 ¢)", () => {
  const noSun = new Float64Array(HOURS_PER_YEAR);
  it("charges from the grid in the cheap hours only when the plan allows it, and discharges only in the peak", () => {
    const run = makeBatteryDispatcher(touPlan(true))({ loadHourlyKwh: load, productionHourlyKwh: noSun, battery, settings: { mode: "time-of-use", gridCharging: true } });
    // 10 ¢ ÷ 0.81 = 12.3 ¢ < 40 ¢: worth it. Hour 0: 5 kW → soc 1 + 4.5 = 5.5. Hour 1: 5 → 10.
    // Hours 16–20: 1 kWh each → soc 10 − 5/0.9 = 4.444444. Hour 21: 5 → 8.944444. Hour 22: (10 − 8.944444)/0.9 = 1.172840 → 10.
    expect(day1(run.hours.gridToBattery)).toEqual([5, 5, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 5, 1.17284, 0]);
    expect(day1(run.hours.batteryOut)).toEqual([0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 1, 1, 1, 1, 1, 0, 0, 0]);
    expect(run.hours.soc[20]).toBeCloseTo(4.444444, 6);
    const denied = makeBatteryDispatcher(touPlan(false))({ loadHourlyKwh: load, productionHourlyKwh: noSun, battery, settings: { mode: "time-of-use", gridCharging: true } });
    expect(denied.totals.gridToBatteryKwh).toBe(0);
    expect(denied.notes.join(" ")).toMatch(/does not allow charging a battery from the grid/);
  });

  it("holds the morning's solar for the peak instead of spending it in the afternoon", () => {
    const run = makeBatteryDispatcher(touPlan(false))({ loadHourlyKwh: load, productionHourlyKwh: pv, battery, settings: { mode: "time-of-use" } });
    expect(day1(run.hours.batteryOut)).toEqual([0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 1, 1, 1, 1, 1, 0, 0, 0]);
  });

  it("refuses time-of-use mode on a flat plan, naming the plan", () => {
    expect(() => makeBatteryDispatcher(flatPlan)({ loadHourlyKwh: load, productionHourlyKwh: pv, battery, settings: { mode: "time-of-use" } })).toThrow(
      /time-of-use mode needs a time-of-use rate plan; "flat" is flat/,
    );
  });
});

describe("input checks", () => {
  const run = makeBatteryDispatcher(flatPlan);
  it("names the bad field", () => {
    const bad = (b: Partial<BatterySpecInput>, s: DispatchSettingsInput = { mode: "self-consumption" }) => {
      try {
        run({ loadHourlyKwh: load, productionHourlyKwh: pv, battery: { ...battery, ...b }, settings: s });
      } catch (e) {
        return (e as EngineInputError).issues.map((i) => `${i.path}: ${i.message}`).join("; ");
      }
      return "accepted";
    };
    expect(bad({ peakKw: 4 })).toBe("peakKw: must be at least the continuous rating (5 kW)");
    expect(bad({ minSocPct: 100 })).toBe("maxSocPct: must be above the minimum state of charge (100 %)");
    expect(bad({}, { mode: "self-consumption", reservePct: 20 })).toBe("reservePct: applies to backup mode only");
    expect(bad({}, { mode: "backup", reservePct: 100 })).toMatch(/the reserve \(100 %\) leaves nothing/);
    expect(() => run({ loadHourlyKwh: [1], productionHourlyKwh: pv, battery, settings: { mode: "backup" } })).toThrow(/loadHourlyKwh: must have 8760 hourly values, got 1/);
  });
});

// ---------------------------------------------------------------------------------------------
// Properties over random days and settings: the energy balance holds every hour to 1e-6 kWh,
// the state of charge stays within its limits and follows the flows, power stays within rating.

const TOL = 1e-6;
const kwh = (max: number) => fc.double({ min: 0, max, noNaN: true, noDefaultInfinity: true });
const arbDays = fc
  .integer({ min: 1, max: 3 })
  .chain((days) => fc.tuple(fc.array(kwh(6), { minLength: 24 * days, maxLength: 24 * days }), fc.array(kwh(12), { minLength: 24 * days, maxLength: 24 * days })));
const arbBattery = fc.record({
  usableKwh: fc.double({ min: 0.5, max: 40, noNaN: true }),
  continuousKw: fc.double({ min: 0.5, max: 12, noNaN: true }),
  roundTripEfficiencyPct: fc.double({ min: 60, max: 100, noNaN: true }),
  minSocPct: fc.integer({ min: 0, max: 40 }),
  maxSocPct: fc.integer({ min: 60, max: 100 }),
  coupling: fc.constantFrom("ac" as const, "dc" as const),
});
const arbSettings = fc.oneof(
  fc.constant<DispatchSettingsInput>({ mode: "self-consumption" }),
  fc.integer({ min: 41, max: 59 }).map<DispatchSettingsInput>((reservePct) => ({ mode: "backup", reservePct })),
  fc.boolean().map<DispatchSettingsInput>((gridCharging) => ({ mode: "time-of-use", gridCharging })),
);
const tile = (day: number[]) => Float64Array.from({ length: HOURS_PER_YEAR }, (_, h) => day[h % day.length]);

function checkHours(
  r: DispatchResult,
  l: Float64Array,
  p: Float64Array,
  clip: Float64Array | null,
  b: BatterySpecInput & { minSocPct: number; maxSocPct: number },
  floorPct: number,
  limit: number | null,
): void {
  const eta = Math.sqrt(b.roundTripEfficiencyPct / 100);
  const floor = (b.usableKwh * floorPct) / 100;
  const ceiling = (b.usableKwh * b.maxSocPct) / 100;
  const x = r.hours;
  let prev = floor;
  for (let h = 0; h < HOURS_PER_YEAR; h++) {
    const solar = p[h] + (clip ? clip[h] : 0);
    const flows = [x.solarUsed[h], x.storedFromSolar[h], x.gridToBattery[h], x.batteryOut[h], x.gridToLoad[h], x.exported[h], x.clipped[h]];
    if (flows.some((f) => f < -1e-12)) throw new Error(`hour ${h}: a negative flow ${flows}`);
    if (Math.abs(l[h] - (x.solarUsed[h] + x.batteryOut[h] + x.gridToLoad[h])) > TOL) throw new Error(`hour ${h}: load does not balance`);
    if (Math.abs(solar - (x.solarUsed[h] + x.storedFromSolar[h] + x.exported[h] + x.clipped[h])) > TOL) throw new Error(`hour ${h}: solar does not balance`);
    const expected = prev + (x.storedFromSolar[h] + x.gridToBattery[h]) * eta - x.batteryOut[h] / eta;
    if (Math.abs(x.soc[h] - expected) > TOL) throw new Error(`hour ${h}: state of charge ${x.soc[h]} does not follow the flows (${expected})`);
    if (x.soc[h] < floor - TOL || x.soc[h] > ceiling + TOL) throw new Error(`hour ${h}: state of charge ${x.soc[h]} outside [${floor}, ${ceiling}]`);
    if (x.storedFromSolar[h] + x.gridToBattery[h] > b.continuousKw + TOL || x.batteryOut[h] > b.continuousKw + TOL) throw new Error(`hour ${h}: over the power rating`);
    if ((x.storedFromSolar[h] + x.gridToBattery[h]) * x.batteryOut[h] > 0) throw new Error(`hour ${h}: charges and discharges at once`);
    if (limit !== null && x.exported[h] > limit + TOL) throw new Error(`hour ${h}: exports over the limit`);
    prev = x.soc[h];
  }
}

describe("energy balance properties (fast-check)", () => {
  // One dispatcher per plan and the peak hours once: the properties run whole years many times.
  const flatRun = makeBatteryDispatcher(flatPlan);
  const touRun = makeBatteryDispatcher(touPlan(true));
  const peak = touPeriodByHour(ratePlanSchema.parse(touPlan(true)).energy as Parameters<typeof touPeriodByHour>[0]);

  it("every hour balances to 1e-6 kWh, the state of charge follows the flows within its limits", () => {
    fc.assert(
      fc.property(arbDays, arbBattery, arbSettings, fc.option(fc.double({ min: 0, max: 8, noNaN: true }), { nil: null }), fc.boolean(), ([loadDays, pvDays], b, settings, limit, withClip) => {
        const l = tile(loadDays);
        const p = tile(pvDays);
        const clip = withClip ? tile(pvDays.map((v) => v / 4)) : null;
        const spec = { ...b, peakKw: b.continuousKw * 1.5 };
        const run = settings.mode === "time-of-use" ? touRun : flatRun;
        const r = run({ loadHourlyKwh: l, productionHourlyKwh: p, clippedDcHourlyKwh: clip, battery: spec, settings: { ...settings, exportLimitKw: limit } });
        const floorPct = Math.max(b.minSocPct, settings.mode === "backup" ? (settings.reservePct ?? 0) : 0);
        checkHours(r, l, p, clip, spec, floorPct, limit);
        if (settings.mode === "time-of-use") {
          for (let h = 0; h < HOURS_PER_YEAR; h++) if (peak[h] !== 1 && r.hours.batteryOut[h] > 0) throw new Error(`hour ${h}: discharged outside the peak`);
        }
      }),
      { numRuns: 60 },
    );
  }, 60_000);

  it("self-consumption never buys or exports more in any hour than the same home without the battery", () => {
    fc.assert(
      fc.property(arbDays, arbBattery, ([loadDays, pvDays], b) => {
        const base = { loadHourlyKwh: tile(loadDays), productionHourlyKwh: tile(pvDays), settings: { mode: "self-consumption" } as const };
        const withB = flatRun({ ...base, battery: { ...b, peakKw: b.continuousKw, coupling: "ac" } });
        const without = flatRun({ ...base, battery: null });
        for (let h = 0; h < HOURS_PER_YEAR; h++) {
          if (withB.hours.gridToLoad[h] > without.hours.gridToLoad[h] + TOL) throw new Error(`hour ${h}: buys more with the battery`);
          if (withB.hours.exported[h] > without.hours.exported[h] + TOL) throw new Error(`hour ${h}: exports more with the battery`);
        }
        expect(withB.totals.selfSufficiencyPct).toBeGreaterThanOrEqual(without.totals.selfSufficiencyPct - 1e-9);
      }),
      { numRuns: 40 },
    );
  }, 60_000);
});
