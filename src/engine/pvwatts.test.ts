import { readFileSync } from "node:fs";
import { fileURLToPath } from "node:url";
import { describe, expect, it } from "vitest";
import { EngineInputError } from "./errors";
import { DEFAULT_LOSSES_PCT, combinedLossPct, fuentesCellTemperature, pvwattsDc, pvwattsInverter } from "./pvwatts";

describe("PVWatts v5 DC and losses against pvlib-python's published test values", () => {
  it("pvwatts_dc (pvlib test_pvwatts_dc_scalars: 900 W/m², 30 °C, 100 W, γ −0.003 → 88.65 W)", () => {
    expect(pvwattsDc(900, 30, 100, -0.003)).toBeCloseTo(88.65, 10);
  });

  it("combined default losses (pvlib test_pvwatts_losses_default → 14.075660688264469 %)", () => {
    expect(combinedLossPct()).toBeCloseTo(14.075660688264469, 10);
    expect(combinedLossPct(DEFAULT_LOSSES_PCT)).toBeCloseTo(14.075660688264469, 10);
    // pvlib test_pvwatts_losses_arrays: age = 1 % → 14.934904 %
    expect(combinedLossPct({ age: 1 })).toBeCloseTo(14.934904, 5);
  });

  it("rejects a loss outside 0–100 % naming the category", () => {
    expect(() => combinedLossPct({ soiling: 120, wiring: -1 })).toThrow(EngineInputError);
    expect(() => combinedLossPct({ soiling: 120 })).toThrow(/soiling/);
  });
});

describe("PVWatts inverter against pvlib-python's published test values", () => {
  it("pvlib test_pvwatts_scalars: pvwatts(90, 100, 0.95) → 85.58556604752516; pvwatts(0, 100) → 0", () => {
    expect(pvwattsInverter(90, 100, 0.95)).toBeCloseTo(85.58556604752516, 10);
    expect(pvwattsInverter(0, 100)).toBe(0);
  });
  it("pvlib test_pvwatts_arrays: 50 → 47.60843624, 100 → 95 (clipped at η_nom·pdc0)", () => {
    expect(pvwattsInverter(50, 100, 0.95)).toBeCloseTo(47.60843624, 7);
    expect(pvwattsInverter(100, 100, 0.95)).toBeCloseTo(95, 10);
    expect(pvwattsInverter(150, 100, 0.95)).toBeCloseTo(95, 10);
  });
  it("pvlib test_pvwatts_possible_negative: tiny input gives 0, not a negative value", () => {
    expect(pvwattsInverter(0.001, 1)).toBe(0);
  });
});

describe("Fuentes 1987 cell temperature as in PVWatts v5", () => {
  // The NREL PVWatts hourly result for Denver (tests/fixtures/weather, attribution in README.md):
  // its own POA, air temperature and wind in, its cell temperature column out (open rack, INOCT 45 °C).
  const root = fileURLToPath(new URL("../../", import.meta.url));
  const lines = readFileSync(root + "tests/fixtures/weather/pvwatts-8760-rackmount-denver.csv", "utf8").split(/\r?\n/);
  const start = lines.findIndex((l) => l.startsWith("Month,Day,Hour")) + 1;
  const rows = lines.slice(start, start + 8760).map((l) => l.split(",").map(Number));

  it("reproduces PVWatts' hourly cell temperature for Denver within 0.1 °C MAE", () => {
    const poa = Float64Array.from(rows, (r) => r[7]);
    const tAir = Float64Array.from(rows, (r) => r[5]);
    const wind = Float64Array.from(rows, (r) => r[6]);
    const t = fuentesCellTemperature(poa, tAir, wind, 45);
    let mae = 0;
    let max = 0;
    let count = 0;
    rows.forEach((r, i) => {
      if (r[7] <= 0) {
        expect(t[i]).toBe(r[5]); // dark hours: module at air temperature
        return;
      }
      const d = Math.abs(t[i] - r[8]);
      mae += d;
      max = Math.max(max, d);
      count++;
    });
    mae /= count;
    console.log(`Fuentes vs PVWatts Denver cell temperature: MAE ${mae.toFixed(4)} °C, max ${max.toFixed(3)} °C over ${count} daylight hours`);
    expect(mae).toBeLessThan(0.1);
    expect(max).toBeLessThan(1);
  });

  it("roof mount (INOCT 49 °C) runs hotter than open rack", () => {
    const poa = new Float64Array([0, 800, 800, 800]);
    const tAir = new Float64Array([20, 20, 20, 20]);
    const wind = new Float64Array([1, 1, 1, 1]);
    const rack = fuentesCellTemperature(poa, tAir, wind, 45);
    const roof = fuentesCellTemperature(poa, tAir, wind, 49);
    expect(roof[3]).toBeGreaterThan(rack[3]);
    expect(rack.every(Number.isFinite) && roof.every(Number.isFinite)).toBe(true);
  });
});
