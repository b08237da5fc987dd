import { describe, expect, it } from "vitest";
import { readFileSync } from "node:fs";
import { referenceMonthlyKwh, spreadMonthlyToHourly } from "./load-shape";
import { REFERENCE_LOAD_HOURLY_KWH } from "./data/reference-load-8760";
import { monthlySums } from "./year-calendar";
import { EngineInputError } from "./errors";

describe("reference load", () => {
  it("matches the reference file (NREL/ssc pvsamv1_residential_load.csv) to 5 decimals", () => {
    const raw = readFileSync(new URL("../../tests/fixtures/reference/residential-load-8760-kw.csv", import.meta.url), "utf8")
      .split(/\r?\n/)
      .filter((l) => l.trim() !== "")
      .map(Number);
    expect(REFERENCE_LOAD_HOURLY_KWH).toHaveLength(8760);
    let maxDiff = 0;
    raw.forEach((v, i) => (maxDiff = Math.max(maxDiff, Math.abs(v - REFERENCE_LOAD_HOURLY_KWH[i]))));
    expect(maxDiff).toBeLessThanOrEqual(5e-6);
  });

  it("has the monthly totals of the ssc reference load", () => {
    // Monthly kWh Jan–Dec about 375, 331, 334, 369, 479, 693, 842, 773, 622, 500, 325, 377
    const expected = [375, 331, 334, 369, 479, 693, 842, 773, 622, 500, 325, 377];
    referenceMonthlyKwh().forEach((v, m) => expect(Math.abs(v - expected[m])).toBeLessThan(1));
  });
});

describe("spreadMonthlyToHourly", () => {
  it("keeps each month's kWh exactly and labels the result estimated", () => {
    const monthly = [900, 800, 700, 600, 650, 1000, 1300, 1250, 900, 650, 700, 950];
    const result = spreadMonthlyToHourly(monthly);
    expect(result.quality).toBe("estimated");
    expect(result.hourlyKwh).toHaveLength(8760);
    monthlySums(result.hourlyKwh).forEach((v, m) => expect(v).toBeCloseTo(monthly[m], 9));
    expect(result.annualKwh).toBe(monthly.reduce((a, b) => a + b, 0));
  });

  it("spreads evenly when a custom shape is zero in a month", () => {
    const shape = new Array(8760).fill(0);
    const result = spreadMonthlyToHourly(new Array(12).fill(744), shape);
    expect(result.hourlyKwh[0]).toBeCloseTo(1, 12); // January: 744 kWh / 744 h
  });

  it("rejects negative or missing months", () => {
    expect(() => spreadMonthlyToHourly([1, 2, 3])).toThrow(EngineInputError);
    expect(() => spreadMonthlyToHourly(new Array(12).fill(-1))).toThrow(EngineInputError);
  });
});
