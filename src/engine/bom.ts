// Bill of materials for a rooftop PV job: rails cut from stock lengths with their splices,
// attachments at the span the rail maker's table allows for the site's wind and snow, clamps,
// module-level electronics, conductors and conduit with estimated lengths, overcurrent devices,
// the disconnect and the labels, plus spares. Each line carries the arithmetic it came from.
// Pure: the caller passes the catalog parts and prices.

import { CONDUCTOR_SIZES } from "./electrical/nec-tables";

/** Standard ampere ratings of fuses and inverse-time breakers, NEC 240.6(A) (up to 200 A). */
export const STANDARD_OCPD_A = [15, 20, 25, 30, 35, 40, 45, 50, 60, 70, 80, 90, 100, 110, 125, 150, 175, 200] as const;

/** Rail past the end clamp at each end of a run, m: common practice about 50 mm (the maker's manual rules). */
export const RAIL_OVERHANG_M = 0.05;
/** Conduit sells in 10 ft sticks, m. */
export const CONDUIT_STICK_M = 3.048;
/** Raceway marking at least every 10 ft (NEC 690.31(D)(2) in 2020, from memory), m. */
export const CONDUIT_MARKING_EVERY_M = 3.048;
/** Inverter to the point of interconnection when the survey gives nothing, m (our assumption: mounted beside the service). */
export const DEFAULT_AC_RUN_M = 3;
/** Home run (roof junction box to inverter or service) when the survey gives nothing, m (our assumption). */
export const DEFAULT_HOME_RUN_M = 15;
/** Extra conductor per run for terminations and routing, fraction (common practice 10 %). */
export const SLACK = 0.1;

export type SpanRow = { windMph: number; snowPsf: number; maxSpanMm: number };

/**
 * The largest attachment span the maker's table allows for the site: among the rows whose wind
 * speed and snow load both cover the site's, the largest span. Without site loads, the table's
 * shortest span (the safe side). Null when no row covers the site.
 */
export function allowedSpan(table: SpanRow[], windMph: number | null, snowPsf: number | null): { spanMm: number; basis: string } | null {
  if (table.length === 0) return null;
  if (windMph === null || snowPsf === null) {
    const min = Math.min(...table.map((r) => r.maxSpanMm));
    return { spanMm: min, basis: `site wind/snow not given: the table's shortest span, ${min} mm` };
  }
  const covering = table.filter((r) => r.windMph >= windMph && r.snowPsf >= snowPsf);
  if (covering.length === 0) return null;
  const best = covering.reduce((a, b) => (b.maxSpanMm > a.maxSpanMm ? b : a));
  return { spanMm: best.maxSpanMm, basis: `span table row ${best.windMph} mph / ${best.snowPsf} psf covers ${windMph} mph / ${snowPsf} psf: ${best.maxSpanMm} mm` };
}

/**
 * Stock pieces for one rail run: the fewest pieces, then the least waste (every combination of
 * the stock lengths is tried for that number of pieces). Joints = pieces − 1 splices.
 */
export function cutRail(runMm: number, stockMm: number[]): { pieces: number[]; wasteMm: number } {
  const stock = [...new Set(stockMm)].sort((a, b) => b - a);
  const n = Math.max(1, Math.ceil(runMm / stock[0]));
  let best: number[] | null = null;
  const walk = (from: number, left: number, picked: number[]) => {
    if (left === 0) {
      const sum = picked.reduce((s, v) => s + v, 0);
      if (sum >= runMm && (!best || sum < best.reduce((s, v) => s + v, 0))) best = [...picked];
      return;
    }
    for (let i = from; i < stock.length; i++) walk(i, left - 1, [...picked, stock[i]]);
  };
  walk(0, n, []);
  const pieces = best ?? Array.from({ length: n }, () => stock[0]);
  return { pieces, wasteMm: pieces.reduce((s, v) => s + v, 0) - runMm };
}

/** Attachments along one rail run: one at each end and none further apart than the span. */
export const attachmentsPerRun = (runMm: number, spanMm: number) => Math.ceil(runMm / spanMm) + 1;

/** The next standard rating at or above `amps` (NEC 240.6(A)); null above 200 A. */
export const nextStandardOcpd = (amps: number): number | null => STANDARD_OCPD_A.find((a) => a >= amps - 1e-9) ?? null;

export type ConductorChoice = { sizeAwg: string; material: "cu" | "al"; insulation: string; source: string };
export type Circuit = { role: "dc_roof" | "dc_home_run" | "ac_output" | "egc"; amps: number; chosen?: Omit<ConductorChoice, "source"> | null };

/**
 * The conductor for a circuit: the conductor the electrical design sized if given, else the common-
 * practice default for residential circuits of this current (copper, 75 °C column of NEC Table
 * 310.16 from memory with the small-conductor limits of 240.4(D), no derating). The electrical
 * checks replace this with a sized conductor.
 */
export function conductorFor(c: Circuit): ConductorChoice {
  if (c.chosen) return { ...c.chosen, source: "sized by the electrical design" };
  const insulation = c.role === "dc_roof" ? "pv_wire" : "thwn_2";
  if (c.role === "egc") return { sizeAwg: c.amps <= 60 ? "10" : c.amps <= 100 ? "8" : "6", material: "cu", insulation, source: "common-practice default (NEC Table 250.122, from memory)" };
  const table: [number, string][] = [
    [15, "14"],
    [20, "12"],
    [30, "10"],
    [50, "8"],
    [65, "6"],
    [85, "4"],
    [115, "2"],
    [150, "1/0"],
  ];
  const size = (table.find(([a]) => a >= c.amps) ?? table[table.length - 1])[1];
  return { sizeAwg: size, material: "cu", insulation, source: "common-practice default (not yet sized by the electrical checks)" };
}

// ── The bill itself ──────────────────────────────────────────────────────────────────

/** A catalog part as the BOM needs it (the caller maps its rows). */
export type BomPart = {
  id: string;
  kind: string;
  name: string;
  details: Record<string, unknown>;
  /** The price of one unit from the price book, cents; null when no line item prices it. */
  unitCents: number | null;
};
export type Spares = Partial<Record<string, { percent: number } | { count: number }>>;
export type BomFace = { name: string; rows: number[]; moduleAlongRowM: number; eaveM: number; slopeM: number };
export type BomInput = {
  faces: BomFace[];
  module: { name: string; count: number; iscA: number };
  inverter: { name: string; kind: "string" | "micro"; units: number; acWattsEach: number };
  /** String inverters: modules in series per string; null or empty when no plan exists. */
  strings: number[] | null;
  site: { windMph: number | null; snowPsf: number | null; homeRunM: number | null };
  parts: BomPart[];
  spares: Spares;
  /** The conductors the electrical design sized, per circuit role (else common-practice defaults). */
  conductors?: Partial<Record<Circuit["role"], Omit<ConductorChoice, "source">>>;
};
export type BomLine = {
  kind: string;
  item: string;
  partId: string | null;
  detail: string;
  /** Needed quantity, then spares, then their sum (what to load). */
  needed: number;
  spares: number;
  quantity: number;
  unit: "pcs" | "m";
  /** How the quantity was reached, in words and numbers. */
  basis: string;
  unitCents: number | null;
  totalCents: number | null;
};

const round1 = (v: number) => Math.round(v * 10) / 10;

function sparesFor(kind: string, needed: number, spares: Spares): number {
  const s = spares[kind];
  if (!s || needed === 0) return 0;
  return "count" in s ? s.count : Math.ceil((needed * s.percent) / 100);
}

type LineSpec = { kind: string; item: string; part: BomPart | null; detail?: string; needed: number; unit: "pcs" | "m"; basis: string };

function line(spec: LineSpec, spares: Spares): BomLine {
  const needed = spec.unit === "m" ? Math.ceil(spec.needed) : spec.needed;
  const extra = sparesFor(spec.kind, needed, spares);
  const quantity = needed + extra;
  const unitCents = spec.part?.unitCents ?? null;
  return {
    kind: spec.kind,
    item: spec.item,
    partId: spec.part?.id ?? null,
    detail: spec.part ? `${spec.part.name}${spec.detail ? `, ${spec.detail}` : ""}` : `no active ${spec.item.toLowerCase()} in the catalog${spec.detail ? ` (${spec.detail})` : ""}`,
    needed,
    spares: extra,
    quantity,
    unit: spec.unit,
    basis: spec.basis,
    unitCents,
    totalCents: unitCents === null ? null : unitCents * quantity,
  };
}

/** The first active part of a kind that passes the test (the caller orders them). */
const partOf = (parts: BomPart[], kind: string, test: (d: Record<string, unknown>) => boolean = () => true) => parts.find((p) => p.kind === kind && test(p.details)) ?? null;

const AWG_ASCENDING: readonly string[] = CONDUCTOR_SIZES;

/**
 * The catalog conductor for a sized one: the same material and insulation at the sized gauge or
 * the next larger one the catalog carries (a larger conductor keeps its ampacity and lowers the
 * voltage drop; common practice when a size is not stocked).
 */
export function conductorPartFor(parts: BomPart[], c: ConductorChoice): BomPart | null {
  const need = AWG_ASCENDING.indexOf(c.sizeAwg);
  const rank = (p: BomPart) => AWG_ASCENDING.indexOf(String(p.details.sizeAwg));
  const fits = parts.filter((p) => p.kind === "conductor" && p.details.material === c.material && p.details.insulation === c.insulation && rank(p) >= need && need >= 0);
  return fits.reduce<BomPart | null>((best, p) => (best === null || rank(p) < rank(best) ? p : best), null);
}

/** Racking: rails cut to stock with splices, attachments at the allowed span, clamps. */
function rackingLines(input: BomInput, problems: string[]): LineSpec[] {
  const rail = partOf(input.parts, "rail");
  const stock = (rail?.details.stockLengthsMm as number[] | undefined) ?? [];
  const table = (rail?.details.spanTable as SpanRow[] | undefined) ?? [];
  const span = allowedSpan(table, input.site.windMph, input.site.snowPsf);
  if (rail && !span) problems.push(`No row of ${rail.name}'s span table covers ${input.site.windMph} mph / ${input.site.snowPsf} psf: the engineer of record decides the attachment spacing.`);
  const spanMm = span?.spanMm ?? Math.min(...table.map((r) => r.maxSpanMm), 1200);
  let pieces = 0;
  let splices = 0;
  let attachments = 0;
  let mid = 0;
  let end = 0;
  const railNotes: string[] = [];
  for (const f of input.faces) {
    for (const n of f.rows) {
      if (n === 0) continue;
      const runM = n * f.moduleAlongRowM + (n - 1) * 0.02 + 2 * RAIL_OVERHANG_M;
      const runMm = Math.round(runM * 1000);
      // Two rails under every row (our assumption; the maker's manual sets the clamp zones).
      const cut = stock.length > 0 ? cutRail(runMm, stock) : { pieces: [], wasteMm: 0 };
      pieces += 2 * cut.pieces.length;
      splices += 2 * Math.max(0, cut.pieces.length - 1);
      attachments += 2 * attachmentsPerRun(runMm, spanMm);
      mid += 2 * (n - 1);
      end += 4;
      railNotes.push(`${f.name}: row of ${n} → 2 × ${runMm} mm run${cut.pieces.length ? ` = ${cut.pieces.join(" + ")} mm` : ""}`);
    }
  }
  const modulesInRows = input.faces.reduce((s, f) => s + f.rows.reduce((a, b) => a + b, 0), 0);
  return [
    { kind: "rail", item: "Racking rail", part: rail, needed: pieces, unit: "pcs", basis: `${railNotes.join("; ")} (rows × 2 rails, each run = modules + gaps + ${RAIL_OVERHANG_M * 1000} mm each end, cut from stock ${stock.join("/") || "—"} mm)` },
    { kind: "splice", item: "Rail splice", part: partOf(input.parts, "splice"), needed: splices, unit: "pcs", basis: "one per joint: pieces − 1 in every run" },
    {
      kind: "attachment",
      item: "Roof attachment",
      part: partOf(input.parts, "attachment"),
      needed: attachments,
      unit: "pcs",
      basis: `each run: ⌈run ÷ ${spanMm} mm⌉ + 1 (${span?.basis ?? "no span table: 1200 mm, our assumption"})`,
    },
    { kind: "mid_clamp", item: "Mid clamp", part: partOf(input.parts, "mid_clamp"), needed: mid, unit: "pcs", basis: `2 rails × (modules − 1) per row; ${modulesInRows} modules in rows` },
    { kind: "end_clamp", item: "End clamp", part: partOf(input.parts, "end_clamp"), needed: end, unit: "pcs", basis: "2 rails × 2 ends per row" },
  ];
}

/** Circuits: currents, conductor lengths (estimated), conduit, overcurrent devices, disconnect, boxes. */
function electricalLines(input: BomInput): LineSpec[] {
  const out: LineSpec[] = [];
  const homeRun = input.site.homeRunM ?? DEFAULT_HOME_RUN_M;
  const homeBasis = input.site.homeRunM === null ? `${DEFAULT_HOME_RUN_M} m (our assumption: the survey gives no home run)` : `${homeRun} m from the survey`;
  const facesWithModules = input.faces.filter((f) => f.rows.some((n) => n > 0));
  const acAmps = (input.inverter.units * input.inverter.acWattsEach) / 240;
  const isString = input.inverter.kind === "string";
  // Micros: 240 V branch circuits of at most 16 A continuous (a 20 A breaker at 80 %, common practice).
  const branches = isString ? input.inverter.units : Math.max(1, Math.ceil(acAmps / 16));
  const breakerA = isString ? nextStandardOcpd((1.25 * acAmps) / input.inverter.units) : 20;
  const conductor = (role: Circuit["role"], amps: number) => conductorFor({ role, amps, chosen: input.conductors?.[role] ?? null });
  const conductorPart = (c: ConductorChoice) => conductorPartFor(input.parts, c);
  const wire = (role: Circuit["role"], amps: number, lengthM: number, basis: string) => {
    const c = conductor(role, amps);
    const part = conductorPart(c);
    const stocked = part && String(part.details.sizeAwg) !== c.sizeAwg ? `; the catalog's next larger, ${String(part.details.sizeAwg)} AWG` : "";
    out.push({ kind: "conductor", item: "Conductor", part, detail: `${c.sizeAwg} AWG ${c.material === "cu" ? "Cu" : "Al"} ${c.insulation.replace("_", "-").toUpperCase()} (${c.source})${stocked}`, needed: lengthM, unit: "m", basis });
  };

  if (isString) {
    const strings = input.strings && input.strings.length > 0 ? input.strings : [input.module.count];
    const sourceA = input.module.iscA * 1.25;
    const roofRun = facesWithModules.reduce((s, f) => Math.max(s, f.eaveM + f.slopeM), 0);
    wire("dc_roof", 1.25 * sourceA, strings.length * 2 * roofRun * (1 + SLACK), `${strings.length} strings × 2 conductors × ${round1(roofRun)} m (eave + slope of the largest face, estimated) + ${SLACK * 100} %`);
    wire("dc_home_run", 1.25 * sourceA, strings.length * 2 * homeRun * (1 + SLACK), `${strings.length} strings × 2 conductors × ${homeBasis} + ${SLACK * 100} %`);
    wire("egc", breakerA ?? 60, (homeRun + DEFAULT_AC_RUN_M) * (1 + SLACK), `one equipment grounding conductor along the home run and the AC run + ${SLACK * 100} %`);
    wire("ac_output", 1.25 * acAmps, 3 * DEFAULT_AC_RUN_M * (1 + SLACK), `L1, L2, N × ${DEFAULT_AC_RUN_M} m inverter to interconnection (our assumption) + ${SLACK * 100} %`);
    if (strings.length > 2) {
      const fuseA = nextStandardOcpd(sourceA * 1.25) ?? 200;
      out.push({ kind: "fuse", item: "Fuse", part: partOf(input.parts, "fuse", (d) => Number(d.ratingA) >= fuseA), detail: `string fuses, ${fuseA} A or more`, needed: strings.length * 2, unit: "pcs", basis: `${strings.length} strings in parallel (over 2 need fuses, NEC 690.9(A), from memory) × 2 poles` });
      out.push({ kind: "combiner", item: "Combiner / junction box", part: partOf(input.parts, "combiner", (d) => Number(d.inputs) >= strings.length), needed: 1, unit: "pcs", basis: `one combiner for ${strings.length} strings` });
    }
  } else {
    wire("ac_output", 1.25 * 16, branches * 2 * homeRun * (1 + SLACK) + DEFAULT_AC_RUN_M * 3, `${branches} branch circuits × L1, L2 × ${homeBasis} + ${SLACK * 100} %, plus L1, L2, N × ${DEFAULT_AC_RUN_M} m to the interconnection`);
    wire("egc", 20, (homeRun + DEFAULT_AC_RUN_M) * (1 + SLACK), `one equipment grounding conductor along the home run + ${SLACK * 100} %`);
  }
  const boxes = facesWithModules.length;
  if (boxes > 0) out.push({ kind: "combiner", item: "Combiner / junction box", part: partOf(input.parts, "combiner"), detail: "roof junction box", needed: boxes, unit: "pcs", basis: `one roof junction box per face with modules (${boxes})` });
  const conduitM = Math.ceil((homeRun * (1 + SLACK)) / CONDUIT_STICK_M) * CONDUIT_STICK_M;
  out.push({ kind: "conduit", item: "Conduit", part: partOf(input.parts, "conduit"), needed: conduitM, unit: "m", basis: `home run ${round1(homeRun)} m + ${SLACK * 100} %, whole 10 ft sticks (${Math.round(conduitM / CONDUIT_STICK_M)})` });
  out.push({
    kind: "breaker",
    item: "Breaker",
    part: partOf(input.parts, "breaker", (d) => d.ratingA === breakerA),
    detail: `${breakerA ?? "over 200"} A`,
    needed: branches,
    unit: "pcs",
    basis: isString ? `125 % × ${round1(acAmps / input.inverter.units)} A continuous output per inverter → next standard size (NEC 240.6(A))` : `${branches} branch circuits of at most 16 A continuous (20 A breaker)`,
  });
  const discA = nextStandardOcpd(1.25 * acAmps) ?? 200;
  out.push({ kind: "disconnect", item: "Disconnect", part: partOf(input.parts, "disconnect", (d) => Number(d.ratingA) >= discA), detail: `AC, ${discA} A or more`, needed: 1, unit: "pcs", basis: `one PV system AC disconnect rated ≥ 125 % × ${round1(acAmps)} A` });
  return out;
}

/** Labels by purpose (counts our reading of NEC 690 and 705, from memory; the AHJ may want more). */
function labelLines(input: BomInput, conduitM: number): LineSpec[] {
  const boxes = input.faces.filter((f) => f.rows.some((n) => n > 0)).length;
  const counts: [string, number, string][] = [
    ["rapid_shutdown", 1, "one at the service equipment (690.56(C))"],
    ["ac_disconnect", 1, "one at the PV system disconnect (690.13(B))"],
    ["backfed_breaker", 1, "one at the interconnection (705.12)"],
    ["directory", 1, "one directory of power sources at the service (705.10)"],
    ["dc_source", input.inverter.kind === "string" ? boxes + 1 : 0, "one per roof junction box and one at the inverter (690.53)"],
    ["conduit_marking", Math.ceil(conduitM / CONDUIT_MARKING_EVERY_M), `every 10 ft of ${round1(conduitM)} m conduit (690.31(D)(2))`],
  ];
  return counts
    .filter(([, n]) => n > 0)
    .map(([purpose, n, basis]) => ({ kind: "label", item: "Label", part: partOf(input.parts, "label", (d) => d.purpose === purpose), detail: purpose.replace("_", " "), needed: n, unit: "pcs" as const, basis }));
}

/** The whole bill: modules and inverters first, then racking, electronics, circuits and labels. */
export function buildBom(input: BomInput): { lines: BomLine[]; problems: string[]; totalCents: number; unpriced: number } {
  const problems: string[] = [];
  const specs: LineSpec[] = [
    { kind: "module", item: "PV module", part: null, detail: input.module.name, needed: input.module.count, unit: "pcs", basis: "the design's module count" },
    { kind: "inverter", item: input.inverter.kind === "micro" ? "Microinverter" : "String inverter", part: null, detail: input.inverter.name, needed: input.inverter.units, unit: "pcs", basis: input.inverter.kind === "micro" ? "one per module group" : "the design's inverter count" },
  ];
  specs.push(...rackingLines(input, problems));
  if (input.inverter.kind === "string") {
    const mlpe = partOf(input.parts, "mlpe");
    const per = Number(mlpe?.details.modulesPerUnit ?? 1);
    if (mlpe) specs.push({ kind: "mlpe", item: "Module-level electronics", part: mlpe, needed: Math.ceil(input.module.count / per), unit: "pcs", basis: `⌈${input.module.count} modules ÷ ${per} per unit⌉ (rapid shutdown, NEC 690.12)` });
    else problems.push("No active module-level electronics in the catalog: a string array on a building needs rapid shutdown (NEC 690.12).");
  }
  const electrical = electricalLines(input);
  specs.push(...electrical);
  specs.push(...labelLines(input, electrical.find((l) => l.kind === "conduit")?.needed ?? 0));
  const lines = specs.map((s) => ({ ...line(s, input.spares), ...(s.part === null && (s.kind === "module" || s.kind === "inverter") ? { detail: s.detail ?? "" } : {}) }));
  const totalCents = lines.reduce((s, l) => s + (l.totalCents ?? 0), 0);
  return { lines, problems, totalCents, unpriced: lines.filter((l) => l.totalCents === null).length };
}
