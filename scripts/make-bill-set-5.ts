/**
 * Makes held-out set 5 (tests/fixtures/bills/held-out-5/): ten invented bills drawn as HTML/CSS
 * and printed to PDF by Debian's chromium through Playwright (other fonts, text runs and table
 * geometry than the pdf-lib corpus), two of them also as scans (a page rasterised by poppler's
 * pdftoppm, wrapped back into an image-only PDF with pdf-lib) and two as photos (turned 2.6° and
 * −3.4°, blurred, unevenly lit, JPEG: harsher than scripts/make-bill-photos.ts). Each file gets
 * the expected JSON a person would read off the page. Layouts: scripts/lib/bill-set-5/bills.ts;
 * mechanics: scripts/lib/bill-print.ts.
 *
 *   npx tsx scripts/make-bill-set-5.ts
 */
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { PDFDocument } from "pdf-lib";
import sharp from "sharp";
import { linearLight, photograph, printBills, renderPage, writeExpected } from "./lib/bill-print";
import { BILLS, html, PHOTOS, SCANS } from "./lib/bill-set-5/bills";

const out = path.resolve("tests/fixtures/bills/held-out-5");
mkdirSync(out, { recursive: true });
const writeJson = (name: string, e: Parameters<typeof writeExpected>[2]) => writeExpected(out, name, e);
const expectedOf = await printBills(out, BILLS.map((make) => make()), html);

const tmp = mkdtempSync(path.join(tmpdir(), "bill-set-5-"));
const render = (bill: string, dpi: number) => renderPage(path.join(out, `${bill}.pdf`), 1, dpi, tmp);
/** Light falling off from the top right corner to the bottom left, a little warm. */
const light = linearLight({ from: [1, 0], to: [0, 1], bright: "rgb(255,248,232)", middle: [0.55, "rgb(225,220,205)"], tint: [1, 1, 0.9] });
try {
  for (const s of SCANS) {
    const png = await sharp(render(s.bill, s.dpi)).greyscale().png().toBuffer();
    const doc = await PDFDocument.create();
    const image = await doc.embedPng(png);
    doc.addPage([612, 792]).drawImage(image, { x: 0, y: 0, width: 612, height: 792 });
    writeFileSync(path.join(out, `${s.name}.pdf`), await doc.save({ useObjectStreams: false }));
    writeJson(s.name, { ...expectedOf.get(s.bill)!, source: "ocr" });
  }
  for (const p of PHOTOS) {
    writeFileSync(path.join(out, `${p.name}.jpg`), await photograph(render(p.bill, 150), { ...p, light, background: "#5e5a55", quality: 78 }));
    writeJson(p.name, { ...expectedOf.get(p.bill)!, source: "ocr" });
  }
} finally {
  rmSync(tmp, { recursive: true, force: true });
}
console.log(`Wrote ${BILLS.length} PDFs, ${SCANS.length} scans and ${PHOTOS.length} photos to ${path.relative(process.cwd(), out)}`);
