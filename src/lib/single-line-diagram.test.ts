import { describe, expect, it } from "vitest";
import { designElectrical, type ElectricalInput } from "@/engine/electrical/design";
import { drawingSvg, singleLineDiagram, type Shape } from "./single-line-diagram";

const base: ElectricalInput = {
  edition: "2020",
  module: { iscA: 10.5, impA: 10, vocV: 38.2, vmpV: 32, vocCoeffPctPerC: -0.27, maxSeriesFuseA: 20 },
  inverter: { kind: "string", label: "Ridgewater RW-7600S", acWatts: 7600, continuousOutputA: 32, maxDcVoltageV: 600, mpptMinV: 100, mpptMaxV: 550, mpptCount: 2 },
  moduleCount: 20,
  strings: { sizes: [10, 10], lowestTempC: -10, highestTempC: 35 },
  site: { busbarA: 200, mainBreakerA: 200 },
};
const ctx = { householdName: "Calloway household", moduleLabel: "Prairieline PL-410T 410 W", utilityName: "Piedmont Electric" };
const texts = (shapes: Shape[]) => shapes.flatMap((s) => (s.k === "text" ? [s.text] : [])).join(" | ");

describe("single-line diagram", () => {
  it("draws a string system from the array to the utility with sizes and ratings", () => {
    const dr = singleLineDiagram(designElectrical(base), ctx);
    const all = texts(dr.shapes);
    for (const expected of [
      "2 strings of 10",
      "rapid-shutdown device at each",
      "4 × 14 AWG copper + 14 AWG EGC",
      "in 1/2 in. EMT, 60 ft",
      "1 × Ridgewater RW-7600S",
      "AC disconnect",
      "busbar 200 A",
      "PV breaker 40 A",
      "utility meter",
      "Utility: Piedmont | Electric" /* wrapped over two lines */
    ]) {
      expect(all).toContain(expected);
    }
    // Every shape stays inside the drawing (clear at tabloid, nothing cut off).
    for (const s of dr.shapes) {
      if (s.k === "rect") expect(s.x + s.w <= dr.width && s.y + s.h <= dr.height).toBe(true);
      if (s.k === "text") expect(s.y <= dr.height && s.x <= dr.width).toBe(true);
    }
  });

  it("says the same in words (the text alternative), and as SVG with a title and description", () => {
    const dr = singleLineDiagram(designElectrical(base), ctx);
    const words = dr.description.join(" ");
    expect(words).toMatch(/PV array: 20 modules .* as 2 strings of 10, rapid-shutdown device at each module/);
    expect(words).toMatch(/Service panel: busbar 200 A, main breaker 200 A, 240 V; the PV breaker of 40 A is the point of interconnection \(load-side \(120 % rule\): pass\)/);
    const svg = drawingSvg(dr);
    expect(svg).toMatch(/^<svg [^>]*role="img"><title>Single-line diagram: Calloway household, NEC 2020<\/title><desc>PV array/);
  });

  it("draws microinverter branches into an AC combiner, and says when the panel's ratings are missing", () => {
    const d = designElectrical({ ...base, edition: "2017", inverter: { kind: "micro", label: "Lumenfield LF-320M", acWatts: 320, modulesPerUnit: 1 }, strings: null, moduleCount: 24, site: {} });
    const dr = singleLineDiagram(d, ctx);
    const all = texts(dr.shapes);
    expect(all).toContain("2 branches of 12");
    expect(all).toContain("AC combiner panel");
    expect(all).toContain("busbar not known");
    expect(dr.description.join(" ")).toContain("not checked: ratings missing");
  });
});
