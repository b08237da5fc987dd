// The single-line diagram of a PV system, drawn from its electrical design as a list of plain
// shapes (boxes, lines, circles, text) in one coordinate space, left to right from the array to
// the utility. The web draws the shapes as SVG (src/components/single-line-diagram.tsx), the job
// packet PDF as vector paths (src/documents/single-line-pdf.ts), so both show the same drawing.
// Our own drawing conventions: boxes for equipment, a circle for the meter, a dashed box for the
// array boundary; every conductor labelled with its count, size, raceway and length.
import type { ElectricalDesign, WiredCircuit } from "@/engine/electrical/design";
import { MATERIAL_NAME, sizeLabel } from "@/engine/electrical/nec-tables";

export type Shape =
  | { k: "rect"; x: number; y: number; w: number; h: number; dash?: boolean; heavy?: boolean }
  | { k: "line"; x1: number; y1: number; x2: number; y2: number; dash?: boolean; heavy?: boolean }
  | { k: "circle"; cx: number; cy: number; r: number }
  | { k: "text"; x: number; y: number; text: string; size: number; anchor: "start" | "middle" | "end"; bold?: boolean };

export type Drawing = { width: number; height: number; shapes: Shape[]; title: string; description: string[] };

export type DiagramContext = {
  householdName: string;
  moduleLabel: string;
  utilityName: string | null;
};

export const DIAGRAM_WIDTH = 1600;
export const DIAGRAM_HEIGHT = 900;
const BUS_Y = 430;
const TEXT = 15;
const SMALL = 13;
/** Characters per line of a label at SMALL size in a column (monospace-ish estimate; our choice). */
const wrap = (text: string, max: number): string[] => {
  const out: string[] = [];
  let line = "";
  for (const word of text.split(" ")) {
    if (line && (line + " " + word).length > max) {
      out.push(line);
      line = word;
    } else line = line ? `${line} ${word}` : word;
  }
  if (line) out.push(line);
  return out;
};

function label(shapes: Shape[], x: number, y: number, lines: string[], opts: { size?: number; anchor?: "start" | "middle" | "end"; boldFirst?: boolean; max?: number } = {}): number {
  const size = opts.size ?? SMALL;
  let yy = y;
  lines.forEach((l, i) => {
    for (const part of wrap(l, opts.max ?? 30)) {
      shapes.push({ k: "text", x, y: yy, text: part, size, anchor: opts.anchor ?? "middle", bold: opts.boldFirst && i === 0 });
      yy += size * 1.3;
    }
  });
  return yy;
}

function box(shapes: Shape[], x: number, y: number, w: number, h: number, lines: string[], opts: { heavy?: boolean; dash?: boolean; max?: number } = {}): void {
  shapes.push({ k: "rect", x, y, w, h, heavy: opts.heavy, dash: opts.dash });
  label(shapes, x + w / 2, y + 22, lines, { boldFirst: true, max: opts.max ?? Math.floor(w / 8) });
}

/** The words on a conductor: count, size, material, EGC, raceway, length, current and drop. */
export function conductorText(c: WiredCircuit): string[] {
  if (!c.size) return [`${c.name}: no conductor fits (see the checks)`];
  const neutral = c.conduit && c.conduit.conductors > c.currentCarrying + 1 ? " + N" : "";
  return [
    `${c.currentCarrying} × ${sizeLabel(c.size)} ${MATERIAL_NAME[c.material]}${neutral}${c.egcSize ? ` + ${sizeLabel(c.egcSize)} EGC` : ""}`,
    c.conduit?.trade ? `in ${c.conduit.trade} in. EMT, ${c.lengthFt} ft` : `${c.lengthFt} ft`,
    `${c.maxCurrentA} A max${c.ocpdA ? `, ${c.ocpdA} A OCPD` : ""}${c.voltageDropPct !== null ? `, Vd ${c.voltageDropPct} %` : ""}`,
  ];
}

/** Array column: one box per string group (string inverters) or branch group (microinverters), inside the array boundary. */
function arrayColumn(shapes: Shape[], d: ElectricalDesign, ctx: DiagramContext, desc: string[]): void {
  const groups = d.kind === "string" ? d.strings.map((s) => ({ head: `${s.count} string${s.count > 1 ? "s" : ""} of ${s.size}`, n: s.size })) : d.branches.map((b) => ({ head: `${b.count} branch${b.count > 1 ? "es" : ""} of ${b.units}`, n: b.units }));
  const mlpe = { none: "no module-level electronics", "rapid-shutdown-device": "rapid-shutdown device at each module", optimizer: "optimizer at each module", microinverter: "microinverter at each module" }[d.moduleLevelElectronics];
  const h = Math.max(160, groups.length * 150 + 90);
  const top = BUS_Y - h / 2;
  shapes.push({ k: "rect", x: 30, y: top, w: 330, h, dash: true });
  label(shapes, 195, top + 24, ["PV array (array boundary dashed)", `${d.moduleCount} × ${ctx.moduleLabel}`], { boldFirst: true, max: 40 });
  groups.forEach((g, i) => {
    const y = top + 80 + i * 150;
    box(shapes, 55, y, 280, 120, [g.head, mlpe], { max: 34 });
    // Module squares: up to 12 drawn, the count says the rest.
    for (let m = 0; m < Math.min(g.n, 12); m++) shapes.push({ k: "rect", x: 70 + m * 21, y: y + 82, w: 16, h: 24 });
    shapes.push({ k: "line", x1: 335, y1: y + 60, x2: 420, y2: BUS_Y });
  });
  desc.push(`PV array: ${d.moduleCount} modules (${ctx.moduleLabel}) as ${groups.map((g) => g.head).join(", ")}, ${mlpe}.`);
}

// long because: one pass lays the drawing out left to right; each block is a few shapes.
export function singleLineDiagram(d: ElectricalDesign, ctx: DiagramContext): Drawing {
  const shapes: Shape[] = [];
  const desc: string[] = [];
  const title = `Single-line diagram: ${ctx.householdName}, NEC ${d.edition}`;
  shapes.push({ k: "text", x: 30, y: 40, text: title, size: 22, anchor: "start", bold: true });
  shapes.push({ k: "text", x: 30, y: 66, text: `Electrical checks: ${d.status}${d.missing.length ? ` (missing ${d.missing.join(", ")})` : ""}`, size: TEXT, anchor: "start" });
  arrayColumn(shapes, d, ctx, desc);

  const dc = d.circuits.filter((c) => c.kind === "dc");
  const firstAc = d.circuits.find((c) => c.kind === "ac");
  const last = d.circuits.at(-1);
  // Junction box or combiner on the roof.
  const jbox = d.stringFuseA ? [`Combiner`, `string fuses ${d.stringFuseA} A (690.9)`] : ["Roof junction box", "conductors change to THWN-2 in conduit"];
  box(shapes, 420, BUS_Y - 60, 170, 120, jbox);
  desc.push(`${jbox.join(", ")} on the roof.`);
  const feed = d.kind === "string" ? dc[0] : firstAc;
  if (feed) {
    label(shapes, 705, BUS_Y - 95, conductorText(feed), { max: 34 });
    desc.push(`${feed.name}: ${conductorText(feed).join(", ")}.`);
  }
  shapes.push({ k: "line", x1: 590, y1: BUS_Y, x2: 820, y2: BUS_Y, heavy: true });

  // Inverter (string) or AC combiner panel (micro / several inverters).
  const invLines =
    d.kind === "string"
      ? [`${d.inverterUnits} × ${d.inverterLabel}`, "string inverter with DC disconnect (690.13, 690.15)", `${d.strings.reduce((s, g) => s + g.count, 0)} strings, ${d.stringsPerInput} per MPPT input`]
      : d.branches.reduce((s, b) => s + b.count, 0) === 1
        ? ["Microinverters", `${d.inverterUnits} × ${d.inverterLabel}`, "one branch circuit to the panel"]
        : [`AC combiner panel`, `${d.branches.reduce((s, b) => s + b.count, 0)} branch breakers × ${d.circuits[0]?.ocpdA ?? "—"} A`, `${d.inverterUnits} × ${d.inverterLabel}`];
  box(shapes, 820, BUS_Y - 90, 220, 180, invLines, { heavy: true, max: 26 });
  desc.push(`${invLines.join(", ")}.`);
  shapes.push({ k: "line", x1: 1040, y1: BUS_Y, x2: 1110, y2: BUS_Y, heavy: true });
  // AC disconnect: a switch symbol in a box.
  box(shapes, 1110, BUS_Y - 55, 120, 110, ["AC disconnect", d.backfedBreakerA ? `≥ ${d.backfedBreakerA} A, lockable` : "lockable"], { max: 16 });
  shapes.push({ k: "line", x1: 1140, y1: BUS_Y + 35, x2: 1200, y2: BUS_Y + 15 });
  desc.push(`AC disconnect${d.backfedBreakerA ? ` rated at least ${d.backfedBreakerA} A` : ""}.`);
  if (last && last.kind === "ac") {
    label(shapes, 1170, BUS_Y + 90, [last.name, ...conductorText(last)], { max: 30 });
    desc.push(`${last.name}: ${conductorText(last).join(", ")}.`);
  }
  shapes.push({ k: "line", x1: 1230, y1: BUS_Y, x2: 1290, y2: BUS_Y, heavy: true });
  servicePanel(shapes, d, desc);
  meterAndUtility(shapes, ctx, desc);
  notes(shapes, d);
  return { width: DIAGRAM_WIDTH, height: DIAGRAM_HEIGHT, shapes, title, description: desc };
}

function servicePanel(shapes: Shape[], d: ElectricalDesign, desc: string[]): void {
  const rating = (a: number | null) => (a === null ? "not known" : `${a} A`);
  const x = 1290;
  const top = BUS_Y - 200;
  box(shapes, x, top, 150, 440, ["Service panel", `busbar ${rating(d.site.busbarA)}`, `main ${rating(d.site.mainBreakerA)}`, `${d.site.serviceVoltageV} V`], { heavy: true, max: 18 });
  // The busbar, the main breaker at its top and the PV breaker at the opposite end.
  shapes.push({ k: "line", x1: x + 75, y1: top + 120, x2: x + 75, y2: BUS_Y + 134, heavy: true });
  shapes.push({ k: "rect", x: x + 55, y: top + 125, w: 40, h: 24 });
  shapes.push({ k: "text", x: x + 100, y: top + 142, text: "main", size: SMALL, anchor: "start" });
  shapes.push({ k: "rect", x: x + 55, y: BUS_Y + 110, w: 40, h: 24 });
  label(shapes, x + 75, BUS_Y + 160, [`PV breaker ${d.backfedBreakerA ?? "—"} A`, "point of", "interconnection"], { max: 20 });
  shapes.push({ k: "line", x1: x, y1: BUS_Y, x2: x + 55, y2: BUS_Y + 122 });
  const ic = d.interconnection;
  desc.push(
    `Service panel: busbar ${rating(d.site.busbarA)}, main breaker ${rating(d.site.mainBreakerA)}, ${d.site.serviceVoltageV} V; the PV breaker of ${d.backfedBreakerA ?? "unknown"} A is the point of interconnection${ic ? ` (${ic.method}: ${ic.status})` : " (not checked: ratings missing)"}.`,
  );
}

function meterAndUtility(shapes: Shape[], ctx: DiagramContext, desc: string[]): void {
  shapes.push({ k: "line", x1: 1365, y1: BUS_Y - 200, x2: 1365, y2: 150 });
  shapes.push({ k: "line", x1: 1365, y1: 150, x2: 1480, y2: 150 });
  shapes.push({ k: "circle", cx: 1510, cy: 150, r: 30 });
  shapes.push({ k: "text", x: 1510, y: 157, text: "M", size: 20, anchor: "middle", bold: true });
  shapes.push({ k: "text", x: 1510, y: 200, text: "utility meter", size: SMALL, anchor: "middle" });
  shapes.push({ k: "line", x1: 1510, y1: 120, x2: 1510, y2: 90 });
  label(shapes, 1510, 84 - SMALL * 1.3, [`Utility: ${ctx.utilityName ?? "not chosen"}`], { max: 22 });
  desc.push(`Utility meter, then the utility${ctx.utilityName ? ` (${ctx.utilityName})` : ""}.`);
}

function notes(shapes: Shape[], d: ElectricalDesign): void {
  const lines = [
    `Rapid shutdown (690.12): ${d.rapidShutdownInitiator}`,
    d.interconnection ? `Interconnection: ${d.interconnection.method}, ${d.interconnection.status}.${d.interconnection.whenItFails.length ? ` ${d.interconnection.whenItFails[0]}` : ""}` : "Interconnection: enter the panel's busbar and main breaker ratings to check it.",
    `${d.assumptions[0]} ${d.assumptions[1]}`,
    `Labels: ${d.labels.map((l) => l.section).join(", ")} (see the packet's label list).`,
    d.caution,
  ];
  let y = 740;
  for (const l of lines) {
    for (const part of wrap(l, 190)) {
      shapes.push({ k: "text", x: 30, y, text: part, size: SMALL, anchor: "start" });
      y += SMALL * 1.35;
    }
  }
}

/** The drawing as one SVG document (for a download or a test); the web renders the same shapes as React elements. */
export function drawingSvg(dr: Drawing): string {
  const esc = (s: string) => s.replace(/&/g, "&amp;").replace(/</g, "&lt;").replace(/>/g, "&gt;").replace(/"/g, "&quot;");
  const body = dr.shapes
    .map((s) => {
      const stroke = `stroke="#1f2933" fill="none" stroke-width="${"heavy" in s && s.heavy ? 3 : 1.5}"${"dash" in s && s.dash ? ' stroke-dasharray="8 6"' : ""}`;
      if (s.k === "rect") return `<rect x="${s.x}" y="${s.y}" width="${s.w}" height="${s.h}" ${stroke}/>`;
      if (s.k === "line") return `<line x1="${s.x1}" y1="${s.y1}" x2="${s.x2}" y2="${s.y2}" ${stroke}/>`;
      if (s.k === "circle") return `<circle cx="${s.cx}" cy="${s.cy}" r="${s.r}" ${stroke}/>`;
      return `<text x="${s.x}" y="${s.y}" font-size="${s.size}" text-anchor="${s.anchor}"${s.bold ? ' font-weight="600"' : ""} fill="#1f2933">${esc(s.text)}</text>`;
    })
    .join("");
  return `<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 ${dr.width} ${dr.height}" role="img"><title>${esc(dr.title)}</title><desc>${esc(dr.description.join(" "))}</desc>${body}</svg>`;
}
