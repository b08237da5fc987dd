// The job packet's electrical pages: each circuit with its conductor, raceway, device and drop,
// the interconnection, the checks that did not pass, the labels to fit, the "checked by" line
// and the caution; then the single-line diagram on its own tabloid page.
import type { PacketElectrical } from "@/lib/job-packet";
import { MATERIAL_NAME, sizeLabel } from "@/engine/electrical/nec-tables";
import { ELECTRICAL_CAUTION } from "@/lib/electrical-design";
import { COLORS, SMALL_SIZE, type Flow } from "./layout";
import { drawSingleLinePage } from "./single-line-pdf";

export function electricalSection(flow: Flow, e: PacketElectrical | null): void {
  flow.ensure(140);
  flow.heading("Electrical design", 13);
  if (!e) {
    flow.paragraph("No design to wire yet.");
    return;
  }
  const d = e.design;
  flow.paragraph(`NEC ${d.edition}. Result: ${d.status.toUpperCase()}${d.missing.length ? ` — missing ${d.missing.join(", ")}` : ""}. The single-line diagram follows on a tabloid page.`, { font: flow.fonts.sansBold });
  for (const c of d.circuits) {
    flow.paragraph(c.name, { font: flow.fonts.sansBold, gapAfter: 1 });
    const wire = c.size ? `${c.currentCarrying} × ${sizeLabel(c.size)} ${MATERIAL_NAME[c.material]}${c.egcSize ? ` + ${sizeLabel(c.egcSize)} EGC` : ""}` : "no conductor fits";
    flow.paragraph(
      `${wire}; ${c.conduit?.trade ? `${c.conduit.trade} in. EMT` : "raceway —"}; ${c.lengthFt} ft; max ${c.maxCurrentA} A; OCPD ${c.ocpdA ? `${c.ocpdA} A` : "none"}; voltage drop ${c.voltageDropPct ?? "—"} %`,
      { size: SMALL_SIZE, indent: 10 },
    );
  }
  if (d.interconnection) {
    flow.paragraph(`Interconnection: ${d.interconnection.method}, ${d.interconnection.status.toUpperCase()}. ${d.interconnection.checks[0]?.detail ?? ""}`);
    for (const w of d.interconnection.whenItFails) flow.paragraph(`• ${w}`, { size: SMALL_SIZE });
  }
  const open = d.checks.filter((c) => c.status !== "pass");
  for (const c of open) flow.paragraph(`${c.status.toUpperCase()}: ${c.detail} (${c.rule})`, { color: c.status === "fail" ? COLORS.danger : COLORS.graphite, size: SMALL_SIZE });
  flow.heading("Labels to fit", 11);
  flow.bullets(d.labels.map((l) => `${l.section} — ${l.where}: ${l.wording}`), { size: SMALL_SIZE });
  flow.paragraph(d.rapidShutdownInitiator, { size: SMALL_SIZE });
  flow.space(10);
  flow.paragraph(`Checked by: ${e.checkedBy ?? "______________________________"} (the company's designer)      Signature: ______________________      Date: ____________`, { font: flow.fonts.sansBold });
  flow.paragraph(ELECTRICAL_CAUTION, { size: SMALL_SIZE, color: COLORS.muted });
  drawSingleLinePage(flow.pdf, flow.fonts, e.drawing);
  flow.newPage();
}
