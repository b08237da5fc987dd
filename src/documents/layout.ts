// Small drawing helpers shared by Kilowright's PDFs (the proposal, the signed copy's certificate,
// the crew's job packet): US Letter pages, our colour tokens for print, wrapped text, table rows,
// a top-to-bottom flow that starts a new page when the current one is full, and the footer on
// every page (company name, license number, "page N of M"), drawn once the page count is known.
import { deflateSync } from "node:zlib";
import {
  PDFContentStream,
  PDFName as PDFNameObject,
  PDFRawStream,
  beginText,
  endText,
  moveText,
  popGraphicsState,
  pushGraphicsState,
  rgb,
  setFillingRgbColor,
  setFontAndSize,
  showText,
  type PDFDocument,
  type PDFFont,
  type PDFName,
  type PDFOperator,
  type PDFPage,
  type RGB,
} from "pdf-lib";
import type { Locale } from "@/lib/i18n/locales";
import { translator } from "@/lib/i18n/translator";
import type { DocFonts } from "./fonts";

// ── Page geometry (PDF points, 72 per inch; origin at the bottom left) ───────────────────

/** US Letter, 8.5 × 11 in. */
export const PAGE_WIDTH = 612;
export const PAGE_HEIGHT = 792;
export const MARGIN_X = 54;
export const MARGIN_TOP = 60;
/** Room kept at the bottom for the footer. */
export const MARGIN_BOTTOM = 64;
export const CONTENT_WIDTH = PAGE_WIDTH - 2 * MARGIN_X;
/** The y where content starts under the running header. */
export const CONTENT_TOP = PAGE_HEIGHT - MARGIN_TOP;

// ── Colours for paper: white page, graphite text; the screen's paper tone is not printed ──

const hex = (h: string): RGB => rgb(parseInt(h.slice(1, 3), 16) / 255, parseInt(h.slice(3, 5), 16) / 255, parseInt(h.slice(5, 7), 16) / 255);

export const COLORS = {
  graphite: hex("#1F2933"),
  /** Secondary text (graphite lightened for print). */
  muted: hex("#5F6B76"),
  rule: hex("#D5D0C8"),
  faint: hex("#EFEBE4"),
  copper: hex("#B5542D"),
  sage: hex("#5B7F6B"),
  /** Usage data. */
  usage: hex("#3E5C76"),
  /** Production data. */
  production: hex("#B5542D"),
  danger: hex("#A23B2A"),
  white: rgb(1, 1, 1),
} as const;

export const TEXT_SIZE = 10;
export const SMALL_SIZE = 8;
export const LINE_GAP = 1.4;

// ── Text ─────────────────────────────────────────────────────────────────────────────────

/**
 * Breaks `text` into lines no wider than `maxWidth` at `size`: at spaces, at explicit newlines,
 * and inside a word only when the word alone is wider than the line (long e-mails, user agents).
 */
export function wrapText(text: string, font: PDFFont, size: number, maxWidth: number): string[] {
  const out: string[] = [];
  const width = (s: string) => font.widthOfTextAtSize(s, size);
  for (const paragraph of text.replace(/\r\n?/g, "\n").split("\n")) {
    const words = paragraph.split(/ +/).filter((w) => w.length > 0);
    if (words.length === 0) {
      out.push("");
      continue;
    }
    let line = "";
    for (let word of words) {
      const candidate = line ? `${line} ${word}` : word;
      if (width(candidate) <= maxWidth) {
        line = candidate;
        continue;
      }
      if (line) out.push(line);
      line = "";
      // A word wider than the line is cut where it fills the line.
      while (width(word) > maxWidth) {
        let cut = word.length - 1;
        while (cut > 1 && width(word.slice(0, cut)) > maxWidth) cut--;
        out.push(word.slice(0, cut));
        word = word.slice(cut);
      }
      line = word;
    }
    out.push(line);
  }
  return out;
}

export type TextStyle = { font: PDFFont; size?: number; color?: RGB };

// ── Text operators ───────────────────────────────────────────────────────────────────────
// page.drawText writes about ten operators per call (state save, text matrix with rotation and
// skew, line height…) and checks every option; a 17-page proposal draws over a thousand
// strings, so we write the few operators a plain horizontal line needs, and a table row's cells
// in one text object.

export type TextRun = { text: string; x: number; y: number; font: PDFFont; size: number; color: RGB };

const fontKeys = new WeakMap<PDFPage, Map<PDFFont, PDFName>>();

/** The page's resource name for `font` (added to the page's font dictionary once). */
function fontKey(page: PDFPage, font: PDFFont): PDFName {
  let keys = fontKeys.get(page);
  if (!keys) {
    keys = new Map();
    fontKeys.set(page, keys);
  }
  let key = keys.get(font);
  if (!key) {
    key = page.node.newFontDictionary(font.name, font.ref);
    keys.set(font, key);
  }
  return key;
}

const round2 = (v: number) => Math.round(v * 100) / 100;

/** Draws single-line runs in one text object (font and colour set only when they change). */
export function drawTextRuns(page: PDFPage, runs: readonly TextRun[]): void {
  const ops: PDFOperator[] = [pushGraphicsState(), beginText()];
  let font: PDFFont | null = null;
  let size = 0;
  let color: RGB | null = null;
  let px = 0;
  let py = 0;
  for (const r of runs) {
    if (!r.text) continue;
    if (r.font !== font || r.size !== size) {
      ops.push(setFontAndSize(fontKey(page, r.font), r.size));
      font = r.font;
      size = r.size;
    }
    if (!color || r.color.red !== color.red || r.color.green !== color.green || r.color.blue !== color.blue) {
      ops.push(setFillingRgbColor(r.color.red, r.color.green, r.color.blue));
      color = r.color;
    }
    // Td moves from the start of the previous line: relative steps.
    const x = round2(r.x);
    const y = round2(r.y);
    ops.push(moveText(round2(x - px), round2(y - py)), showText(r.font.encodeText(r.text)));
    px = x;
    py = y;
  }
  ops.push(endText(), popGraphicsState());
  page.pushOperators(...ops);
}

/** A run for `text` at `x`, `y`; `align` right or center measures it against `x` (right edge / middle). */
export function textRun(text: string, x: number, y: number, style: TextStyle & { align?: "left" | "right" | "center" }): TextRun {
  const size = style.size ?? TEXT_SIZE;
  const w = style.align && style.align !== "left" ? style.font.widthOfTextAtSize(text, size) : 0;
  const left = style.align === "right" ? x - w : style.align === "center" ? x - w / 2 : x;
  return { text, x: left, y, font: style.font, size, color: style.color ?? COLORS.graphite };
}

/** Draws one line; `align` right or center measures the text against `x` (right edge / middle). */
export function drawLine(page: PDFPage, text: string, x: number, y: number, style: TextStyle & { align?: "left" | "right" | "center" }): void {
  drawTextRuns(page, [textRun(text, x, y, style)]);
}

/** Draws wrapped text with its first baseline at `y`; returns the y below the last line. */
export function drawWrapped(page: PDFPage, text: string, x: number, y: number, width: number, style: TextStyle & { lineGap?: number }): number {
  const size = style.size ?? TEXT_SIZE;
  const lead = size * (style.lineGap ?? LINE_GAP);
  let cy = y;
  const runs: TextRun[] = [];
  for (const line of wrapText(text, style.font, size, width)) {
    runs.push({ text: line, x, y: cy, font: style.font, size, color: style.color ?? COLORS.graphite });
    cy -= lead;
  }
  drawTextRuns(page, runs);
  return cy;
}

// ── Tables ───────────────────────────────────────────────────────────────────────────────

export type TableColumn = {
  label: string;
  width: number;
  align?: "left" | "right";
  /** Figures use the mono font. */
  mono?: boolean;
};

export const ROW_HEIGHT = 16;

/** Draws a table's header row at `y` (top of the row); returns the y under it. */
export function drawTableHeader(page: PDFPage, columns: readonly TableColumn[], x: number, y: number, fonts: DocFonts): number {
  let cx = x;
  const runs: TextRun[] = [];
  for (const c of columns) {
    runs.push(textRun(c.label, c.align === "right" ? cx + c.width - 4 : cx + 4, y - 11, { font: fonts.sansBold, size: SMALL_SIZE + 0.5, color: COLORS.muted, align: c.align ?? "left" }));
    cx += c.width;
  }
  drawTextRuns(page, runs);
  const total = columns.reduce((s, c) => s + c.width, 0);
  page.drawLine({ start: { x, y: y - ROW_HEIGHT }, end: { x: x + total, y: y - ROW_HEIGHT }, thickness: 0.8, color: COLORS.graphite });
  return y - ROW_HEIGHT;
}

/** Draws one row of cells at `y` (top of the row); `bold` for totals; returns the y under it. */
export function drawTableRow(
  page: PDFPage,
  columns: readonly TableColumn[],
  cells: readonly string[],
  x: number,
  y: number,
  fonts: DocFonts,
  opts: { bold?: boolean; shade?: boolean; size?: number } = {},
): number {
  const size = opts.size ?? 9;
  const total = columns.reduce((s, c) => s + c.width, 0);
  if (opts.shade) page.drawRectangle({ x, y: y - ROW_HEIGHT, width: total, height: ROW_HEIGHT, color: COLORS.faint });
  let cx = x;
  const runs: TextRun[] = [];
  columns.forEach((c, i) => {
    const font = opts.bold ? fonts.sansBold : c.mono ? fonts.mono : fonts.sans;
    const text = fitText(cells[i] ?? "", font, size, c.width - 8);
    runs.push(textRun(text, c.align === "right" ? cx + c.width - 4 : cx + 4, y - 11.5, { font, size, align: c.align ?? "left" }));
    cx += c.width;
  });
  drawTextRuns(page, runs);
  page.drawLine({ start: { x, y: y - ROW_HEIGHT }, end: { x: x + total, y: y - ROW_HEIGHT }, thickness: 0.4, color: COLORS.rule });
  return y - ROW_HEIGHT;
}

/** Shortens `text` with an ellipsis until it fits `maxWidth`. */
export function fitText(text: string, font: PDFFont, size: number, maxWidth: number): string {
  if (font.widthOfTextAtSize(text, size) <= maxWidth) return text;
  let s = text;
  while (s.length > 1 && font.widthOfTextAtSize(`${s}…`, size) > maxWidth) s = s.slice(0, -1);
  return `${s}…`;
}

// ── Flow: content top to bottom, new pages as needed ─────────────────────────────────────

export type Flow = {
  readonly pdf: PDFDocument;
  readonly fonts: DocFonts;
  page: PDFPage;
  /** Current y (top of the next thing drawn). */
  y: number;
  /** Starts a new page and returns it. */
  newPage(): PDFPage;
  /** Makes sure `height` points fit above the footer; starts a new page if not. */
  ensure(height: number): void;
  /** Section title (copper rule above, semibold). */
  heading(text: string, size?: number): void;
  /** Wrapped paragraph. */
  paragraph(text: string, style?: Partial<TextStyle> & { gapAfter?: number; indent?: number }): void;
  /** Bulleted list. */
  bullets(items: readonly string[], style?: Partial<TextStyle>): void;
  /** Label / value pairs in two columns (value in mono when `mono`). */
  facts(rows: readonly { label: string; value: string; mono?: boolean }[], labelWidth?: number): void;
  /** A table, its header repeated on each new page. */
  table(columns: readonly TableColumn[], rows: readonly { cells: readonly string[]; bold?: boolean }[]): void;
  space(points: number): void;
};

/** Flow.paragraph: wrapped lines, a new page whenever the next line would reach the footer. */
function flowParagraph(flow: Flow, text: string, style: Partial<TextStyle> & { gapAfter?: number; indent?: number }): void {
  const font = style.font ?? flow.fonts.sans;
  const size = style.size ?? TEXT_SIZE;
  const indent = style.indent ?? 0;
  const lead = size * LINE_GAP;
  let runs: TextRun[] = [];
  for (const line of wrapText(text, font, size, CONTENT_WIDTH - indent)) {
    if (flow.y - lead < MARGIN_BOTTOM) {
      drawTextRuns(flow.page, runs);
      runs = [];
      flow.newPage();
    }
    flow.y -= size;
    runs.push({ text: line, x: MARGIN_X + indent, y: flow.y, font, size, color: style.color ?? COLORS.graphite });
    flow.y -= lead - size;
  }
  drawTextRuns(flow.page, runs);
  flow.y -= style.gapAfter ?? size * 0.6;
}

/** Flow.bullets: a copper dot before each item's first line, the rest indented under it. */
function flowBullets(flow: Flow, items: readonly string[], style: Partial<TextStyle>): void {
  const font = style.font ?? flow.fonts.sans;
  const size = style.size ?? TEXT_SIZE;
  const lead = size * LINE_GAP;
  for (const item of items) {
    wrapText(item, font, size, CONTENT_WIDTH - 14).forEach((line, i) => {
      flow.ensure(lead);
      flow.y -= size;
      if (i === 0) flow.page.drawCircle({ x: MARGIN_X + 4, y: flow.y + size * 0.33, size: 1.6, color: COLORS.copper });
      drawLine(flow.page, line, MARGIN_X + 14, flow.y, { font, size, color: style.color });
      flow.y -= lead - size;
    });
    flow.y -= size * 0.3;
  }
  flow.y -= size * 0.3;
}

/** Flow.facts: label / value pairs, each pair kept on one page. */
function flowFacts(flow: Flow, rows: readonly { label: string; value: string; mono?: boolean }[], labelWidth: number): void {
  const { fonts } = flow;
  const size = TEXT_SIZE;
  const lead = size * LINE_GAP;
  for (const r of rows) {
    const lines = wrapText(r.value, r.mono ? fonts.mono : fonts.sans, size, CONTENT_WIDTH - labelWidth);
    flow.ensure(lines.length * lead + 4);
    flow.y -= size;
    drawTextRuns(flow.page, [
      textRun(r.label, MARGIN_X, flow.y, { font: fonts.sans, size, color: COLORS.muted }),
      ...lines.map((line, i) => textRun(line, MARGIN_X + labelWidth, flow.y - i * lead, { font: r.mono ? fonts.mono : fonts.sans, size })),
    ]);
    flow.y -= (lines.length - 1) * lead + (lead - size) + 3;
  }
  flow.y -= 4;
}

/** Flow.table: shaded every other row, the header repeated on each new page. */
function flowTable(flow: Flow, columns: readonly TableColumn[], rows: readonly { cells: readonly string[]; bold?: boolean }[]): void {
  flow.ensure(ROW_HEIGHT * 3);
  flow.y = drawTableHeader(flow.page, columns, MARGIN_X, flow.y, flow.fonts);
  rows.forEach((r, i) => {
    if (flow.y - ROW_HEIGHT < MARGIN_BOTTOM) {
      flow.newPage();
      flow.y = drawTableHeader(flow.page, columns, MARGIN_X, flow.y, flow.fonts);
    }
    flow.y = drawTableRow(flow.page, columns, r.cells, MARGIN_X, flow.y, flow.fonts, { bold: r.bold, shade: i % 2 === 1 });
  });
  flow.y -= 12;
}

/** A flow of content over as many pages as it needs, starting on a new page. */
export function createFlow(pdf: PDFDocument, fonts: DocFonts): Flow {
  const flow: Flow = {
    pdf,
    fonts,
    page: null as unknown as PDFPage,
    y: CONTENT_TOP,
    newPage() {
      flow.page = pdf.addPage([PAGE_WIDTH, PAGE_HEIGHT]);
      flow.y = CONTENT_TOP;
      return flow.page;
    },
    ensure(height) {
      if (flow.y - height < MARGIN_BOTTOM) flow.newPage();
    },
    heading(text, size = 15) {
      flow.ensure(size * 2 + 40);
      if (flow.y < CONTENT_TOP) flow.y -= 10;
      flow.page.drawRectangle({ x: MARGIN_X, y: flow.y - 2, width: 28, height: 2.5, color: COLORS.copper });
      flow.y -= size + 8;
      drawLine(flow.page, text, MARGIN_X, flow.y, { font: fonts.sansBold, size });
      flow.y -= size * 0.9;
    },
    paragraph: (text, style = {}) => flowParagraph(flow, text, style),
    bullets: (items, style = {}) => flowBullets(flow, items, style),
    facts: (rows, labelWidth = 170) => flowFacts(flow, rows, labelWidth),
    table: (columns, rows) => flowTable(flow, columns, rows),
    space(points) {
      flow.y -= points;
    },
  };
  flow.newPage();
  return flow;
}

// ── The frame on every page ──────────────────────────────────────────────────────────────

export type FrameInfo = {
  companyName: string;
  licenseNumber: string | null;
  /** Short name of the document, e.g. "Proposal P-1042 v2", shown at the top of each page. */
  documentLabel: string;
};

/** "License no. X" or nothing when the company has not set one. */
export function licenseText(licenseNumber: string | null, locale: Locale = "en"): string {
  return licenseNumber ? translator(locale, "pdf.frame")("license", { number: licenseNumber }) : "";
}

/**
 * Draws the running header (company name, document label) and footer (company name, license
 * number, "page N of M") on every page of `pdf`. Call it after the last page is added.
 * `fromPage` (0-based) leaves earlier pages alone, e.g. when appending pages to a signed copy
 * whose pages already carry their frame; `pageLabel` replaces "page N of M".
 */
export function drawPageFrames(
  pdf: PDFDocument,
  fonts: DocFonts,
  info: FrameInfo,
  opts: { fromPage?: number; pageLabel?: (index: number, total: number) => string; locale?: Locale } = {},
): void {
  const pages = pdf.getPages();
  const total = pages.length;
  const fromPage = opts.fromPage ?? 0;
  const t = translator(opts.locale ?? "en", "pdf.frame");
  const pageLabel = opts.pageLabel ?? ((i: number, n: number) => t("pageOf", { n: i + 1, total: n }));
  pages.forEach((page, i) => {
    if (i < fromPage) return;
    const { width } = page.getSize();
    const headY = PAGE_HEIGHT - 34;
    drawTextRuns(page, [
      textRun(info.companyName, MARGIN_X, headY, { font: fonts.sansBold, size: 8.5, color: COLORS.graphite }),
      textRun(info.documentLabel, width - MARGIN_X, headY, { font: fonts.sans, size: 8.5, color: COLORS.muted, align: "right" }),
    ]);
    page.drawLine({ start: { x: MARGIN_X, y: headY - 7 }, end: { x: width - MARGIN_X, y: headY - 7 }, thickness: 0.5, color: COLORS.rule });

    const footY = 34;
    page.drawLine({ start: { x: MARGIN_X, y: footY + 12 }, end: { x: width - MARGIN_X, y: footY + 12 }, thickness: 0.5, color: COLORS.rule });
    const left = [info.companyName, licenseText(info.licenseNumber, opts.locale)].filter(Boolean).join("  ·  ");
    drawTextRuns(page, [
      textRun(left, MARGIN_X, footY, { font: fonts.sans, size: SMALL_SIZE, color: COLORS.muted }),
      textRun(pageLabel(i, total), width - MARGIN_X, footY, { font: fonts.mono, size: SMALL_SIZE, color: COLORS.muted, align: "right" }),
    ]);
  });
}

// ── Deterministic metadata ───────────────────────────────────────────────────────────────

export const PDF_PRODUCER = "Kilowright documents (pdf-lib)";
export const PDF_CREATOR = "Kilowright";

/** Sets the info dictionary to fixed values so the same input saves to the same bytes. */
export function setFixedMetadata(pdf: PDFDocument, m: { title: string; subject?: string; author: string; date: Date }): void {
  pdf.setTitle(m.title);
  if (m.subject) pdf.setSubject(m.subject);
  pdf.setAuthor(m.author);
  pdf.setProducer(PDF_PRODUCER);
  pdf.setCreator(PDF_CREATOR);
  pdf.setCreationDate(m.date);
  pdf.setModificationDate(m.date);
}

/**
 * Compresses every page content stream with Node's zlib instead of pdf-lib's JavaScript deflate
 * (about half of a proposal's render time). Call it right before `save`: pages drawn on after
 * it would write to the replaced streams. zlib's output is fixed for a given zlib version, so
 * the bytes stay deterministic on one installation.
 */
export function compressContentStreams(pdf: PDFDocument): void {
  const filter = PDFNameObject.of("Filter");
  const length = PDFNameObject.of("Length");
  for (const [ref, obj] of pdf.context.enumerateIndirectObjects()) {
    if (!(obj instanceof PDFContentStream)) continue;
    const dict = pdf.context.obj({});
    for (const [k, v] of obj.dict.entries()) if (k !== filter && k !== length) dict.set(k, v);
    dict.set(filter, PDFNameObject.of("FlateDecode"));
    pdf.context.assign(ref, PDFRawStream.of(dict, deflateSync(obj.getUnencodedContents())));
  }
}

/** Save options shared by every document: no object streams, no form appearances, metadata as set. */
export const SAVE_OPTIONS = { useObjectStreams: false, updateFieldAppearances: false } as const;
