import { describe, expect, it } from "vitest";
import { ambientCorrection, conductorCountAdjustment, egcSize, rooftopAdderC, standardOcpdAtLeast, tableAmpacity } from "./nec-tables";

// Every expected value below is read from the NEC table named beside it (from memory).
describe("NEC tables", () => {
  it("Table 310.16 ampacities", () => {
    expect(tableAmpacity("cu", "10", 90)).toBe(40); // Table 310.16, 10 AWG Cu, 90 °C
    expect(tableAmpacity("cu", "8", 75)).toBe(50); // Table 310.16, 8 AWG Cu, 75 °C
    expect(tableAmpacity("al", "4", 75)).toBe(65); // Table 310.16, 4 AWG Al, 75 °C
    expect(tableAmpacity("al", "14", 75)).toBeNull(); // aluminium starts at 12 AWG
  });

  it("ambient correction, 310.15(B)(1) (2017: 310.15(B)(2)(a))", () => {
    expect(ambientCorrection(35, 90)).toBe(0.96); // 31–35 °C row, 90 °C column
    expect(ambientCorrection(57, 90)).toBe(0.71); // 56–60 °C row, 90 °C column
    expect(ambientCorrection(45, 75)).toBe(0.82); // 41–45 °C row, 75 °C column
    expect(ambientCorrection(30.5, 90)).toBe(0.96); // a fraction of a degree takes the warmer row
    expect(ambientCorrection(62, 60)).toBeNull(); // 60 °C insulation may not run at 62 °C
  });

  it("more than three current-carrying conductors, 310.15(C)(1) (2017: 310.15(B)(3)(a))", () => {
    expect(conductorCountAdjustment(3)).toBe(1);
    expect(conductorCountAdjustment(4)).toBe(0.8); // 4–6: 80 %
    expect(conductorCountAdjustment(7)).toBe(0.7); // 7–9: 70 %
    expect(conductorCountAdjustment(12)).toBe(0.5); // 10–20: 50 %
  });

  it("rooftop adder: 2017 table, 2020/2023 only below 7/8 in.", () => {
    expect(rooftopAdderC("2017", 25).adderC).toBe(22); // 2017 Table 310.15(B)(3)(c), 13–90 mm
    expect(rooftopAdderC("2017", 10).adderC).toBe(33); // 0–13 mm
    expect(rooftopAdderC("2017", 200).adderC).toBe(17); // 90–300 mm
    expect(rooftopAdderC("2020", 20).adderC).toBe(33); // 2020 310.15(B)(2): < 23 mm
    expect(rooftopAdderC("2020", 25).adderC).toBe(0);
    expect(rooftopAdderC("2023", null).adderC).toBe(0);
    expect(rooftopAdderC("2020", 25).rule).toMatch(/removed/);
  });

  it("standard ratings, 240.6(A)", () => {
    expect(standardOcpdAtLeast(16.41)).toBe(20);
    expect(standardOcpdAtLeast(40)).toBe(40);
    expect(standardOcpdAtLeast(40.01)).toBe(45);
    expect(standardOcpdAtLeast(131.25)).toBe(150);
  });

  it("equipment grounding conductor, Table 250.122", () => {
    expect(egcSize(40, "cu")).toBe("10"); // ≤ 60 A: 10 AWG Cu
    expect(egcSize(100, "cu")).toBe("8"); // ≤ 100 A: 8 AWG Cu
    expect(egcSize(20, "al")).toBe("10"); // ≤ 20 A: 10 AWG Al
    expect(egcSize(200, "cu")).toBe("6"); // ≤ 200 A: 6 AWG Cu
  });
});
