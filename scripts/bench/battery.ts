/**
 * Benchmarks for the battery model: a year of hourly dispatch (8,760 hours; the plan's
 * time-of-use windows precomputed once per dispatcher, as an offer preview holds them), and the
 * whole battery report (dispatch with and without the battery, three bills, backup hours).
 * Run through scripts/bench.ts, which times each case's `run()`.
 */
import type { BenchCase } from "./types";
import { makeBatteryDispatcher, type BatterySpecInput } from "../../src/engine/battery";
import { makeBatteryReporter } from "../../src/engine/battery-report";
import { spreadMonthlyToHourly } from "../../src/engine/load-shape";
import type { RatePlanInput } from "../../src/engine/rates";

// Invented inputs: a 10,430 kWh/yr home, about 9 kW of solar, a 13.5 kWh / 5 kW AC battery.
const usage = spreadMonthlyToHourly([900, 820, 760, 700, 850, 1100, 1300, 1250, 1000, 780, 760, 880]).hourlyKwh;
const production = Array.from({ length: 8760 }, (_, h) => {
  const hour = h % 24;
  const day = Math.floor(h / 24);
  const season = 0.75 + 0.25 * Math.cos((2 * Math.PI * (day - 172)) / 365);
  return hour >= 6 && hour < 19 ? 6 * season * Math.sin((Math.PI * (hour - 6 + 0.5)) / 13) : 0;
});
const plan: RatePlanInput = {
  name: "invented TOU with net billing, grid charging allowed",
  fixedMonthlyCents: 1200,
  energy: {
    kind: "tou",
    periods: [
      { id: "peak", centsPerKwh: 38 },
      { id: "mid", centsPerKwh: 24 },
      { id: "off", centsPerKwh: 14 },
    ],
    seasons: [
      {
        name: "summer",
        months: [6, 7, 8, 9],
        otherHoursPeriodId: "off",
        weekday: [
          { startHour: 15, endHour: 21, periodId: "peak" },
          { startHour: 7, endHour: 15, periodId: "mid" },
        ],
      },
      { name: "winter", months: [1, 2, 3, 4, 5, 10, 11, 12], otherHoursPeriodId: "off", weekday: [{ startHour: 16, endHour: 21, periodId: "mid" }] },
    ],
  },
  compensation: { kind: "net-billing", exportCentsPerKwh: 6 },
  batteryGridChargingAllowed: true,
};
const clock = { calendarYear: 2025, timeZone: "America/Los_Angeles" };
const battery: BatterySpecInput = { usableKwh: 13.5, continuousKw: 5, peakKw: 7, roundTripEfficiencyPct: 90, minSocPct: 5, coupling: "ac" };
const dispatch = makeBatteryDispatcher(plan, clock);
const report = makeBatteryReporter(plan, clock);

export const cases: BenchCase[] = [
  {
    name: "battery: a year of hourly dispatch (time-of-use, grid charging)",
    goal: "≤ 5 ms median",
    goalMedianMs: 5,
    // The first call computes the plan's peak and cheap hours; later calls reuse them.
    setup: () => void dispatch({ loadHourlyKwh: usage, productionHourlyKwh: production, battery, settings: { mode: "time-of-use", gridCharging: true } }),
    run: () => dispatch({ loadHourlyKwh: usage, productionHourlyKwh: production, battery, settings: { mode: "time-of-use", gridCharging: true } }),
  },
  {
    name: "battery: a year of hourly dispatch (self-consumption)",
    goal: "≤ 5 ms median",
    goalMedianMs: 5,
    run: () => dispatch({ loadHourlyKwh: usage, productionHourlyKwh: production, battery, settings: { mode: "self-consumption" } }),
  },
  {
    name: "battery: whole report (2 dispatches, 3 bills, backup; plan calendars precomputed)",
    goal: "≤ 20 ms median",
    goalMedianMs: 20,
    run: () =>
      report({
        loadHourlyKwh: usage,
        productionHourlyKwh: production,
        battery,
        settings: { mode: "time-of-use", gridCharging: true },
        criticalLoads: [{ id: "refrigerator" }, { id: "lights" }, { id: "internet" }],
      }),
  },
];
