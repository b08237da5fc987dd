// The single-line diagram as a vector page of the job packet: tabloid (11 × 17 in.) landscape,
// the same shapes the web draws (src/lib/single-line-diagram.ts), scaled to fit between the
// running header and footer. Lines, boxes and text stay vectors, so the page prints clearly at
// tabloid or A3 and zooms without blur.
import type { PDFDocument } from "pdf-lib";
import type { Drawing } from "@/lib/single-line-diagram";
import type { DocFonts } from "./fonts";
import { COLORS, MARGIN_X, drawTextRuns, textRun, type TextRun } from "./layout";

/** Tabloid landscape, points (17 × 11 in.; ANSI B). */
export const TABLOID_LANDSCAPE: [number, number] = [1224, 792];
const TOP = 60;
const BOTTOM = 58;

export function drawSingleLinePage(pdf: PDFDocument, fonts: DocFonts, drawing: Drawing): void {
  const [pw, ph] = TABLOID_LANDSCAPE;
  const page = pdf.addPage(TABLOID_LANDSCAPE);
  const s = Math.min((pw - 2 * MARGIN_X) / drawing.width, (ph - TOP - BOTTOM) / drawing.height);
  const X = (x: number) => MARGIN_X + x * s;
  const Y = (y: number) => ph - TOP - y * s;
  const runs: TextRun[] = [];
  for (const sh of drawing.shapes) {
    const thickness = "heavy" in sh && sh.heavy ? 1.8 : 0.9;
    const dash = "dash" in sh && sh.dash ? [5, 4] : undefined;
    if (sh.k === "rect") page.drawRectangle({ x: X(sh.x), y: Y(sh.y + sh.h), width: sh.w * s, height: sh.h * s, borderColor: COLORS.graphite, borderWidth: thickness, borderDashArray: dash });
    else if (sh.k === "line") page.drawLine({ start: { x: X(sh.x1), y: Y(sh.y1) }, end: { x: X(sh.x2), y: Y(sh.y2) }, thickness, color: COLORS.graphite, dashArray: dash });
    else if (sh.k === "circle") page.drawCircle({ x: X(sh.cx), y: Y(sh.cy), size: sh.r * s, borderColor: COLORS.graphite, borderWidth: thickness });
    else runs.push(textRun(sh.text, X(sh.x), Y(sh.y), { font: sh.bold ? fonts.sansBold : fonts.sans, size: sh.size * s, align: sh.anchor === "middle" ? "center" : sh.anchor === "end" ? "right" : "left" }));
  }
  drawTextRuns(page, runs);
}
