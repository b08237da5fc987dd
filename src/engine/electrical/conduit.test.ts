import { describe, expect, it } from "vitest";
import { emtSize } from "./conduit";

// Chapter 9 Table 5 (THWN-2 areas), Table 4 (EMT areas) and Table 1 (40 % fill), all from memory.
describe("conduit fill, Chapter 9", () => {
  it("two strings of 10 AWG and a 10 AWG EGC: 5 × 0.0211 = 0.1055 in² ≤ 0.4 × 0.304 = 0.1216 → 1/2 in.", () => {
    expect(emtSize([{ size: "10", count: 4 }, { size: "10", count: 1 }]).trade).toBe("1/2");
  });
  it("inverter output 3 × 8 AWG (L1, L2, N) + 10 AWG EGC: 0.1309 in² > 0.1216 → 3/4 in.", () => {
    const r = emtSize([{ size: "8", count: 3 }, { size: "10", count: 1 }]);
    expect(r.fillIn2).toBe(0.1309);
    expect(r.trade).toBe("3/4");
  });
  it("3 × 3 AWG + 4 AWG EGC: 0.3743 in² > 0.4 × 0.864 = 0.3456 → 1-1/4 in.", () => {
    expect(emtSize([{ size: "3", count: 3 }, { size: "4", count: 1 }]).trade).toBe("1-1/4");
  });
  it("two conductors may fill 31 %: 2 × 6 AWG = 0.1014 in² > 0.31 × 0.304 = 0.0942 → 3/4 in.", () => {
    expect(emtSize([{ size: "6", count: 2 }]).trade).toBe("3/4");
  });
});
