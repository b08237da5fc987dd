import { describe, expect, it } from "vitest";
import { FIRE_CODE_RULES, layoutFace, ridgeSetbackFor } from "./roof-layout";

const MODULE = { lengthMm: 1722, widthMm: 1134 };

describe("ridgeSetbackFor (values from memory, 2018/2021 R324.6: 18 in up to 33 % of plan area, else 36 in)", () => {
  it("picks the setback by the array's share of the plan-view area", () => {
    expect(ridgeSetbackFor("2018", 30, 100)).toBeCloseTo(0.4572); // 30 % ≤ 33 % → 18 in
    expect(ridgeSetbackFor("2021", 40, 100)).toBeCloseTo(0.9144); // 40 % > 33 % → 36 in
    expect(ridgeSetbackFor("2018", 10, null)).toBeCloseTo(0.9144); // unknown area → the larger
    expect(ridgeSetbackFor("2015", 10, 100)).toBeCloseTo(0.9144); // 2015: always 3 ft
  });
});

describe("layoutFace", () => {
  it("fills a gable face with one 36 in pathway (2018)", () => {
    // Eave 10 m, slope 6 m, ridge setback 0.4572 m → rows up to 5.5428 m: 3 portrait rows of 1.722 m
    // (0, 1.742, 3.484; the 4th would end at 6.948). Width: 10 − 0.9144 = 9.0856 m → ⌊(9.0856 + 0.02) ÷ 1.154⌋ = 7 per row.
    const out = layoutFace({ outline: { eaveM: 10, slopeM: 6, ridgeM: 10, sides: "rake" }, module: MODULE, orientation: "portrait", wanted: 16, edition: "2018", ridgeSetbackM: 0.4572 });
    expect(out.capacity).toBe(21);
    expect(out.rows).toEqual([7, 7, 2]);
    expect(out.fits).toBe(true);
    expect(out.keepClear.map((k) => k.kind)).toEqual(["pathway", "ridge"]);
    // Nothing inside the pathway band (x < 0.9144) or above the ridge setback.
    for (const m of out.modules) {
      expect(m.x).toBeGreaterThanOrEqual(0.9144 - 1e-9);
      expect(m.y + m.h).toBeLessThanOrEqual(6 - 0.4572 + 1e-9);
    }
  });
  it("keeps two pathways on a gable face under 2015 and warns when the face is too small", () => {
    // 2015: two 36 in pathways and 36 in at the ridge. Width 10 − 1.8288 = 8.1712 → ⌊8.1912 ÷ 1.154⌋ = 7;
    // height 6 − 0.9144 = 5.0856 → 2 rows (the 3rd would end at 5.206) → capacity 14 < 16.
    const out = layoutFace({ outline: { eaveM: 10, slopeM: 6, ridgeM: 10, sides: "rake" }, module: MODULE, orientation: "portrait", wanted: 16, edition: "2015", ridgeSetbackM: FIRE_CODE_RULES["2015"].ridgeSetbackLargeM });
    expect(out.capacity).toBe(14);
    expect(out.fits).toBe(false);
    expect(out.modules).toHaveLength(14);
  });
  it("narrows the rows of a hip face towards the ridge", () => {
    // Eave 12 m, ridge 4 m, slope 5 m → each side leans 4 m over 5 m. Landscape modules 1.722 × 1.134.
    // Pathway 0.9144 m square to the left hip: horizontal 0.9144 × √(4² + 5²) ÷ 5 = 1.1710 m.
    // Row 0 (top at 1.134): left = 0.8 × 1.134 + 1.171 = 2.0782, right = 12 − 0.9072 = 11.0928 → span 9.0146 → 5 modules.
    // Row 1 (top 2.288): left 3.0014, right 10.1696 → 7.1682 → 4. Row 2 (top 3.442): 3.9246, 9.2464 → 5.3218 → 3.
    // Row 3 would end at 4.596 > 5 − 0.4572: stops. Capacity 12.
    const out = layoutFace({ outline: { eaveM: 12, slopeM: 5, ridgeM: 4, sides: "hip" }, module: MODULE, orientation: "landscape", wanted: 12, edition: "2021", ridgeSetbackM: 0.4572 });
    expect(out.rows).toEqual([5, 4, 3]);
    expect(out.fits).toBe(true);
  });
});
