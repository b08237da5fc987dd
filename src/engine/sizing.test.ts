import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { dcAcRatioWarning, sizeSystem, type SizingInput } from "./sizing";
import { EngineInputError } from "./errors";

// Hand-worked cases: 400 W modules; south face 1,400 kWh/kW → 560 kWh per module,
// west face 1,100 kWh/kW → 440 kWh per module.
const faces: SizingInput["faces"] = [
  { id: "west", usableSlots: 20, specificYieldKwhPerKw: 1100 },
  { id: "south", usableSlots: 10, specificYieldKwhPerKw: 1400 },
];

describe("sizeSystem", () => {
  it("fills the best-yielding face first (hand-worked)", () => {
    // Target 10,000 kWh × 80 % = 8,000 kWh. South: 10 × 560 = 5,600 (full); 2,400 left.
    // West: 2,400 / 440 = 5.45 → 6 modules = 2,640. Total 16 modules, 8,240 kWh, 82.4 %.
    const r = sizeSystem({ annualUsageKwh: 10_000, targetOffsetPct: 80, moduleWatts: 400, faces });
    expect(r.modulesByFace.map((f) => [f.id, f.modules])).toEqual([["west", 6], ["south", 10]]);
    expect(r.totalModules).toBe(16);
    expect(r.kwDc).toBeCloseTo(6.4, 12);
    expect(r.annualKwh).toBeCloseTo(8240, 9);
    expect(r.offsetPct).toBeCloseTo(82.4, 9);
    expect(r.outcome).toBe("reached");
  });

  it("rounds to the nearest module count when asked (hand-worked)", () => {
    // 5.45 west modules: 5 → 7,800 kWh (200 short) is nearer than 6 → 8,240 (240 over).
    const r = sizeSystem({ annualUsageKwh: 10_000, targetOffsetPct: 80, moduleWatts: 400, faces, rounding: "nearest" });
    expect(r.totalModules).toBe(15);
    expect(r.annualKwh).toBeCloseTo(7800, 9);
  });

  it("does not add a module for a floating-point sliver (5,600 kWh = exactly 10 south modules)", () => {
    const r = sizeSystem({ annualUsageKwh: 5600, targetOffsetPct: 100, moduleWatts: 400, faces });
    expect(r.totalModules).toBe(10);
  });

  it("reports a full roof", () => {
    // All 30 slots: 5,600 + 8,800 = 14,400 kWh < 20,000 target.
    const r = sizeSystem({ annualUsageKwh: 20_000, targetOffsetPct: 100, moduleWatts: 400, faces });
    expect(r.totalModules).toBe(30);
    expect(r.outcome).toBe("roof-full");
    expect(r.offsetPct).toBeCloseTo(72, 9);
  });

  it("guards the DC/AC ratio (max 1.35, common practice): warn, or limit from the worst face", () => {
    // 16 × 0.4 = 6.4 kW DC on a 4 kW inverter = 1.60 > 1.35; limit: floor(1.35 × 4 / 0.4) = 13 modules.
    const warn = sizeSystem({ annualUsageKwh: 10_000, targetOffsetPct: 80, moduleWatts: 400, faces, inverterAcKw: 4 });
    expect(warn.totalModules).toBe(16);
    expect(warn.dcAcRatio).toBeCloseTo(1.6, 12);
    expect(warn.warnings[0]).toContain("1.60 exceeds 1.35");
    const limit = sizeSystem({ annualUsageKwh: 10_000, targetOffsetPct: 80, moduleWatts: 400, faces, inverterAcKw: 4, dcAcMode: "limit" });
    expect(limit.modulesByFace.map((f) => [f.id, f.modules])).toEqual([["west", 3], ["south", 10]]);
    expect(limit.dcAcRatio).toBeCloseTo(1.3, 12);
    expect(limit.outcome).toBe("dc-ac-limited");
  });

  it("never exceeds a face's slots and reaches the target when the roof allows (property)", () => {
    fc.assert(
      fc.property(
        fc.array(fc.record({ slots: fc.integer({ min: 0, max: 40 }), yield_: fc.double({ min: 0, max: 2000, noNaN: true }) }), { minLength: 1, maxLength: 6 }),
        fc.double({ min: 1000, max: 40_000, noNaN: true }),
        fc.double({ min: 10, max: 150, noNaN: true }),
        (fs, usage, target) => {
          const r = sizeSystem({
            annualUsageKwh: usage,
            targetOffsetPct: target,
            moduleWatts: 410,
            faces: fs.map((f, i) => ({ id: `f${i}`, usableSlots: f.slots, specificYieldKwhPerKw: f.yield_ })),
          });
          r.modulesByFace.forEach((f, i) => expect(f.modules).toBeLessThanOrEqual(fs[i].slots));
          if (r.outcome === "reached") expect(r.annualKwh).toBeGreaterThanOrEqual(r.targetKwh - 1e-6);
          expect(Number.isFinite(r.offsetPct)).toBe(true);
        },
      ),
    );
  });

  it("names bad fields", () => {
    try {
      sizeSystem({ annualUsageKwh: 0, targetOffsetPct: 80, moduleWatts: 400, faces: [{ id: "a", usableSlots: -1, specificYieldKwhPerKw: 1000 }] });
      throw new Error("expected failure");
    } catch (e) {
      expect(e).toBeInstanceOf(EngineInputError);
      expect((e as EngineInputError).issues.map((i) => i.path)).toEqual(["annualUsageKwh", "faces.0.usableSlots"]);
    }
  });
});

describe("dcAcRatioWarning", () => {
  it("warns for a microinverter above the common-practice 1.35 (e.g. 480 W modules on 290 W micros = 1.66)", () => {
    expect(dcAcRatioWarning("micro", 480 / 290)).toContain("Microinverter DC/AC ratio 1.66");
    expect(dcAcRatioWarning("micro", 410 / 320)).toBeNull(); // 1.28
    expect(dcAcRatioWarning("string", 1.4)).toBe("DC/AC ratio 1.40 exceeds 1.35.");
    expect(dcAcRatioWarning("string", 1.4, 1.5)).toBeNull();
  });
});
