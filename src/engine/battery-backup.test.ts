import { describe, expect, it } from "vitest";
import { backupHours, CRITICAL_LOADS } from "./battery-backup";
import type { BatterySpecInput } from "./battery";
import { HOURS_PER_YEAR, HOUR_MONTH } from "./year-calendar";

// 10 kWh usable, floor 10 %: 9 kWh in the cells; ηd = √0.81 = 0.9 → 8.1 kWh delivered.
const battery: BatterySpecInput = { usableKwh: 10, continuousKw: 5, peakKw: 7, roundTripEfficiencyPct: 81, minSocPct: 10, coupling: "ac" };
/** January: 0.2 kWh in hours 10–13; June: 3 kWh in hours 8–15; other months 1 kWh in hours 10–13. */
const production = Float64Array.from({ length: HOURS_PER_YEAR }, (_, h) => {
  const m = HOUR_MONTH[h];
  const k = h % 24;
  if (m === 0) return k >= 10 && k < 14 ? 0.2 : 0;
  if (m === 5) return k >= 8 && k < 16 ? 3 : 0;
  return k >= 10 && k < 14 ? 1 : 0;
});
// Refrigerator 150 + lights 100 + internet 20 + charging 60 + medical 60 = 390 W.
const loads = [{ id: "refrigerator" }, { id: "lights" }, { id: "internet" }, { id: "charging" }, { id: "medical" }] as const;

describe("backup hours (hand-worked)", () => {
  const r = backupHours({ battery, loads: [...loads], productionHourlyKwh: production });
  const [winter, summer] = r.days;

  it("without sun: 8.1 kWh ÷ 0.39 kW = 20.77 h", () => {
    expect(winter.loadWatts).toBe(390);
    expect(winter.withoutSunHours).toBeCloseTo(8.1 / 0.39, 9);
    expect(summer.withoutSunHours).toBeCloseTo(20.769231, 5);
  });

  it("winter (January, the least sun): runs out at 22.82 h on the first day", () => {
    // Each dark hour takes 0.39/0.9 = 0.433333 kWh from the cells; each sun hour (0.2 kWh) 0.19/0.9 = 0.211111.
    // Hours 0–9: 4.333333 → 4.666667 left; hours 10–13: 0.844444 → 3.822222 left;
    // then 3.822222 / 0.433333 = 8.820513 h more: 14 + 8.820513 = 22.820513 h.
    expect(winter.month).toBe(1);
    expect(winter.solarKwh).toBeCloseTo(0.8, 9);
    expect(winter.withSunHours).toBeCloseTo(22.820513, 5);
  });

  it("summer (June, the most sun): the sun refills the battery each day, so it lasts the whole span", () => {
    // Night 0–7 takes 3.466667 of 9 kWh; one sun hour's 2.61 kWh surplus (× 0.9 = 2.349) refills it;
    // the evening 16–23 takes 3.466667 and the next night as much: 9 − 6.933333 = 2.066667 > 0 before sunrise.
    expect(summer.month).toBe(6);
    expect(summer.withSunHours).toBeNull();
    expect(r.spanHours).toBe(168);
  });

  it("seasonal loads count only on their season's day", () => {
    const s = backupHours({ battery, loads: [{ id: "refrigerator" }, { id: "furnace-fan" }, { id: "room-ac" }], productionHourlyKwh: production });
    expect(s.days.map((d) => d.loadWatts)).toEqual([150 + 300, 150 + 450]);
  });

  it("says when the battery cannot start or carry the loads", () => {
    // Refrigerator 150 + well pump 250 running = 400 W; starting the pump adds 3000 − 250 = 2750 → 3150 W > 3 kW peak.
    const small = { ...battery, continuousKw: 3, peakKw: 3 };
    const s = backupHours({ battery: small, loads: [{ id: "refrigerator" }, { id: "well-pump" }], productionHourlyKwh: production });
    expect(s.days[0].problem).toBe("starting the largest motor needs about 3150 W; the battery's peak is 3000 W");
    expect(s.days[0].withoutSunHours).toBe(0);
    const heavy = backupHours({ battery: small, loads: [{ id: "room-ac", count: 7 }], productionHourlyKwh: production });
    expect(heavy.days[1].problem).toBe("the loads draw 3150 W; the battery gives 3000 W continuously");
  });

  it("every listed load has a label and start watts at least its running watts", () => {
    for (const l of Object.values(CRITICAL_LOADS)) expect(l.startWatts).toBeGreaterThanOrEqual(l.averageWatts);
  });
});
