import { describe, expect, it } from "vitest";
import { EngineInputError } from "../errors";
import { designElectrical, electricalProblems, type ElectricalInput } from "./design";

const stringCase: ElectricalInput = {
  edition: "2020",
  module: { iscA: 10.5, impA: 10, vocV: 38.2, vmpV: 32, vocCoeffPctPerC: -0.27, maxSeriesFuseA: 20 },
  inverter: { kind: "string", acWatts: 7600, continuousOutputA: 32, maxDcVoltageV: 600, mpptMinV: 100, mpptMaxV: 550, mpptCount: 2 },
  moduleCount: 20,
  strings: { sizes: [10, 10], lowestTempC: -10, highestTempC: 35 },
  site: { busbarA: 200, mainBreakerA: 200 },
};
const microCase: ElectricalInput = {
  edition: "2017",
  module: { iscA: 10.5, impA: 10, vocV: 38.2, vmpV: 32 },
  inverter: { kind: "micro", acWatts: 290, continuousOutputA: 1.21, modulesPerUnit: 1 },
  moduleCount: 26,
  site: { busbarA: 200, mainBreakerA: 200 },
};

describe("690.8(A) circuit currents", () => {
  it("PV source circuit: Isc × 1.25 (690.8(A)(1)), three modules", () => {
    for (const [isc, expected] of [[10.5, 13.13], [11.2, 14], [9.8, 12.25]] as const) {
      const d = designElectrical({ ...stringCase, module: { ...stringCase.module, iscA: isc } });
      expect(d.circuits[0].maxCurrentA).toBe(expected);
    }
  });

  it("inverter output circuit: the continuous output rating (690.8(A)(1)(e) 2020), else W ÷ V", () => {
    expect(designElectrical(stringCase).circuits.at(-1)!.maxCurrentA).toBe(32); // data sheet 32 A
    const byWatts = designElectrical({ ...stringCase, inverter: { ...stringCase.inverter, continuousOutputA: undefined, acWatts: 5760 } });
    expect(byWatts.circuits.at(-1)!.maxCurrentA).toBe(24); // 5760 W ÷ 240 V
    expect(byWatts.backfedBreakerA).toBe(30); // 24 × 1.25 = 30 A (705.30(B), 240.6(A))
  });

  it("microinverter branch: units × unit output current", () => {
    const d = designElectrical(microCase);
    // 20 A ÷ (1.21 A × 1.25) = 13.2 → 13 units a branch; 26 units → 2 branches of 13
    expect(d.branches).toEqual([{ units: 13, count: 2 }]);
    expect(d.circuits[0].maxCurrentA).toBe(15.73); // 13 × 1.21 A
    expect(d.circuits[0].ocpdA).toBe(20);
    expect(d.circuits.at(-1)!.maxCurrentA).toBe(31.46); // 26 × 1.21 A to the AC combiner output
    expect(d.backfedBreakerA).toBe(40); // 31.46 × 1.25 = 39.33 → 40 A
  });
});

describe("the whole design", () => {
  it("string inverter, 2 × 10 on a 200/200 panel: passes with the 120 % rule and lists the labels", () => {
    const d = designElectrical(stringCase);
    expect(d.status).toBe("pass");
    expect(d.strings).toEqual([{ size: 10, count: 2 }]);
    expect(d.stringChecks[0].stringVocMaxV).toBe(418.1); // 690.7(A)(1): 10 × 38.2 × (1 + (−10 − 25) × −0.27 %)
    expect(d.interconnection?.method).toBe("load-side (120 % rule)");
    expect(d.labels.map((l) => l.id)).toContain("backfed-breaker");
    expect(d.totalVoltageDropPct).toBe(1.59); // 1.18 % DC + 0.41 % AC
  });

  it("microinverters under NEC 2017: branch home runs take the rooftop adder", () => {
    const d = designElectrical(microCase);
    expect(d.status).toBe("pass");
    expect(d.circuits[0].rooftopAdderC).toBe(22);
    expect(d.circuits[0].size).toBe("12"); // 30 A × 0.71 × 0.8 = 17.04 A ≥ 15.73 A
    expect(d.labels.some((l) => l.id === "dc-source")).toBe(false);
  });

  it("is incomplete without a string plan or the panel's ratings, and says what is missing", () => {
    const d = designElectrical({ ...stringCase, strings: null, site: {} });
    expect(d.status).toBe("incomplete");
    expect(d.missing).toEqual(["a string plan (the string inverter's strings)", "the service panel's busbar rating", "the service panel's main breaker rating"]);
    expect(electricalProblems(d)[0]).toMatch(/^missing a string plan/);
  });

  it("fails an 11.5 kW inverter on a 200/200 panel and names the way out", () => {
    const d = designElectrical({ ...stringCase, inverter: { ...stringCase.inverter, acWatts: 11400, continuousOutputA: 47.5 } });
    expect(d.status).toBe("fail");
    expect(d.interconnection?.deratedMainA).toBe(175);
    expect(electricalProblems(d).join(" ")).toMatch(/705\.12\(B\)\(3\)\(2\)/);
  });

  it("fails a string inverter without module-level electronics (690.12)", () => {
    const d = designElectrical({ ...stringCase, moduleLevelElectronics: "none" });
    expect(d.status).toBe("fail");
    expect(electricalProblems(d).join(" ")).toMatch(/690\.12/);
  });

  it("refuses a malformed case naming the field", () => {
    expect(() => designElectrical({ ...stringCase, edition: "2014" as never })).toThrow(EngineInputError);
    expect(() => designElectrical({ ...stringCase, strings: { sizes: [12, 12], lowestTempC: -10, highestTempC: 35 } })).toThrow(/strings\.sizes: the strings hold more modules/);
  });
});
