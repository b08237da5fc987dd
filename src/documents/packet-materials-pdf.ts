// The job packet's materials pages: each roof face drawn to scale with its pathways and setbacks
// hatched and the modules in rows (with the same sentence the web page gives as its text
// alternative), then the full bill of materials with how each quantity was counted.
import { formatCents } from "@/lib/format";
import { sketchText, type FaceSketch, type PacketMaterials } from "@/lib/job-materials";
import { COLORS, CONTENT_WIDTH, MARGIN_X, SMALL_SIZE, type Flow } from "./layout";

/** Largest drawing height on a page, points. */
const SKETCH_MAX_H = 300;

const path = (p: { x: number; y: number }[], s: number, slopeM: number) => `M ${p.map((q) => `${(q.x * s).toFixed(2)} ${((slopeM - q.y) * s).toFixed(2)}`).join(" L ")} Z`;

function faceSketch(flow: Flow, f: FaceSketch): void {
  const l = f.layout;
  flow.ensure(60);
  flow.paragraph(f.name, { font: flow.fonts.sansBold });
  for (const n of f.notes) flow.paragraph(n, { color: COLORS.danger });
  if (!l) return;
  const scale = Math.min(CONTENT_WIDTH / l.eaveM, SKETCH_MAX_H / l.slopeM);
  const h = l.slopeM * scale;
  flow.ensure(h + 40);
  const page = flow.page;
  const top = flow.y - 4;
  // drawSvgPath draws y downwards from the given origin: the ridge at the top, the eave at the bottom.
  const origin = { x: MARGIN_X, y: top };
  page.drawSvgPath(path(l.outline, scale, l.slopeM), { ...origin, borderColor: COLORS.graphite, borderWidth: 1, color: COLORS.faint });
  for (const k of l.keepClear) page.drawSvgPath(path(k.polygon, scale, l.slopeM), { ...origin, color: COLORS.copper, opacity: 0.25, borderColor: COLORS.copper, borderWidth: 0.5 });
  for (const m of l.modules) {
    page.drawRectangle({ x: MARGIN_X + m.x * scale, y: top - (l.slopeM - m.y) * scale, width: m.w * scale, height: m.h * scale, color: COLORS.white, borderColor: COLORS.usage, borderWidth: 0.8 });
  }
  flow.y = top - h - 6;
  flow.paragraph(sketchText(f), { size: SMALL_SIZE, color: COLORS.muted });
}

/** Roof layout and bill of materials pages of the packet. */
export function materialsPages(flow: Flow, m: PacketMaterials): void {
  flow.newPage();
  flow.heading("Roof layout", 13);
  flow.paragraph(`Pathways and setbacks (hatched): ${m.fireCode.label}; ${m.fireCode.ridgeSetbackNote}.`, { size: SMALL_SIZE, color: COLORS.muted });
  for (const f of m.faces) faceSketch(flow, f);

  flow.ensure(120);
  flow.heading("Bill of materials", 13);
  const site = m.site;
  flow.paragraph(
    `Site: wind ${site.windMph ?? "not given"}${site.windMph ? " mph" : ""}, ground snow ${site.snowPsf ?? "not given"}${site.snowPsf !== null ? " psf" : ""}, home run ${site.homeRunM ?? "not measured"}${site.homeRunM ? " m" : ""}.`,
    { size: SMALL_SIZE, color: COLORS.muted },
  );
  for (const p of m.bom.problems) flow.paragraph(p, { color: COLORS.danger });
  flow.table(
    [
      { label: "Item", width: 110 },
      { label: "Make, model and rating", width: CONTENT_WIDTH - 260 },
      { label: "Qty", width: 70, align: "right", mono: true },
      { label: "Price", width: 80, align: "right", mono: true },
    ],
    m.bom.lines.map((l) => ({ cells: [l.item, l.detail, `${l.quantity}${l.unit === "m" ? " m" : ""}${l.spares > 0 ? ` (+${l.spares})` : ""}`, l.totalCents === null ? "—" : formatCents(l.totalCents)] })),
  );
  flow.paragraph(`Priced parts: ${formatCents(m.bom.totalCents)}${m.bom.unpriced > 0 ? ` (${m.bom.unpriced} lines without a price book line item)` : ""}. Quantities in brackets are spares, included.`, { size: SMALL_SIZE, color: COLORS.muted });
  flow.heading("How each quantity was counted", 11);
  for (const l of m.bom.lines) flow.paragraph(`${l.item}: ${l.basis}`, { size: SMALL_SIZE, color: COLORS.muted, gapAfter: 2 });
  flow.bullets(m.cautions, { size: SMALL_SIZE });
}
