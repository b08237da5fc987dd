import { describe, expect, it } from "vitest";
import { sizeCircuit, voltageDrop, type CircuitInput } from "./circuit";

const pvSource: CircuitInput = {
  id: "s",
  name: "PV source",
  kind: "dc",
  edition: "2020",
  maxCurrentA: 10.5 * 1.25, // 690.8(A)(1): Isc 10.5 A × 1.25 = 13.125 A
  operatingCurrentA: 10,
  operatingVoltageV: 320,
  material: "cu",
  insulationC: 90,
  terminalC: 75,
  ambientC: 35,
  heightAboveRoofMm: 25,
  currentCarrying: 4,
  ocpdRequired: false,
  lengthFt: 60,
  voltageDropTargetPct: 2,
};
const output: CircuitInput = { ...pvSource, id: "o", name: "Inverter output", kind: "ac", maxCurrentA: 32, operatingCurrentA: 32, operatingVoltageV: 240, heightAboveRoofMm: null, currentCarrying: 2, ocpdRequired: true, lengthFt: 20, voltageDropTargetPct: 1 };

describe("conductor sizing: 690.8(B)(1) and (B)(2)", () => {
  it("example 1: two strings in conduit 25 mm above the roof, NEC 2020", () => {
    const c = sizeCircuit(pvSource);
    expect(c.requiredBeforeA).toBe(16.41); // 690.8(B)(1): 13.125 × 1.25
    expect(c.rooftopAdderC).toBe(0); // 2020 310.15(B)(2): 25 mm is above 7/8 in.
    expect(c.correctionFactor).toBe(0.96); // Table 310.15(B)(1), 35 °C, 90 °C column
    expect(c.adjustmentFactor).toBe(0.8); // Table 310.15(C)(1), 4 conductors
    expect(c.size).toBe("14"); // 75 °C: 20 A ≥ 16.41 A; 90 °C: 25 × 0.96 × 0.8 = 19.2 A ≥ 13.125 A
    expect(c.correctedAmpacityA).toBe(19.2);
    expect(c.checks.every((k) => k.status === "pass")).toBe(true);
  });

  it("example 2: four strings, NEC 2017 rooftop adder pushes to 12 AWG", () => {
    const c = sizeCircuit({ ...pvSource, edition: "2017", currentCarrying: 8 });
    expect(c.rooftopAdderC).toBe(22); // 2017 Table 310.15(B)(3)(c), 13–90 mm
    expect(c.ambientC).toBe(57);
    expect(c.correctionFactor).toBe(0.71); // 56–60 °C, 90 °C column
    expect(c.adjustmentFactor).toBe(0.7); // 7–9 conductors
    // 14 AWG: 25 × 0.71 × 0.7 = 12.43 A < 13.125 A; 12 AWG: 30 × 0.71 × 0.7 = 14.91 A
    expect(c.size).toBe("12");
    expect(c.correctedAmpacityA).toBe(14.91);
    expect(c.egcSize).toBe("12"); // 690.45: assumed 20 A device → Table 250.122: 12 AWG Cu
  });

  it("example 3: inverter output at 125 % of 32 A continuous (705.28(B))", () => {
    const c = sizeCircuit(output);
    expect(c.requiredBeforeA).toBe(40); // 32 × 1.25
    expect(c.size).toBe("8"); // 10 AWG 75 °C 35 A < 40 A; 8 AWG 50 A
    expect(c.ocpdA).toBe(40); // 705.30(B): 40 A is a standard rating (240.6(A))
    expect(c.egcSize).toBe("10"); // Table 250.122: 40 A → 10 AWG Cu
  });

  it("example 4: aluminium, 48 A (11.5 kW at 240 V)", () => {
    const c = sizeCircuit({ ...output, material: "al", maxCurrentA: 48, operatingCurrentA: 48, voltageDropTargetPct: 3 });
    expect(c.size).toBe("4"); // 75 °C Al: 6 AWG 50 A < 60 A; 4 AWG 65 A
    expect(c.ocpdA).toBe(60); // 48 × 1.25 = 60 A, standard
    expect(c.egcSize).toBe("8"); // Table 250.122: 60 A → 8 AWG Al
  });

  it("fails when no size fits: 60 °C insulation in a 62 °C raceway", () => {
    const c = sizeCircuit({ ...pvSource, insulationC: 60, ambientC: 62, heightAboveRoofMm: null });
    expect(c.size).toBeNull();
    expect(c.checks[0].status).toBe("fail");
  });
});

describe("overcurrent device: 690.9(B) / 705.30(B) rounded up by 240.6(A)", () => {
  it("three worked examples", () => {
    expect(sizeCircuit({ ...output, maxCurrentA: 24, operatingCurrentA: 24 }).ocpdA).toBe(30); // 24 × 1.25 = 30 A
    expect(sizeCircuit({ ...output, maxCurrentA: 15.73, operatingCurrentA: 15.73, voltageDropTargetPct: 3 }).ocpdA).toBe(20); // 13 micros × 1.21 A = 15.73 A; × 1.25 = 19.66 → 20 A
    expect(sizeCircuit({ ...output, maxCurrentA: 47.5, operatingCurrentA: 47.5, voltageDropTargetPct: 3 }).ocpdA).toBe(60); // 47.5 × 1.25 = 59.38 → 60 A
    expect(sizeCircuit(pvSource).ocpdA).toBeNull(); // one string per input: none (690.9(A))
  });
});

describe("voltage drop (common practice; Chapter 9 Table 8 resistance)", () => {
  it("three worked examples", () => {
    // 2 × 60 ft × 3.14 Ω/kft (14 AWG Cu) × 10 A = 3.768 V of 320 V = 1.18 %
    expect(voltageDrop("cu", "14", 60, 10, 320)!.pct).toBeCloseTo(1.1775, 4);
    // 2 × 20 ft × 0.778 Ω/kft (8 AWG Cu) × 32 A = 0.9958 V of 240 V = 0.41 %
    expect(voltageDrop("cu", "8", 20, 32, 240)!.volts).toBeCloseTo(0.99584, 5);
    // 2 × 100 ft × 0.808 Ω/kft (6 AWG Al) × 40 A = 6.464 V of 240 V = 2.69 %
    expect(voltageDrop("al", "6", 100, 40, 240)!.pct).toBeCloseTo(2.6933, 3);
  });

  it("upsizes for voltage drop and grows the grounding conductor in proportion (250.122(B))", () => {
    const c = sizeCircuit({ ...output, lengthFt: 150 });
    // 8 AWG: 2 × 150 × 0.778 × 32 = 7.47 V = 3.11 %; 6: 1.96 %; 4: 1.23 %; 3: 2 × 150 × 0.245 × 32 = 2.352 V = 0.98 %
    expect(c.sizeForAmpacity).toBe("8");
    expect(c.size).toBe("3");
    expect(c.voltageDropPct).toBe(0.98);
    // 10 AWG (10,380 cmil) × 52,620 / 16,510 = 33,083 cmil → 4 AWG (41,740 cmil)
    expect(c.egcSize).toBe("4");
  });
});
