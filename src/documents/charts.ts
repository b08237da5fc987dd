// Charts drawn as PDF vectors (rectangles and lines, text labels in the embedded fonts), so they
// print sharp and their labels stay selectable: monthly usage against production, and the
// cumulative cash flow over the years.
import type { PDFPage, RGB } from "pdf-lib";
import type { DocFonts } from "./fonts";
import { COLORS, drawLine } from "./layout";

export type Box = { x: number; y: number; width: number; height: number };

/** The charts' words in the document's language (the proposal PDF passes them from its catalog). */
export type ChartLabels = { usage: string; production: string; year: string; months: string[]; paybackAt: (years: string) => string; notPaidBack: string; paidBack: string };

/** A round step (1, 2, 2.5 or 5 × 10ⁿ) giving about `targetTicks` ticks over `span`. */
export function niceStep(span: number, targetTicks = 5): number {
  if (!(span > 0)) return 1;
  const raw = span / targetTicks;
  const mag = 10 ** Math.floor(Math.log10(raw));
  const norm = raw / mag;
  const step = norm <= 1 ? 1 : norm <= 2 ? 2 : norm <= 2.5 ? 2.5 : norm <= 5 ? 5 : 10;
  return step * mag;
}

const thousands = new Intl.NumberFormat("en-US", { maximumFractionDigits: 0 });

function legend(page: PDFPage, items: { label: string; color: RGB }[], x: number, y: number, fonts: DocFonts): void {
  let cx = x;
  for (const it of items) {
    page.drawRectangle({ x: cx, y: y - 1, width: 9, height: 9, color: it.color });
    drawLine(page, it.label, cx + 13, y, { font: fonts.sans, size: 8.5 });
    cx += 13 + fonts.sans.widthOfTextAtSize(it.label, 8.5) + 18;
  }
}

/**
 * Grouped monthly bars: usage (slate blue) beside production (copper), kWh on the y axis with
 * round ticks, month names below, a legend above.
 */
export function drawUsageProductionChart(page: PDFPage, box: Box, data: { usageKwh: readonly number[]; productionKwh: readonly number[] }, fonts: DocFonts, labels: ChartLabels): void {
  const axisLeft = 44;
  const plot = { x: box.x + axisLeft, y: box.y + 18, width: box.width - axisLeft - 4, height: box.height - 18 - 22 };
  const max = Math.max(1, ...data.usageKwh, ...data.productionKwh);
  const step = niceStep(max, 5);
  const top = Math.ceil(max / step) * step;
  const yOf = (v: number) => plot.y + (v / top) * plot.height;

  for (let v = 0; v <= top + step / 2; v += step) {
    const y = yOf(v);
    page.drawLine({ start: { x: plot.x, y }, end: { x: plot.x + plot.width, y }, thickness: v === 0 ? 0.8 : 0.35, color: v === 0 ? COLORS.graphite : COLORS.rule });
    drawLine(page, thousands.format(v), plot.x - 5, y - 3, { font: fonts.mono, size: 7.5, color: COLORS.muted, align: "right" });
  }
  drawLine(page, "kWh", box.x, plot.y + plot.height + 8, { font: fonts.sans, size: 7.5, color: COLORS.muted });

  const slot = plot.width / 12;
  const barW = Math.min(14, slot * 0.34);
  for (let m = 0; m < 12; m++) {
    const cx = plot.x + slot * m + slot / 2;
    const u = data.usageKwh[m] ?? 0;
    const p = data.productionKwh[m] ?? 0;
    if (u > 0) page.drawRectangle({ x: cx - barW - 1, y: plot.y, width: barW, height: yOf(u) - plot.y, color: COLORS.usage });
    if (p > 0) page.drawRectangle({ x: cx + 1, y: plot.y, width: barW, height: yOf(p) - plot.y, color: COLORS.production });
    drawLine(page, labels.months[m], cx, plot.y - 11, { font: fonts.sans, size: 7.5, color: COLORS.muted, align: "center" });
  }
  legend(
    page,
    [
      { label: labels.usage, color: COLORS.usage },
      { label: labels.production, color: COLORS.production },
    ],
    plot.x,
    box.y + box.height - 9,
    fonts,
  );
}

/**
 * Cumulative cash flow by year (0 = signing … N): a bar per year below or above the zero line
 * (graphite while the system has not paid for itself, sage after), dollars on the y axis, a
 * marker at the payback year when there is one.
 */
export function drawCashflowChart(page: PDFPage, box: Box, data: { cumulativeCents: readonly number[]; paybackYears: number | null }, fonts: DocFonts, labels: ChartLabels): void {
  const axisLeft = 54;
  const plot = { x: box.x + axisLeft, y: box.y + 18, width: box.width - axisLeft - 4, height: box.height - 18 - 22 };
  const dollars = data.cumulativeCents.map((c) => c / 100);
  const lo = Math.min(0, ...dollars);
  const hi = Math.max(0, ...dollars);
  const step = niceStep(hi - lo || 1, 5);
  const bottom = Math.floor(lo / step) * step;
  const top = Math.max(step, Math.ceil(hi / step) * step);
  const yOf = (v: number) => plot.y + ((v - bottom) / (top - bottom)) * plot.height;

  for (let v = bottom; v <= top + step / 2; v += step) {
    const y = yOf(v);
    const zero = Math.abs(v) < step / 1000;
    page.drawLine({ start: { x: plot.x, y }, end: { x: plot.x + plot.width, y }, thickness: zero ? 0.8 : 0.35, color: zero ? COLORS.graphite : COLORS.rule });
    const label = `${v < 0 ? "−" : ""}$${thousands.format(Math.abs(v))}`;
    drawLine(page, label, plot.x - 5, y - 3, { font: fonts.mono, size: 7.5, color: COLORS.muted, align: "right" });
  }

  const n = dollars.length;
  const slot = plot.width / Math.max(1, n);
  const barW = Math.max(2, slot * 0.62);
  const y0 = yOf(0);
  dollars.forEach((v, i) => {
    const x = plot.x + slot * i + (slot - barW) / 2;
    const y = yOf(v);
    const h = Math.abs(y - y0);
    if (h > 0.01) page.drawRectangle({ x, y: Math.min(y, y0), width: barW, height: h, color: v < 0 ? COLORS.graphite : COLORS.sage });
    if (i % 5 === 0 || i === n - 1) drawLine(page, String(i), x + barW / 2, plot.y - 11, { font: fonts.mono, size: 7.5, color: COLORS.muted, align: "center" });
  });
  drawLine(page, labels.year, plot.x + plot.width, plot.y - 11 - 9, { font: fonts.sans, size: 7, color: COLORS.muted, align: "right" });

  if (data.paybackYears !== null && data.paybackYears <= n - 1) {
    // Bar i stands for the end of year i; payback at fractional year t falls between bars.
    const px = plot.x + slot * data.paybackYears + slot / 2;
    page.drawLine({ start: { x: px, y: plot.y }, end: { x: px, y: plot.y + plot.height }, thickness: 1, color: COLORS.copper, dashArray: [3, 2] });
    const label = labels.paybackAt(data.paybackYears.toFixed(1));
    const right = px > plot.x + plot.width * 0.7;
    drawLine(page, label, right ? px - 4 : px + 4, plot.y + plot.height - 8, { font: fonts.sans, size: 7.5, color: COLORS.copper, align: right ? "right" : "left" });
  }
  legend(
    page,
    [
      { label: labels.notPaidBack, color: COLORS.graphite },
      { label: labels.paidBack, color: COLORS.sage },
    ],
    plot.x,
    box.y + box.height - 9,
    fonts,
  );
}
