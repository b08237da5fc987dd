import { describe, expect, it } from "vitest";
import { CAUTION, checkString, maxModulesInSeries, table690_7AFactor, type StringCheckInput } from "./string-check";
import { EngineInputError } from "./errors";

const base: StringCheckInput = {
  module: { vocV: 49.5, vmpV: 41.5, iscA: 13.9, vocCoeffPctPerC: -0.28, vmpCoeffPctPerC: -0.34, noctC: 45 },
  inverter: { maxDcInputV: 600, mpptMinV: 200, mpptMaxV: 550, maxInputIscA: 18 },
  modulesInSeries: 11,
  lowestTempC: -10,
  highestTempC: 35,
};

describe("NEC 690.7 maximum voltage", () => {
  it("corrects Voc with the module coefficient (NEC 690.7(A)(1); values worked by hand below)", () => {
    // 49.5 × (1 + (−10 − 25) × −0.0028) = 49.5 × 1.098 = 54.351 V per module
    // 11 × 54.351 = 597.861 V ≤ 600 V (dwelling limit) → pass
    const r = checkString(base);
    expect(r.method).toBe("coefficient");
    expect(r.moduleVocMaxV).toBeCloseTo(54.351, 4);
    expect(r.stringVocMaxV).toBeCloseTo(597.86, 2);
    expect(r.checks.find((c) => c.id === "code-voltage-limit")?.status).toBe("pass");
    expect(r.checks.find((c) => c.id === "max-voltage")?.status).toBe("pass");
  });

  it("uses Table 690.7(A) without a coefficient (factor 1.14 for −6…−10 °C, NEC 2020/2023 Table 690.7(A))", () => {
    // 11 × 49.5 × 1.14 = 620.73 V > 600 V → fail
    const r = checkString({ ...base, module: { ...base.module, vocCoeffPctPerC: undefined } });
    expect(r.method).toBe("table-690.7(A)");
    expect(r.correctionFactor).toBe(1.14);
    expect(r.stringVocMaxV).toBeCloseTo(620.73, 2);
    expect(r.checks.find((c) => c.id === "code-voltage-limit")?.status).toBe("fail");
    expect(r.status).toBe("fail");
  });

  it("reads the table rows, taking the colder row between whole degrees (NEC Table 690.7(A), from memory)", () => {
    expect(table690_7AFactor(22)).toBe(1.02);
    expect(table690_7AFactor(0)).toBe(1.1);
    expect(table690_7AFactor(-0.5)).toBe(1.12);
    expect(table690_7AFactor(-10)).toBe(1.14);
    expect(table690_7AFactor(-10.5)).toBe(1.16);
    expect(table690_7AFactor(-40)).toBe(1.25);
    expect(table690_7AFactor(-41)).toBeNull();
    expect(table690_7AFactor(30)).toBe(1);
  });

  it("finds the longest string under 600 V (hand-worked: 12 × 54.351 = 652.2 V fails, 11 passes)", () => {
    const { modulesInSeries: _drop, ...rest } = base;
    void _drop;
    expect(maxModulesInSeries(rest)).toBe(11);
  });
});

describe("MPPT window and NEC 690.8 currents", () => {
  it("computes Vmp at the NOCT hot cell and the 690.8 currents (hand-worked)", () => {
    // Hot cell: 35 + (45 − 20) × 1000/800 = 66.25 °C
    // Vmp string: 11 × 41.5 × (1 + (66.25 − 25) × −0.0034) = 456.5 × 0.85975 = 392.48 V ≥ 200 → pass
    // Cold Vmp at −10 °C: 456.5 × (1 + 35 × 0.0034) = 456.5 × 1.119 = 510.82 V ≤ 550 → pass
    // 690.8(A): 13.9 × 1.25 = 17.375 A; 690.8(B): 13.9 × 1.5625 = 21.72 A
    const r = checkString(base);
    expect(r.hotCellTempC).toBeCloseTo(66.25, 2);
    expect(r.stringVmpHotV).toBeCloseTo(392.48, 2);
    expect(r.stringVmpColdV).toBeCloseTo(510.82, 2);
    expect(r.maxCircuitCurrentA).toBeCloseTo(17.38, 2);
    expect(r.requiredConductorAmpacityA).toBeCloseTo(21.72, 2);
    expect(r.status).toBe("pass");
    expect(r.caution).toBe(CAUTION);
    expect(r.caution).toContain("licensed professional");
    expect(r.caution).toContain("AHJ");
  });

  it("warns when a short string falls below the MPPT window", () => {
    // 4 modules: 4 × 41.5 × 0.85975 = 142.7 V < 200 V → warn
    const short = checkString({ ...base, modulesInSeries: 4 });
    expect(short.checks.find((c) => c.id === "mppt-low")?.status).toBe("warn");
    expect(short.status).toBe("warn");
  });

  it("conductor per NEC 690.8(B): 13.9 A × 1.56 = 21.72 A from the table, 13.9 A × 1.25 = 17.38 A after correction", () => {
    const conductor = (input: Partial<StringCheckInput>) => checkString({ ...base, ...input }).checks.find((c) => c.id === "conductor");
    expect(conductor({ conductorTableAmpacityA: 20 })?.status).toBe("fail"); // 20 < 21.72: (B)(1)
    expect(conductor({ conductorTableAmpacityA: 20 })?.detail).toContain("690.8(B)(1)");
    expect(conductor({ conductorAmpacityA: 16 })?.status).toBe("fail"); // 16 < 17.38: (B)(2)
    expect(conductor({ conductorAmpacityA: 20 })?.status).toBe("pass"); // 20 ≥ 17.38 after correction
    expect(conductor({ conductorTableAmpacityA: 30, conductorAmpacityA: 18 })?.status).toBe("pass");
  });

  it("maximum current can fail: back-feed into a faulted string against the module's series fuse rating (NEC 690.9(A))", () => {
    const maxCurrent = (parallel: number, maxSeriesFuseA?: number) =>
      checkString({ ...base, stringsInParallel: parallel, module: { ...base.module, maxSeriesFuseA } }).checks.find((c) => c.id === "max-current");
    expect(maxCurrent(1, 25)?.status).toBe("pass"); // nothing else feeds one string
    expect(maxCurrent(2, 25)?.status).toBe("pass"); // 1 × 13.9 × 1.25 = 17.38 A ≤ 25 A
    expect(maxCurrent(3, 25)?.status).toBe("fail"); // 2 × 13.9 × 1.25 = 34.75 A > 25 A: string fuses needed
    expect(maxCurrent(3, 25)?.detail).toContain("each string needs its own fuse");
    expect(maxCurrent(2)?.status).toBe("warn"); // rating unknown
  });

  it("fails two parallel strings over the inverter's input Isc (2 × 13.9 = 27.8 A > 18 A)", () => {
    const r = checkString({ ...base, stringsInParallel: 2 });
    expect(r.checks.find((c) => c.id === "inverter-current")?.status).toBe("fail");
    expect(r.maxCircuitCurrentA).toBeCloseTo(34.75, 2);
  });
});

describe("Voc coefficient in other units", () => {
  it("gives the same check for −0.28 %/°C, −138.6 mV/°C and −0.1386 V/°C (49.5 V × 0.28 % = 0.1386 V)", () => {
    const pct = checkString(base);
    const mv = checkString({ ...base, module: { ...base.module, vocCoeffPctPerC: undefined, vocCoeff: { value: -138.6, unit: "mV/°C" } } });
    const v = checkString({ ...base, module: { ...base.module, vocCoeffPctPerC: undefined, vocCoeff: { value: -0.1386, unit: "V/°C" } } });
    expect(mv.stringVocMaxV).toBeCloseTo(pct.stringVocMaxV, 6);
    expect(v.stringVocMaxV).toBeCloseTo(pct.stringVocMaxV, 6);
    expect(mv.method).toBe("coefficient");
  });
  it("refuses a coefficient that is not one once converted (−138.6 read as V/°C = −280 %/°C)", () => {
    expect(() => checkString({ ...base, module: { ...base.module, vocCoeffPctPerC: undefined, vocCoeff: { value: -138.6, unit: "V/°C" } } })).toThrow(/module.vocCoeff/);
  });
});

describe("validation", () => {
  it("names every bad field", () => {
    try {
      checkString({ ...base, modulesInSeries: 0, inverter: { ...base.inverter, mpptMinV: 600 }, lowestTempC: Number.NaN });
      throw new Error("expected failure");
    } catch (e) {
      expect(e).toBeInstanceOf(EngineInputError);
      const paths = (e as EngineInputError).issues.map((i) => i.path);
      expect(paths).toEqual(expect.arrayContaining(["modulesInSeries", "lowestTempC"]));
    }
  });

  it("asks for a coefficient below the table's −40 °C", () => {
    expect(() => checkString({ ...base, lowestTempC: -45, module: { ...base.module, vocCoeffPctPerC: undefined } })).toThrow(/coefficient is needed/);
  });
});
