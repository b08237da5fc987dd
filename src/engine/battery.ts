/**
 * Hourly dispatch of a home battery over the typical year (8,760 hours, see year-calendar.ts).
 *
 * Each hour, in this order:
 * 1. Solar serves the home's load first ("solar used").
 * 2. What solar has left charges the battery (DC-coupled: energy the inverter would clip is
 *    taken first), within the charge power and the room below the top state of charge.
 * 3. What the home still needs comes from the battery when the mode lets it discharge this
 *    hour, within the power limit and down to the floor (minimum state of charge or reserve).
 * 4. Time-of-use mode may charge from the grid in the day's cheapest hours, only when the rate
 *    plan allows it (`batteryGridChargingAllowed`) and the settings ask for it, and only when
 *    the cheap price divided by the round-trip efficiency is below the day's peak price.
 * 5. The rest of the solar is exported, up to the export limit; beyond it, it is clipped.
 * The battery never exports (our choice: most interconnection agreements for home batteries
 * forbid or do not pay for battery export).
 *
 * Modes:
 * - self-consumption: store what would be exported, discharge whenever the home draws from
 *   the grid.
 * - time-of-use: store surplus solar at any hour, discharge only in the day's highest-priced
 *   hours (the plan's periods on the utility's wall clock), holding the charge for that window.
 * - backup: self-consumption above a reserve (N % of usable capacity) kept for outages.
 *
 * Conventions:
 * - The round-trip efficiency η is split evenly between charging and discharging:
 *   ηc = ηd = √η, a common modelling choice when only the round-trip figure is published.
 *   Charging x kWh (AC side) adds x·ηc to the state of charge; delivering y kWh takes y/ηd.
 *   The same split is used for AC- and DC-coupled batteries (our choice: datasheets give one
 *   round-trip figure).
 * - Power: each hour moves at most continuousKw × 1 h in either direction (charge and
 *   discharge share the rating: our choice). Peak kW only matters for starting loads in an
 *   outage (battery-backup.ts).
 * - DC-coupled with `inverterAcKw`: the hybrid inverter carries solar and battery output,
 *   so the battery delivers at most inverterAcKw − solar AC that hour; in an hour with clipped
 *   DC energy the inverter is at its rating, so the battery does not discharge.
 * - The year starts with the battery at its floor (our choice: the conservative start; it
 *   changes the year by at most one charge).
 * - Equivalent full cycles = energy drawn from the cells in a year ÷ usable capacity.
 *
 * Energy balance, every hour (checked by battery.test.ts to 1e-6 kWh):
 *   load  = solar used + battery out + grid to load
 *   solar = solar used + stored from solar + exported + clipped
 *   where solar = AC production + DC energy beyond the inverter (`clippedDcHourlyKwh`, if given)
 */
import { z } from "zod";
import { EngineInputError, parseOrThrow } from "./errors";
import { ratePlanSchema, touPeriodByHour, type RatePlanInput } from "./rates";
import { HOURS_PER_YEAR, type YearClock } from "./year-calendar";

export const batterySpecSchema = z
  .object({
    usableKwh: z.number().finite().positive().max(1000),
    continuousKw: z.number().finite().positive().max(500),
    peakKw: z.number().finite().positive().max(1000),
    roundTripEfficiencyPct: z.number().finite().min(50).max(100),
    /** Lowest and highest state of charge the controller allows, % of usable capacity. */
    minSocPct: z.number().finite().min(0).max(100).default(0),
    maxSocPct: z.number().finite().min(0).max(100).default(100),
    coupling: z.enum(["ac", "dc"]),
    /** DC-coupled: the hybrid inverter's AC rating, shared by solar and battery output. */
    inverterAcKw: z.number().finite().positive().max(1000).optional(),
  })
  .superRefine((b, ctx) => {
    if (b.peakKw < b.continuousKw) ctx.addIssue({ code: "custom", path: ["peakKw"], message: `must be at least the continuous rating (${b.continuousKw} kW)` });
    if (b.maxSocPct <= b.minSocPct) ctx.addIssue({ code: "custom", path: ["maxSocPct"], message: `must be above the minimum state of charge (${b.minSocPct} %)` });
    if (b.inverterAcKw !== undefined && b.coupling === "ac") ctx.addIssue({ code: "custom", path: ["inverterAcKw"], message: "applies to DC-coupled batteries only" });
  });
export type BatterySpec = z.output<typeof batterySpecSchema>;
export type BatterySpecInput = z.input<typeof batterySpecSchema>;

export const dispatchModeSchema = z.enum(["self-consumption", "time-of-use", "backup"]);
export type DispatchMode = z.output<typeof dispatchModeSchema>;

/** Reserve kept for outages in backup mode when none is given, % of usable (common practice: 20 %). */
export const DEFAULT_BACKUP_RESERVE_PCT = 20;

export const dispatchSettingsSchema = z
  .object({
    mode: dispatchModeSchema,
    /** Backup mode: % of usable capacity kept for outages. */
    reservePct: z.number().finite().min(0).max(100).optional(),
    /** Time-of-use mode: charge from the grid in cheap hours (only if the plan allows it). */
    gridCharging: z.boolean().default(false),
    /** Export limit at the meter, kW (null: none). Solar beyond it is clipped. */
    exportLimitKw: z.number().finite().min(0).max(1000).nullable().default(null),
  })
  .superRefine((s, ctx) => {
    if (s.reservePct !== undefined && s.mode !== "backup") ctx.addIssue({ code: "custom", path: ["reservePct"], message: "applies to backup mode only" });
    if (s.gridCharging && s.mode !== "time-of-use") ctx.addIssue({ code: "custom", path: ["gridCharging"], message: "applies to time-of-use mode only" });
  });
export type DispatchSettingsInput = z.input<typeof dispatchSettingsSchema>;

/** The flows of each hour, kWh, and the state of charge at the hour's end (kWh stored). */
const HOURLY_SERIES = ["solarUsed", "storedFromSolar", "gridToBattery", "batteryOut", "gridToLoad", "exported", "clipped", "soc"] as const;
export type DispatchHours = Record<(typeof HOURLY_SERIES)[number], Float64Array>;

export type DispatchTotals = {
  loadKwh: number;
  solarKwh: number;
  solarUsedKwh: number;
  storedFromSolarKwh: number;
  gridToBatteryKwh: number;
  batteryOutKwh: number;
  gridToLoadKwh: number;
  exportedKwh: number;
  clippedKwh: number;
  /** Energy drawn from the cells (batteryOut ÷ ηd). */
  cellDischargeKwh: number;
  equivalentFullCycles: number;
  /** Share of solar used at home, directly or through the battery. */
  selfConsumptionPct: number;
  /** Share of the load not bought from the grid. */
  selfSufficiencyPct: number;
};

export type DispatchResult = { hours: DispatchHours; totals: DispatchTotals; notes: string[] };

/** The numbers the hourly loop runs on (a battery of 0 kWh is the system without one). */
type Core = {
  capacityKwh: number;
  floorKwh: number;
  ceilingKwh: number;
  powerKw: number;
  etaCharge: number;
  etaDischarge: number;
  dc: boolean;
  inverterAcKw: number;
  exportLimitKw: number;
  /** 1 where the mode may discharge (null: every hour). */
  dischargeHour: Uint8Array | null;
  /** 1 where the grid may charge (null: never). */
  gridChargeHour: Uint8Array | null;
};

function newHours(): DispatchHours {
  return Object.fromEntries(HOURLY_SERIES.map((k) => [k, new Float64Array(HOURS_PER_YEAR)])) as DispatchHours;
}

/** The hot loop: one pass over the year, no allocation. */
function runYear(core: Core, load: ArrayLike<number>, pv: ArrayLike<number>, clip: ArrayLike<number> | null, out: DispatchHours): void {
  const { floorKwh, ceilingKwh, powerKw, etaCharge, etaDischarge, dc, inverterAcKw, exportLimitKw, dischargeHour, gridChargeHour } = core;
  let soc = floorKwh;
  for (let h = 0; h < HOURS_PER_YEAR; h++) {
    const l = load[h];
    const p = pv[h];
    const c = clip === null ? 0 : clip[h];
    const direct = l < p ? l : p;
    let surplus = p - direct;
    let deficit = l - direct;
    // Charge: clipped DC first (DC-coupled only), then surplus AC.
    let room = Math.min(powerKw, (ceilingKwh - soc) / etaCharge);
    if (room < 0) room = 0;
    const fromClip = dc ? Math.min(c, room) : 0;
    room -= fromClip;
    const fromSurplus = Math.min(surplus, room);
    room -= fromSurplus;
    surplus -= fromSurplus;
    soc += (fromClip + fromSurplus) * etaCharge;
    // Discharge.
    let delivered = 0;
    // An hour with clipped DC energy has the inverter at its rating: nothing more passes it.
    if (deficit > 0 && (dischargeHour === null || dischargeHour[h] === 1) && !(dc && c > 0)) {
      const available = (soc - floorKwh) * etaDischarge;
      const inverterRoom = dc ? inverterAcKw - p : Infinity;
      delivered = Math.max(0, Math.min(deficit, powerKw, available, inverterRoom));
      soc -= delivered / etaDischarge;
      deficit -= delivered;
    }
    // Grid charging in cheap hours, with what power and room are left.
    let fromGrid = 0;
    if (gridChargeHour !== null && gridChargeHour[h] === 1) {
      fromGrid = Math.max(0, Math.min(room, (ceilingKwh - soc) / etaCharge));
      soc += fromGrid * etaCharge;
    }
    const exported = surplus < exportLimitKw ? surplus : exportLimitKw;
    out.solarUsed[h] = direct;
    out.storedFromSolar[h] = fromClip + fromSurplus;
    out.gridToBattery[h] = fromGrid;
    out.batteryOut[h] = delivered;
    out.gridToLoad[h] = deficit;
    out.exported[h] = exported;
    out.clipped[h] = surplus - exported + (c - fromClip);
    out.soc[h] = soc;
  }
}

function totalsOf(core: Core, hours: DispatchHours, load: ArrayLike<number>, pv: ArrayLike<number>, clip: ArrayLike<number> | null): DispatchTotals {
  const s = (xs: ArrayLike<number>) => {
    let t = 0;
    for (let i = 0; i < xs.length; i++) t += xs[i];
    return t;
  };
  const loadKwh = s(load);
  const solarKwh = s(pv) + (clip === null ? 0 : s(clip));
  const batteryOutKwh = s(hours.batteryOut);
  const cellDischargeKwh = batteryOutKwh / core.etaDischarge;
  const exportedKwh = s(hours.exported);
  const clippedKwh = s(hours.clipped);
  const gridToLoadKwh = s(hours.gridToLoad);
  return {
    loadKwh,
    solarKwh,
    solarUsedKwh: s(hours.solarUsed),
    storedFromSolarKwh: s(hours.storedFromSolar),
    gridToBatteryKwh: s(hours.gridToBattery),
    batteryOutKwh,
    gridToLoadKwh,
    exportedKwh,
    clippedKwh,
    cellDischargeKwh,
    equivalentFullCycles: core.capacityKwh > 0 ? cellDischargeKwh / core.capacityKwh : 0,
    selfConsumptionPct: solarKwh > 0 ? (100 * (solarKwh - exportedKwh - clippedKwh)) / solarKwh : 0,
    selfSufficiencyPct: loadKwh > 0 ? (100 * (loadKwh - gridToLoadKwh)) / loadKwh : 0,
  };
}

/**
 * Hours where time-of-use mode discharges (the day's highest price, when the day has more than
 * one price) and where it may charge from the grid (the day's lowest price, when that price
 * over the round-trip efficiency is below the day's highest). Days are rows 24·d … 24·d + 23.
 */
function touWindows(plan: z.output<typeof ratePlanSchema>, byHourOf: () => Uint8Array, roundTrip: number): { peak: Uint8Array; cheap: Uint8Array } {
  if (plan.energy.kind !== "tou") {
    throw new EngineInputError([{ path: "settings.mode", message: `time-of-use mode needs a time-of-use rate plan; "${plan.name}" is ${plan.energy.kind}` }], "battery dispatch");
  }
  const prices = plan.energy.periods.map((p) => p.centsPerKwh);
  const byHour = byHourOf();
  const peak = new Uint8Array(HOURS_PER_YEAR);
  const cheap = new Uint8Array(HOURS_PER_YEAR);
  for (let d = 0; d < HOURS_PER_YEAR / 24; d++) {
    let hi = -Infinity;
    let lo = Infinity;
    for (let k = 0; k < 24; k++) {
      const price = prices[byHour[d * 24 + k]];
      if (price > hi) hi = price;
      if (price < lo) lo = price;
    }
    if (hi <= lo) continue;
    const arbitrage = lo / roundTrip < hi;
    for (let k = 0; k < 24; k++) {
      const price = prices[byHour[d * 24 + k]];
      if (price === hi) peak[d * 24 + k] = 1;
      if (price === lo && arbitrage) cheap[d * 24 + k] = 1;
    }
  }
  return { peak, cheap };
}

function checkSeries(name: string, xs: ArrayLike<number>): void {
  if (xs.length !== HOURS_PER_YEAR) throw new EngineInputError([{ path: name, message: `must have ${HOURS_PER_YEAR} hourly values, got ${xs.length}` }], "battery dispatch");
  for (let h = 0; h < HOURS_PER_YEAR; h++) {
    if (!(xs[h] >= 0 && Number.isFinite(xs[h]))) throw new EngineInputError([{ path: `${name}.${h}`, message: "must be a finite number ≥ 0 kWh" }], "battery dispatch");
  }
}

export type DispatchInput = {
  loadHourlyKwh: ArrayLike<number>;
  /** AC production, kWh each hour. */
  productionHourlyKwh: ArrayLike<number>;
  /** DC energy the inverter could not pass (clipped), kWh each hour; a DC-coupled battery may store it. */
  clippedDcHourlyKwh?: ArrayLike<number> | null;
  /** null: the same flows without a battery (the comparison's "without"). */
  battery: BatterySpecInput | null;
  settings: DispatchSettingsInput;
};

/**
 * A dispatcher for one rate plan and clock: validates the plan once and precomputes the
 * time-of-use windows, so a year's dispatch is one loop (the benchmark's case).
 */
export function makeBatteryDispatcher(plan: RatePlanInput, clock: YearClock = { calendarYear: 2023, timeZone: null }): (input: DispatchInput) => DispatchResult {
  const parsedPlan = parseOrThrow(ratePlanSchema, plan, "rate plan");
  const windows = new Map<number, { peak: Uint8Array; cheap: Uint8Array }>();
  // The plan's period of every hour (the costly part: the wall clock of 8,760 hours), once per dispatcher.
  let byHour: Uint8Array | null = null;
  const byHourOf = () => (byHour ??= parsedPlan.energy.kind === "tou" ? touPeriodByHour(parsedPlan.energy, clock) : new Uint8Array(HOURS_PER_YEAR));
  return (input) => {
    const settings = parseOrThrow(dispatchSettingsSchema, input.settings, "battery dispatch settings");
    const battery = input.battery === null ? null : parseOrThrow(batterySpecSchema, input.battery, "battery");
    checkSeries("loadHourlyKwh", input.loadHourlyKwh);
    checkSeries("productionHourlyKwh", input.productionHourlyKwh);
    const clip = input.clippedDcHourlyKwh ?? null;
    if (clip !== null) checkSeries("clippedDcHourlyKwh", clip);
    const notes: string[] = [];
    const eta = battery === null ? 1 : Math.sqrt(battery.roundTripEfficiencyPct / 100);
    let dischargeHour: Uint8Array | null = null;
    let gridChargeHour: Uint8Array | null = null;
    if (settings.mode === "time-of-use" && battery !== null) {
      const roundTrip = eta * eta;
      const w = windows.get(roundTrip) ?? touWindows(parsedPlan, byHourOf, roundTrip);
      windows.set(roundTrip, w);
      dischargeHour = w.peak;
      if (settings.gridCharging && parsedPlan.batteryGridChargingAllowed === true) gridChargeHour = w.cheap;
      if (settings.gridCharging && parsedPlan.batteryGridChargingAllowed !== true) notes.push(`No grid charging: the rate plan "${parsedPlan.name}" does not allow charging a battery from the grid.`);
    }
    const capacity = battery?.usableKwh ?? 0;
    const reservePct = settings.mode === "backup" ? (settings.reservePct ?? DEFAULT_BACKUP_RESERVE_PCT) : 0;
    const floorPct = Math.max(battery?.minSocPct ?? 0, reservePct);
    const ceilingPct = battery?.maxSocPct ?? 100;
    if (floorPct >= ceilingPct)
      throw new EngineInputError([{ path: "settings.reservePct", message: `the reserve (${floorPct} %) leaves nothing below the top state of charge (${ceilingPct} %)` }], "battery dispatch");
    const core: Core = {
      capacityKwh: capacity,
      floorKwh: (capacity * floorPct) / 100,
      ceilingKwh: (capacity * ceilingPct) / 100,
      powerKw: battery?.continuousKw ?? 0,
      etaCharge: eta,
      etaDischarge: eta,
      dc: battery?.coupling === "dc",
      inverterAcKw: battery?.inverterAcKw ?? Infinity,
      exportLimitKw: settings.exportLimitKw ?? Infinity,
      dischargeHour,
      gridChargeHour,
    };
    const hours = newHours();
    runYear(core, input.loadHourlyKwh, input.productionHourlyKwh, clip, hours);
    return { hours, totals: totalsOf(core, hours, input.loadHourlyKwh, input.productionHourlyKwh, clip), notes };
  };
}
