/**
 * How long a battery carries a list of critical loads in an outage, with and without sun, on a
 * typical winter and a typical summer day. An estimate: it depends on what is really running.
 *
 * Conventions (our choices unless marked):
 * - The outage starts at midnight with the battery at its top state of charge, and may use it
 *   down to its minimum state of charge (the backup reserve exists for this).
 * - Loads draw their average watts every hour (duty cycle included). The typical winter day is
 *   the average day of the month with the least solar, the summer day that of the month with
 *   the most; a load marked for one season counts only on that season's day.
 * - With sun, the solar (AC) serves the loads first and its surplus charges the battery within
 *   its power rating; the rest is curtailed (the system islands with the battery: it assumes the
 *   installation can run solar during an outage). The day repeats for at most 7 days; longer is
 *   reported as lasting the whole span.
 * - Starting a motor: the largest starting watts plus the other loads' average watts must fit
 *   the peak rating, and the average watts the continuous rating (common practice for sizing
 *   backup; a soft starter lowers a motor's start).
 */
import { z } from "zod";
import { EngineInputError, parseOrThrow } from "./errors";
import { batterySpecSchema, type BatterySpecInput } from "./battery";
import { HOURS_PER_YEAR, HOUR_MONTH, MONTH_DAYS } from "./year-calendar";

type CriticalLoadKind = { label: string; averageWatts: number; startWatts: number; season: "all" | "winter" | "summer" };

/**
 * The list a rep picks from: typical draws of common household loads (common practice, rounded
 * figures of the kind used in backup-sizing worksheets; a real home's may differ a lot).
 */
export const CRITICAL_LOADS = {
  refrigerator: { label: "Refrigerator", averageWatts: 150, startWatts: 1200, season: "all" },
  freezer: { label: "Chest freezer", averageWatts: 80, startWatts: 800, season: "all" },
  lights: { label: "LED lights (about 10)", averageWatts: 100, startWatts: 100, season: "all" },
  internet: { label: "Internet modem and router", averageWatts: 20, startWatts: 20, season: "all" },
  charging: { label: "Phones and a laptop charging", averageWatts: 60, startWatts: 60, season: "all" },
  tv: { label: "Television", averageWatts: 100, startWatts: 100, season: "all" },
  medical: { label: "Medical device (e.g. CPAP)", averageWatts: 60, startWatts: 60, season: "all" },
  microwave: { label: "Microwave (a few minutes an hour)", averageWatts: 100, startWatts: 1200, season: "all" },
  "well-pump": { label: "Well pump (1 hp)", averageWatts: 250, startWatts: 3000, season: "all" },
  "sump-pump": { label: "Sump pump (1/3 hp)", averageWatts: 150, startWatts: 1500, season: "all" },
  "furnace-fan": { label: "Gas furnace blower", averageWatts: 300, startWatts: 1200, season: "winter" },
  "room-ac": { label: "Room air conditioner (8,000 BTU/h)", averageWatts: 450, startWatts: 2000, season: "summer" },
} as const satisfies Record<string, CriticalLoadKind>;
export type CriticalLoadId = keyof typeof CRITICAL_LOADS;
const loadIds = Object.keys(CRITICAL_LOADS) as [CriticalLoadId, ...CriticalLoadId[]];

export const criticalLoadsSchema = z
  .array(z.object({ id: z.enum(loadIds), count: z.number().int().min(1).max(20).default(1) }))
  .min(1, "pick at least one critical load")
  .max(loadIds.length)
  .refine((xs) => new Set(xs.map((x) => x.id)).size === xs.length, "each load once (use its count)");
export type CriticalLoadsInput = z.input<typeof criticalLoadsSchema>;

/** Days an outage is followed for with sun (our choice). */
export const BACKUP_SPAN_DAYS = 7;

export type BackupDay = {
  season: "winter" | "summer";
  /** 1–12: the month whose average day is used. */
  month: number;
  loadWatts: number;
  /** Solar on that day, kWh. */
  solarKwh: number;
  withoutSunHours: number;
  /** null: lasts the whole span (BACKUP_SPAN_DAYS days) with this day's sun repeating. */
  withSunHours: number | null;
  /** Why the battery cannot carry the loads at all, when it cannot. */
  problem: string | null;
};

export type BackupResult = { days: BackupDay[]; spanHours: number; notes: string[] };

/** The average day (24 hourly kWh) of one month of an 8760-hour series. */
export function averageDayOfMonth(hourly: ArrayLike<number>, month: number): number[] {
  const day = new Array<number>(24).fill(0);
  for (let h = 0; h < HOURS_PER_YEAR; h++) if (HOUR_MONTH[h] === month) day[h % 24] += hourly[h];
  return day.map((v) => v / MONTH_DAYS[month]);
}

function monthOfSolar(hourly: ArrayLike<number>, pick: "least" | "most"): number {
  const totals = new Array<number>(12).fill(0);
  for (let h = 0; h < HOURS_PER_YEAR; h++) totals[HOUR_MONTH[h]] += hourly[h] / MONTH_DAYS[HOUR_MONTH[h]];
  let best = 0;
  for (let m = 1; m < 12; m++) if (pick === "least" ? totals[m] < totals[best] : totals[m] > totals[best]) best = m;
  return best;
}

/** Hours until the battery can no longer carry `loadKw`, the sun repeating `solarDay`; null past the span. */
function hoursWithSun(energyKwh: number, loadKw: number, solarDay: readonly number[], powerKw: number, eta: number): number | null {
  let stored = energyKwh; // kWh in the cells above the minimum
  for (let h = 0; h < BACKUP_SPAN_DAYS * 24; h++) {
    const sun = solarDay[h % 24];
    if (sun >= loadKw) {
      stored = Math.min(energyKwh, stored + Math.min(sun - loadKw, powerKw) * eta);
      continue;
    }
    const need = (loadKw - sun) / eta;
    if (stored < need) return h + stored / need;
    stored -= need;
  }
  return null;
}

/** Backup hours on a typical winter and summer day for the picked critical loads. */
export function backupHours(input: { battery: BatterySpecInput; loads: CriticalLoadsInput; productionHourlyKwh: ArrayLike<number> }): BackupResult {
  const battery = parseOrThrow(batterySpecSchema, input.battery, "battery");
  const loads = parseOrThrow(criticalLoadsSchema, input.loads, "critical loads");
  if (input.productionHourlyKwh.length !== HOURS_PER_YEAR) throw new EngineInputError([{ path: "productionHourlyKwh", message: `must have ${HOURS_PER_YEAR} hourly values` }], "backup hours");
  const eta = Math.sqrt(battery.roundTripEfficiencyPct / 100);
  const energyKwh = (battery.usableKwh * (battery.maxSocPct - battery.minSocPct)) / 100;
  const days = (["winter", "summer"] as const).map((season): BackupDay => {
    const picked = loads.map((l) => ({ ...CRITICAL_LOADS[l.id], count: l.count })).filter((l) => l.season === "all" || l.season === season);
    const loadWatts = picked.reduce((s, l) => s + l.averageWatts * l.count, 0);
    const month = monthOfSolar(input.productionHourlyKwh, season === "winter" ? "least" : "most");
    const solarDay = averageDayOfMonth(input.productionHourlyKwh, month);
    const solarKwh = solarDay.reduce((a, b) => a + b, 0);
    const largest = picked.reduce((best, l) => (l.startWatts - l.averageWatts > best.startWatts - best.averageWatts ? l : best), picked[0] ?? { startWatts: 0, averageWatts: 0 });
    const startWatts = loadWatts + (largest.startWatts - largest.averageWatts);
    const problem =
      loadWatts > battery.continuousKw * 1000
        ? `the loads draw ${loadWatts} W; the battery gives ${battery.continuousKw * 1000} W continuously`
        : startWatts > battery.peakKw * 1000
          ? `starting the largest motor needs about ${startWatts} W; the battery's peak is ${battery.peakKw * 1000} W`
          : null;
    const loadKw = loadWatts / 1000;
    const withoutSun = problem !== null ? 0 : loadKw > 0 ? (energyKwh * eta) / loadKw : Infinity;
    const withSun = problem !== null ? 0 : loadKw > 0 ? hoursWithSun(energyKwh, loadKw, solarDay, battery.continuousKw, eta) : null;
    return { season, month: month + 1, loadWatts, solarKwh, withoutSunHours: Math.min(withoutSun, BACKUP_SPAN_DAYS * 24), withSunHours: withSun, problem };
  });
  return { days, spanHours: BACKUP_SPAN_DAYS * 24, notes: ["Backup time is an estimate: it depends on what is running during the outage."] };
}
