import { describe, expect, it } from "vitest";
import { allowedSpan, attachmentsPerRun, buildBom, conductorFor, conductorPartFor, cutRail, nextStandardOcpd, type BomInput, type BomPart } from "./bom";

// An invented maker's span table (wind mph / ground snow psf → largest attachment span, mm).
const TABLE = [
  { windMph: 110, snowPsf: 0, maxSpanMm: 1830 },
  { windMph: 110, snowPsf: 30, maxSpanMm: 1520 },
  { windMph: 140, snowPsf: 0, maxSpanMm: 1400 },
  { windMph: 140, snowPsf: 30, maxSpanMm: 1220 },
];

describe("allowedSpan", () => {
  it("takes the largest span among the rows that cover the site", () => {
    // 105 mph / 20 psf: rows 110/30 (1520), 140/30 (1220) cover it; 110/0 and 140/0 do not (snow 0 < 20).
    expect(allowedSpan(TABLE, 105, 20)?.spanMm).toBe(1520);
    // 120 mph / 0 psf: rows 140/0 (1400) and 140/30 (1220) cover it → 1400.
    expect(allowedSpan(TABLE, 120, 0)?.spanMm).toBe(1400);
    // 110 / 0 is covered by all four → 1830.
    expect(allowedSpan(TABLE, 110, 0)?.spanMm).toBe(1830);
  });
  it("falls back to the shortest span without site loads, and refuses loads beyond the table", () => {
    expect(allowedSpan(TABLE, null, 20)).toMatchObject({ spanMm: 1220 });
    expect(allowedSpan(TABLE, 150, 0)).toBeNull();
    expect(allowedSpan(TABLE, 110, 40)).toBeNull();
  });
});

describe("cutRail", () => {
  it("uses the fewest pieces, then the least waste", () => {
    // 3 990 mm: one 4 200 (waste 210) beats one 5 300 (waste 1 310).
    expect(cutRail(3990, [4200, 5300])).toEqual({ pieces: [4200], wasteMm: 210 });
    // 8 000 mm: two pieces; 4 200 + 4 200 = 8 400 (waste 400) beats 5 300 + 4 200 = 9 500.
    expect(cutRail(8000, [4200, 5300])).toEqual({ pieces: [4200, 4200], wasteMm: 400 });
    // 9 000 mm: two pieces; 4 200 + 4 200 = 8 400 is short, 5 300 + 4 200 = 9 500 (waste 500).
    expect(cutRail(9000, [5300, 4200])).toEqual({ pieces: [5300, 4200], wasteMm: 500 });
    // 11 000 mm: ⌈11 000 ÷ 5 300⌉ = 3 pieces; 4 200 × 3 = 12 600 is the least over 11 000.
    expect(cutRail(11000, [4200, 5300])).toEqual({ pieces: [4200, 4200, 4200], wasteMm: 1600 });
  });
});

describe("attachments, breakers and conductors", () => {
  it("places attachments at both ends and no more than a span apart", () => {
    expect(attachmentsPerRun(3990, 1520)).toBe(4); // ⌈2.62⌉ + 1
    expect(attachmentsPerRun(3040, 1520)).toBe(3); // exactly 2 spans + 1
    expect(attachmentsPerRun(1000, 1830)).toBe(2);
  });
  it("rounds up to the standard sizes of NEC 240.6(A)", () => {
    expect(nextStandardOcpd(1.25 * 32)).toBe(40); // 7 680 W ÷ 240 V = 32 A × 1.25 = 40 A
    expect(nextStandardOcpd(1.25 * 47.5)).toBe(60); // 59.4 A → 60 A
    expect(nextStandardOcpd(21.5)).toBe(25);
    expect(nextStandardOcpd(201)).toBeNull();
  });
  it("stocks a sized conductor at its gauge or the catalog's next larger of the same material and insulation", () => {
    const wire = (id: string, sizeAwg: string, insulation = "pv_wire"): BomPart => ({ id, kind: "conductor", name: id, details: { sizeAwg, material: "cu", insulation }, unitCents: null });
    const sized = { sizeAwg: "12", material: "cu" as const, insulation: "pv_wire", source: "electrical design" };
    // 12 AWG sized (the electrical checks), catalog has 8 and 10 AWG PV wire: 10 AWG is the next larger.
    expect(conductorPartFor([wire("a", "8"), wire("b", "10")], sized)?.id).toBe("b");
    expect(conductorPartFor([wire("a", "12"), wire("b", "10")], sized)?.id).toBe("a");
    // Only a smaller gauge, or another insulation: nothing (the line shows as missing from the catalog).
    expect(conductorPartFor([wire("a", "14")], sized)).toBeNull();
    expect(conductorPartFor([wire("a", "10", "thwn_2")], sized)).toBeNull();
  });

  it("takes the design's conductor when chosen, else the common-practice default", () => {
    expect(conductorFor({ role: "dc_roof", amps: 21.5 })).toMatchObject({ sizeAwg: "10", insulation: "pv_wire" });
    expect(conductorFor({ role: "ac_output", amps: 40 })).toMatchObject({ sizeAwg: "8", insulation: "thwn_2" });
    expect(conductorFor({ role: "ac_output", amps: 40, chosen: { sizeAwg: "6", material: "cu", insulation: "thwn_2" } })).toMatchObject({ sizeAwg: "6", source: "sized by the electrical design" });
    expect(conductorFor({ role: "egc", amps: 40 })).toMatchObject({ sizeAwg: "10" });
  });
});

const part = (kind: string, details: Record<string, unknown> = {}, unitCents: number | null = null): BomPart => ({ id: `${kind}-${JSON.stringify(details)}`, kind, name: `Maker ${kind}`, details, unitCents });
const PARTS: BomPart[] = [
  part("rail", { stockLengthsMm: [4200, 5300], spanTable: TABLE }, 6_500),
  part("splice", {}, 900),
  part("attachment", {}, 1_200),
  part("mid_clamp", {}, 250),
  part("end_clamp", {}, 250),
  part("mlpe", { modulesPerUnit: 1 }, 4_000),
  part("combiner", { inputs: 4 }),
  part("breaker", { ratingA: 40 }),
  part("disconnect", { ratingA: 60 }),
  part("conductor", { sizeAwg: "10", material: "cu", insulation: "pv_wire" }),
  part("conduit", {}),
  part("label", { purpose: "rapid_shutdown" }),
];

function stringJob(): BomInput {
  return {
    // One face, 2 rows of 5 portrait modules 1.134 m wide: run = 5 × 1.134 + 4 × 0.02 + 2 × 0.05 = 5.85 m.
    faces: [{ name: "South", rows: [5, 5], moduleAlongRowM: 1.134, eaveM: 10, slopeM: 6 }],
    module: { name: "PL-410T", count: 10, iscA: 13.75 },
    inverter: { name: "SI-7600", kind: "string", units: 1, acWattsEach: 7680 },
    strings: [10],
    site: { windMph: 105, snowPsf: 20, homeRunM: 12 },
    parts: PARTS,
    spares: { mid_clamp: { percent: 10 }, attachment: { count: 2 } },
  };
}

describe("buildBom (worked example: 10 modules, one string inverter)", () => {
  const bom = buildBom(stringJob());
  const byKind = (kind: string) => bom.lines.filter((l) => l.kind === kind);
  it("counts racking from the rows", () => {
    // 5 850 mm per run → one 5 300 is short, so ⌈5 850 ÷ 5 300⌉ = 2 pieces: 4 200 + 4 200 = 8 400 (least waste); 4 runs → 8 pieces, 4 splices.
    expect(byKind("rail")[0]).toMatchObject({ needed: 8, quantity: 8, totalCents: 8 * 6_500 });
    expect(byKind("splice")[0]).toMatchObject({ needed: 4 });
    // span 1 520 mm (105 mph / 20 psf): ⌈5 850 ÷ 1 520⌉ + 1 = 5 per run × 4 runs = 20, + 2 spares.
    expect(byKind("attachment")[0]).toMatchObject({ needed: 20, spares: 2, quantity: 22, totalCents: 22 * 1_200 });
    // mid: 2 rails × 4 per row × 2 rows = 16, + ⌈1.6⌉ = 2 spares; end: 4 per row × 2 = 8.
    expect(byKind("mid_clamp")[0]).toMatchObject({ needed: 16, spares: 2, quantity: 18 });
    expect(byKind("end_clamp")[0]).toMatchObject({ needed: 8, spares: 0 });
  });
  it("counts electronics, devices and labels", () => {
    expect(byKind("mlpe")[0]).toMatchObject({ needed: 10 });
    // 7 680 W ÷ 240 V = 32 A; × 1.25 = 40 A → the 40 A breaker of the catalog.
    expect(byKind("breaker")[0]).toMatchObject({ needed: 1, detail: "Maker breaker, 40 A", partId: expect.stringContaining("40") });
    expect(byKind("disconnect")[0]).toMatchObject({ needed: 1, partId: expect.any(String) });
    // Home run 12 m × 1.1 = 13.2 m → 5 sticks of 3.048 m = 15.24 m → 16 m (whole metres) on the bill.
    expect(byKind("conduit")[0]).toMatchObject({ needed: 16 });
    // DC roof: 1 string × 2 × (10 + 6) m × 1.1 = 35.2 → 36 m of 10 AWG PV wire (the catalog part).
    const roof = byKind("conductor").find((l) => l.detail.includes("PV-WIRE"));
    expect(roof).toMatchObject({ needed: 36, partId: expect.any(String) });
    // Conduit markings: ⌈15.24 ÷ 3.048⌉ = 5.
    expect(byKind("label").find((l) => l.detail.includes("conduit marking"))).toMatchObject({ needed: 5 });
    expect(bom.problems).toEqual([]);
  });
  it("says when the site is beyond the span table, and when rapid shutdown parts are missing", () => {
    const out = buildBom({ ...stringJob(), site: { windMph: 160, snowPsf: 0, homeRunM: null }, parts: PARTS.filter((p) => p.kind !== "mlpe") });
    expect(out.problems.join(" ")).toMatch(/No row of Maker rail's span table covers 160 mph/);
    expect(out.problems.join(" ")).toMatch(/rapid shutdown/);
  });
  it("sizes micro branch circuits and needs no string fuses", () => {
    const out = buildBom({ ...stringJob(), inverter: { name: "MI-320", kind: "micro", units: 20, acWattsEach: 320 }, strings: null, faces: [{ name: "South", rows: [10, 10], moduleAlongRowM: 1.134, eaveM: 14, slopeM: 6 }], module: { name: "PL-410T", count: 20, iscA: 13.75 } });
    // 20 × 320 W = 6 400 W ÷ 240 V = 26.7 A → ⌈26.7 ÷ 16⌉ = 2 branch circuits, each on a 20 A breaker.
    expect(out.lines.find((l) => l.kind === "breaker")).toMatchObject({ needed: 2, detail: "no active breaker in the catalog (20 A)" });
    expect(out.lines.some((l) => l.kind === "fuse" || l.kind === "mlpe")).toBe(false);
  });
});

describe("buildBom with three strings", () => {
  it("adds string fuses rated at least 156 % of Isc (NEC 690.8(A), 690.9(B)) and a combiner with inputs for every string", () => {
    const parts = [part("combiner", { inputs: 2 }), part("fuse", { ratingA: 20 }), ...PARTS, part("fuse", { ratingA: 25 })];
    const out = buildBom({ ...stringJob(), strings: [8, 8, 8], module: { name: "PL-410T", count: 24, iscA: 13.75 }, parts });
    // 13.75 A × 1.25 × 1.25 = 21.5 A → 25 A (240.6(A)); 3 strings × 2 poles = 6 fuses; the 20 A fuse is too small.
    expect(out.lines.find((l) => l.kind === "fuse")).toMatchObject({ needed: 6, detail: "Maker fuse, string fuses, 25 A or more", partId: expect.stringContaining("25") });
    // The combiner with 4 inputs, not the 2-input one.
    expect(out.lines.find((l) => l.kind === "combiner" && l.basis.startsWith("one combiner"))).toMatchObject({ partId: expect.stringContaining('"inputs":4') });
  });
});
