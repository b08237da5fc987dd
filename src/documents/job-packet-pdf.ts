// The crew's job packet as a PDF (pdf-lib, Plex fonts embedded as TrueType subsets): customer and site,
// schedule and permits, the system with its roof faces and bill of materials, the string plan
// with each NEC check and its numbers, the cautions, the office's notes, the install checklist
// as tick boxes (ticked ones dated) and the photos. Same input, same bytes.
import { PDFDocument, type PDFImage } from "pdf-lib";
import { formatCalendarDate, formatDateTime } from "@/lib/format";
import { visitLines, type JobPacket } from "@/lib/job-packet";
import { embedFonts } from "./fonts";
import { materialsPages } from "./packet-materials-pdf";
import { electricalSection } from "./packet-electrical-pdf";
import {
  COLORS,
  CONTENT_WIDTH,
  LINE_GAP,
  MARGIN_BOTTOM,
  MARGIN_X,
  ROW_HEIGHT,
  SAVE_OPTIONS,
  SMALL_SIZE,
  TEXT_SIZE,
  compressContentStreams,
  createFlow,
  drawLine,
  drawPageFrames,
  setFixedMetadata,
  wrapText,
  type Flow,
} from "./layout";

export type JobPacketPdfPhoto = { caption: string; mimeType: "image/jpeg" | "image/png"; bytes: Uint8Array };
export type JobPacketPdfInput = {
  packet: Pick<JobPacket, "job" | "company" | "customer" | "site" | "source" | "faces" | "system" | "bom" | "materials" | "stringPlan" | "cautions" | "crewName"> & Partial<Pick<JobPacket, "electrical">>;
  /** Photos to print (job photos first, then the rep's site photos), already read from storage. */
  photos: JobPacketPdfPhoto[];
  /** When the packet was printed: the document's date (fixed metadata). */
  printedAt: Date;
  /** The company's time zone: times printed (printed, installed, checklist done) are on its clock. */
  timeZone: string;
  /** Where people can read the job online. */
  jobUrl: string;
};

/** Keeps a heading with the first rows of what follows it (a heading never ends a page alone). */
function keepHeadingWith(flow: Flow, rows: number): void {
  flow.ensure(60 + ROW_HEIGHT * (Math.min(rows, 4) + 1));
}

const longDate = (iso: string | null) => (iso ? formatCalendarDate(iso, "weekday-date") : "not set");

/** Compass point of an azimuth (degrees clockwise from north). */
function compass(azimuthDeg: number): string {
  const points = ["N", "NE", "E", "SE", "S", "SW", "W", "NW"];
  return points[Math.round((((azimuthDeg % 360) + 360) % 360) / 45) % 8];
}

function contactAndSite(flow: Flow, input: JobPacketPdfInput): void {
  const { packet } = input;
  const { customer, site, job } = packet;
  flow.heading(`Job packet: ${customer.name}`, 18);
  flow.paragraph(`Printed ${formatDateTime(input.printedAt, input.timeZone)}. The current packet, with photos and the checklist, is at ${input.jobUrl}`, { size: SMALL_SIZE, color: COLORS.muted });
  flow.heading("Customer and site", 13);
  flow.facts([
    { label: "Contact", value: customer.contactName ?? customer.name },
    ...(customer.phone ? [{ label: "Phone", value: customer.phone, mono: true }] : []),
    ...(customer.email ? [{ label: "E-mail", value: customer.email }] : []),
    ...(customer.secondContactName ? [{ label: "Second contact", value: [customer.secondContactName, customer.secondContactPhone].filter(Boolean).join(", ") }] : []),
    { label: "Address", value: `${site.street}, ${site.city}, ${site.region} ${site.postalCode}` },
    { label: "Coordinates", value: `${site.latitude.toFixed(5)}, ${site.longitude.toFixed(5)}`, mono: true },
    ...(site.utilityName ? [{ label: "Utility", value: site.utilityName }] : []),
  ]);
  flow.heading("Schedule and permits", 13);
  flow.facts([
    { label: "Crew", value: packet.crewName ?? "not assigned" },
    ...visitLines(job, longDate).map(({ label, text }) =>
      label === "Install" && job.installedAt ? { label, value: `${text} (installed ${formatDateTime(job.installedAt, input.timeZone)})` } : { label, value: text },
    ),
    {
      label: "Permit (AHJ)",
      value: [job.permitNumber ?? "no number yet", job.permitSubmittedOn ? `submitted ${longDate(job.permitSubmittedOn)}` : null, job.permitApprovedOn ? `approved ${longDate(job.permitApprovedOn)}` : null]
        .filter(Boolean)
        .join(", "),
    },
    {
      label: "Interconnection",
      value: [
        job.interconnectionNumber ?? "no number yet",
        job.interconnectionSubmittedOn ? `submitted ${longDate(job.interconnectionSubmittedOn)}` : null,
        job.interconnectionApprovedOn ? `approved ${longDate(job.interconnectionApprovedOn)}` : null,
      ]
        .filter(Boolean)
        .join(", "),
    },
  ]);
  if (job.notes) {
    flow.heading("Notes from the office", 13);
    flow.paragraph(job.notes);
  }
}

function system(flow: Flow, input: JobPacketPdfInput): void {
  const { packet } = input;
  keepHeadingWith(flow, 4);
  flow.heading("System", 13);
  flow.paragraph(packet.source.label, { size: SMALL_SIZE, color: COLORS.muted });
  if (!packet.system) {
    flow.paragraph("No equipment on record yet: the deal has neither a signed proposal nor a saved design.");
    return;
  }
  const s = packet.system;
  flow.facts([
    { label: "Modules", value: String(s.moduleCount), mono: true },
    { label: "Size", value: `${s.kwDc.toFixed(2)} kW DC${s.kwAc !== null ? ` / ${s.kwAc.toFixed(2)} kW AC` : ""}`, mono: true },
  ]);
  if (packet.faces.length > 0) {
    flow.table(
      [
        { label: "Roof face", width: 220 },
        { label: "Tilt", width: 80, align: "right", mono: true },
        { label: "Azimuth", width: 110, align: "right", mono: true },
        { label: "Modules", width: CONTENT_WIDTH - 410, align: "right", mono: true },
      ],
      packet.faces.map((f) => ({ cells: [f.name, `${f.tiltDeg}°`, `${f.azimuthDeg}° ${compass(f.azimuthDeg)}`, String(f.moduleCount)] })),
    );
  }
  // The full bill of materials prints on the materials pages when there is one.
  if (packet.bom.length > 0 && !packet.materials) {
    keepHeadingWith(flow, packet.bom.length);
    flow.heading("Bill of materials", 13);
    flow.table(
      [
        { label: "Item", width: 120 },
        { label: "Make, model and rating", width: CONTENT_WIDTH - 200 },
        { label: "Qty", width: 80, align: "right", mono: true },
      ],
      packet.bom.map((b) => ({ cells: [b.item, b.detail, `${b.quantity} ${b.unit}`] })),
    );
  }
}

function strings(flow: Flow, input: JobPacketPdfInput): void {
  const { packet } = input;
  const { fonts } = flow;
  keepHeadingWith(flow, 4);
  flow.heading("String plan and code checks", 13);
  const plan = packet.stringPlan;
  if (!plan) {
    flow.paragraph(packet.system ? "Microinverters, or no string plan saved on the design: no series strings to check." : "No design yet.");
  } else {
    flow.paragraph(`Strings: ${plan.stringSizes.join(" + ")} modules. Design temperatures: lowest ${plan.lowestTempC} °C, highest ${plan.highestTempC} °C.`);
    for (const p of [...plan.check.problems, ...plan.notes]) flow.paragraph(p, { color: COLORS.danger });
    for (const { modulesInSeries, strings: count, result } of plan.check.results) {
      flow.paragraph(`${count} × ${modulesInSeries} in series: ${result.status.toUpperCase()}`, { font: fonts.sansBold });
      flow.table(
        [
          { label: "Check", width: 230 },
          { label: "Value", width: 85, align: "right", mono: true },
          { label: "Limit", width: 85, align: "right", mono: true },
          { label: "Result", width: CONTENT_WIDTH - 400, align: "right" },
        ],
        result.checks.map((c) => ({ cells: [c.rule, `${c.value} ${c.unit}`, c.limit === null ? "—" : `${c.limit} ${c.unit}`, c.status.toUpperCase()] })),
      );
      for (const c of result.checks) flow.paragraph(`${c.rule}: ${c.detail}`, { size: SMALL_SIZE, color: COLORS.muted, gapAfter: 2 });
      for (const n of result.notes) flow.paragraph(n, { size: SMALL_SIZE, color: COLORS.muted, gapAfter: 2 });
      flow.space(6);
    }
  }
  flow.heading("Cautions", 13);
  flow.bullets(packet.cautions);
}

function checklist(flow: Flow, input: JobPacketPdfInput): void {
  const { fonts } = flow;
  const items = input.packet.job.checklist;
  keepHeadingWith(flow, 3);
  flow.heading("Install checklist", 13);
  if (items.length === 0) {
    flow.paragraph("This job has no checklist.");
    return;
  }
  const size = TEXT_SIZE;
  const lead = size * LINE_GAP;
  const box = 9;
  for (const item of items) {
    const lines = wrapText(item.label, fonts.sans, size, CONTENT_WIDTH - 150);
    flow.ensure(lines.length * lead + 8);
    flow.y -= size + 2;
    const page = flow.page;
    page.drawRectangle({ x: MARGIN_X, y: flow.y - 1, width: box, height: box, borderColor: COLORS.graphite, borderWidth: 0.8 });
    if (item.doneAt) {
      // A tick drawn as two strokes (no glyph needed).
      page.drawLine({ start: { x: MARGIN_X + 1.8, y: flow.y + 3.5 }, end: { x: MARGIN_X + 3.8, y: flow.y + 1 }, thickness: 1.2, color: COLORS.sage });
      page.drawLine({ start: { x: MARGIN_X + 3.8, y: flow.y + 1 }, end: { x: MARGIN_X + 7.6, y: flow.y + 7 }, thickness: 1.2, color: COLORS.sage });
    }
    lines.forEach((line, i) => drawLine(page, line, MARGIN_X + box + 8, flow.y - i * lead, { font: fonts.sans, size }));
    if (item.doneAt) drawLine(page, `done ${formatDateTime(new Date(item.doneAt), input.timeZone)}`, MARGIN_X + CONTENT_WIDTH, flow.y, { font: fonts.mono, size: SMALL_SIZE, color: COLORS.muted, align: "right" });
    flow.y -= (lines.length - 1) * lead + (lead - size) + 4;
  }
  flow.space(6);
}

async function photos(flow: Flow, input: JobPacketPdfInput): Promise<void> {
  if (input.photos.length === 0) return;
  const gap = 12;
  const cellWidth = (CONTENT_WIDTH - gap) / 2;
  const maxHeight = 190;
  flow.ensure(60 + maxHeight + 20);
  flow.heading("Photos", 13);
  let column = 0;
  let rowHeight = 0;
  for (const p of input.photos) {
    let image: PDFImage;
    try {
      image = p.mimeType === "image/png" ? await flow.pdf.embedPng(p.bytes) : await flow.pdf.embedJpg(p.bytes);
    } catch {
      continue; // an unreadable stored file is left out rather than failing the packet
    }
    const scale = Math.min(cellWidth / image.width, maxHeight / image.height);
    const w = image.width * scale;
    const h = image.height * scale;
    const captionHeight = p.caption ? SMALL_SIZE * LINE_GAP + 2 : 0;
    if (column === 0) {
      if (flow.y - (maxHeight + captionHeight + 8) < MARGIN_BOTTOM) flow.newPage();
      rowHeight = 0;
    }
    const x = MARGIN_X + column * (cellWidth + gap);
    flow.page.drawImage(image, { x, y: flow.y - h, width: w, height: h });
    if (p.caption) drawLine(flow.page, p.caption, x, flow.y - h - SMALL_SIZE - 2, { font: flow.fonts.sans, size: SMALL_SIZE, color: COLORS.muted });
    rowHeight = Math.max(rowHeight, h + captionHeight + 10);
    column = (column + 1) % 2;
    if (column === 0) flow.y -= rowHeight;
  }
  if (column === 1) flow.y -= rowHeight;
}

/** Renders the job packet PDF. */
export async function renderJobPacketPdf(input: JobPacketPdfInput): Promise<Uint8Array> {
  const pdf = await PDFDocument.create({ updateMetadata: false });
  const fonts = await embedFonts(pdf);
  const flow = createFlow(pdf, fonts);
  contactAndSite(flow, input);
  system(flow, input);
  strings(flow, input);
  if (input.packet.materials) materialsPages(flow, input.packet.materials);
  electricalSection(flow, input.packet.electrical ?? null);
  checklist(flow, input);
  await photos(flow, input);

  const { packet } = input;
  drawPageFrames(pdf, fonts, { companyName: packet.company.name, licenseNumber: packet.company.licenseNumber, documentLabel: `Job packet · ${packet.customer.name}` });
  setFixedMetadata(pdf, {
    title: `Job packet for ${packet.customer.name}`,
    subject: `${packet.site.street}, ${packet.site.city}`,
    author: packet.company.name,
    date: input.printedAt,
  });
  pdf.setLanguage("en-US");
  compressContentStreams(pdf);
  return pdf.save(SAVE_OPTIONS);
}
