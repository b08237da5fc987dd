import { describe, expect, it } from "vitest";
import { batteryReport } from "./battery-report";
import { HOURS_PER_YEAR } from "./year-calendar";

// The hand-worked day of battery.test.ts (1 January only), billed on a flat 20 ¢ plan that
// credits exports at 5 ¢ (net billing).
const firstDay = (day: number[]) => {
  const out = new Float64Array(HOURS_PER_YEAR);
  out.set(day, 0);
  return out;
};
const load = firstDay(new Array(24).fill(1));
const pv = firstDay([0, 0, 0, 0, 0, 0, 0, 0, 1, 2, 4, 6, 7, 6, 4, 2, 0, 0, 0, 0, 0, 0, 0, 0]);

describe("battery report through the plan's own bill", () => {
  const r = batteryReport({
    plan: { name: "flat", energy: { kind: "flat", centsPerKwh: 20 }, compensation: { kind: "net-billing", exportCentsPerKwh: 5 } },
    loadHourlyKwh: load,
    productionHourlyKwh: pv,
    battery: { usableKwh: 10, continuousKw: 5, peakKw: 7, roundTripEfficiencyPct: 81, minSocPct: 10, coupling: "ac" },
    settings: { mode: "self-consumption" },
    criticalLoads: [{ id: "refrigerator" }],
  });

  it("bills without solar, with solar alone and with the battery", () => {
    // Without solar: 24 kWh × 20 ¢ = 480 ¢.
    // Solar alone: imports 16 kWh (hours 0–7, 16–23) × 20 = 320 ¢; exports 32 − 8 = 24 kWh × 5 = 120 ¢ credit → 200 ¢.
    // With the battery: imports 8 kWh × 20 = 160 ¢; exports 14 kWh × 5 = 70 ¢ → 90 ¢.
    expect(r.bills).toEqual({ withoutSolarCents: 480, solarOnlyCents: 200, solarAndBatteryCents: 90, batterySavingsCents: 110, solarSavingsCents: 280 });
    expect(r.withBattery.gridToLoadKwh).toBe(8);
    expect(r.solarOnly.exportedKwh).toBe(24);
  });

  it("carries the backup figures for the picked loads", () => {
    // 9 kWh × 0.9 = 8.1 kWh ÷ 0.15 kW = 54 h without sun.
    expect(r.backup?.days[0].withoutSunHours).toBeCloseTo(54, 9);
  });

  it("under net metering (exports credited at retail) the battery saves nothing on this day", () => {
    const nem = batteryReport({
      plan: { name: "net metering", energy: { kind: "flat", centsPerKwh: 20 }, compensation: { kind: "net-metering" } },
      loadHourlyKwh: load,
      productionHourlyKwh: pv,
      battery: { usableKwh: 10, continuousKw: 5, peakKw: 7, roundTripEfficiencyPct: 81, minSocPct: 10, coupling: "ac" },
      settings: { mode: "self-consumption" },
    });
    // Solar alone: 16 in, 24 out → a 480 ¢ credit against 320 ¢ of energy: 0 ¢.
    // Battery: 8 in, 14 out → 280 ¢ credit against 160 ¢: 0 ¢. Equal bills here; the surplus credit lapses either way.
    expect(nem.bills.solarOnlyCents).toBe(0);
    expect(nem.bills.solarAndBatteryCents).toBe(0);
    expect(nem.bills.batterySavingsCents).toBe(0);
  });
});
