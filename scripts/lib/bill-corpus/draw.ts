// Drawing helpers for the invented bills of the test corpus (pdf-lib, standard fonts): text,
// right-aligned figures, tables, months across and bar charts, placed the way printed bills are.
import { PDFDocument, rgb, StandardFonts, type PDFFont, type PDFPage } from "pdf-lib";

export type Fonts = { regular: PDFFont; bold: PDFFont };
export type Pen = {
  page: PDFPage;
  fonts: Fonts;
  /** Text at x (left) and y (baseline). */
  text: (x: number, y: number, s: string, size?: number, bold?: boolean) => void;
  /** Text ending at x. */
  right: (x: number, y: number, s: string, size?: number, bold?: boolean) => void;
  box: (x: number, y: number, w: number, h: number, grey?: number) => void;
};

export function pen(page: PDFPage, fonts: Fonts): Pen {
  const font = (bold?: boolean) => (bold ? fonts.bold : fonts.regular);
  return {
    page,
    fonts,
    text: (x, y, s, size = 9, bold) => page.drawText(s, { x, y, size, font: font(bold) }),
    right: (x, y, s, size = 9, bold) =>
      page.drawText(s, {
        x: x - font(bold).widthOfTextAtSize(s, size),
        y,
        size,
        font: font(bold),
      }),
    box: (x, y, w, h, grey = 0.85) =>
      page.drawRectangle({
        x,
        y,
        width: w,
        height: h,
        color: rgb(grey, grey, grey),
      }),
  };
}

export async function newDoc(): Promise<{
  doc: PDFDocument;
  fonts: Fonts;
  page: () => Pen;
}> {
  const doc = await PDFDocument.create();
  // Fixed dates: the same bill makes the same bytes.
  doc.setCreationDate(new Date("2026-01-01T00:00:00Z"));
  doc.setModificationDate(new Date("2026-01-01T00:00:00Z"));
  doc.setProducer("Kilowright bill corpus");
  const fonts = {
    regular: await doc.embedFont(StandardFonts.Helvetica),
    bold: await doc.embedFont(StandardFonts.HelveticaBold),
  };
  return { doc, fonts, page: () => pen(doc.addPage([612, 792]), fonts) };
}

/** Columns at the given x (left edges; a negative x means right-aligned at -x). */
export function table(p: Pen, y: number, xs: number[], header: string[], rows: string[][], opts: { size?: number; step?: number; boldHeader?: boolean } = {}): number {
  const size = opts.size ?? 9;
  const step = opts.step ?? size + 5;
  const put = (x: number, yy: number, s: string, bold?: boolean) => (x < 0 ? p.right(-x, yy, s, size, bold) : p.text(x, yy, s, size, bold));
  header.forEach((h, i) => put(xs[i], y, h, opts.boldHeader ?? true));
  rows.forEach((r, k) => r.forEach((s, i) => put(xs[i], y - (k + 1) * step, s)));
  return y - (rows.length + 1) * step;
}

/** Months across: a row of labels and labelled rows of figures under them. */
export function across(p: Pen, x0: number, y: number, colW: number, labels: string[], rows: [string, string[]][], size = 8): number {
  labels.forEach((l, i) => p.right(x0 + (i + 1) * colW, y, l, size, true));
  rows.forEach(([label, values], k) => {
    p.text(x0 - 62, y - (k + 1) * (size + 5), label, size, true);
    values.forEach((v, i) => p.right(x0 + (i + 1) * colW, y - (k + 1) * (size + 5), v, size));
  });
  return y - (rows.length + 1) * (size + 5);
}

/** A bar chart: bars from a baseline, the value above each bar, the month under it, axis ticks on the left. */
export function bars(
  p: Pen,
  x0: number,
  y0: number,
  labels: string[],
  values: number[],
  opts: {
    barW?: number;
    gap?: number;
    height?: number;
    ticks?: number[];
    unit?: string;
  } = {},
) {
  const barW = opts.barW ?? 22;
  const gap = opts.gap ?? 10;
  const height = opts.height ?? 110;
  const max = Math.max(...values, ...(opts.ticks ?? []));
  for (const t of opts.ticks ?? []) p.right(x0 - 6, y0 + (t / max) * height - 3, t.toLocaleString("en-US"), 6);
  values.forEach((v, i) => {
    const x = x0 + i * (barW + gap);
    const h = (v / max) * height;
    p.box(x, y0, barW, h, 0.6 + (i % 2) * 0.1);
    const s = v.toLocaleString("en-US") + (opts.unit ?? "");
    p.text(x + barW / 2 - p.fonts.regular.widthOfTextAtSize(s, 6.5) / 2, y0 + h + 3, s, 6.5);
    p.text(x + barW / 2 - p.fonts.regular.widthOfTextAtSize(labels[i], 7) / 2, y0 - 10, labels[i], 7);
  });
}

// ── Months and figures ───────────────────────────────────────────────────────────────────────

export const MON = ["Jan", "Feb", "Mar", "Apr", "May", "Jun", "Jul", "Aug", "Sep", "Oct", "Nov", "Dec"];
export const MONTH = ["January", "February", "March", "April", "May", "June", "July", "August", "September", "October", "November", "December"];

/** n months ending with `last` (YYYY-MM), oldest first. */
export function monthsEnding(last: string, n: number): string[] {
  const [y, m] = [Number(last.slice(0, 4)), Number(last.slice(5, 7)) - 1];
  return Array.from({ length: n }, (_, i) => {
    const t = new Date(Date.UTC(y, m - (n - 1 - i), 1));
    return `${t.getUTCFullYear()}-${String(t.getUTCMonth() + 1).padStart(2, "0")}`;
  });
}

/** A household's seasonal use: winter and summer peaks, a little noise from the seed. */
export function seasonalKwh(months: string[], base: number, seed: number): number[] {
  let s = seed;
  const rand = () => (s = (s * 1103515245 + 12345) % 2147483648) / 2147483648;
  return months.map((ym) => {
    const m = Number(ym.slice(5, 7)) - 1;
    const season = 1 + 0.35 * Math.cos(((m - 0.5) / 12) * 2 * Math.PI) ** 2 + 0.25 * Math.max(0, Math.cos(((m - 7) / 12) * 2 * Math.PI));
    return Math.round(base * season * (0.92 + rand() * 0.16));
  });
}

export const fmt = (n: number) => n.toLocaleString("en-US");
export const usd = (cents: number) => `$${(cents / 100).toLocaleString("en-US", { minimumFractionDigits: 2, maximumFractionDigits: 2 })}`;
export const mon = (ym: string) => MON[Number(ym.slice(5, 7)) - 1];
export const yy = (ym: string) => ym.slice(2, 4);
