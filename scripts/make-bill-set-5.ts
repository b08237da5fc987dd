/**
 * Makes held-out set 5 (tests/fixtures/bills/held-out-5/): ten invented bills drawn as HTML/CSS
 * and printed to PDF by Debian's chromium through Playwright (other fonts, text runs and table
 * geometry than the pdf-lib corpus), two of them also as scans (a page rasterised by poppler's
 * pdftoppm, wrapped back into an image-only PDF with pdf-lib) and two as photos (turned 2.6° and
 * −3.4°, blurred, unevenly lit, JPEG: harsher than scripts/make-bill-photos.ts). Each file gets
 * the expected JSON a person would read off the page. Layouts: scripts/lib/bill-set-5/bills.ts.
 *
 *   npx tsx scripts/make-bill-set-5.ts
 */
import { execFileSync } from "node:child_process";
import { mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { chromium } from "playwright";
import { PDFDocument } from "pdf-lib";
import sharp from "sharp";
import { BILLS, html, PHOTOS, SCANS, type Expected } from "./lib/bill-set-5/bills";

const out = path.resolve("tests/fixtures/bills/held-out-5");
mkdirSync(out, { recursive: true });
const writeJson = (name: string, e: Expected) => writeFileSync(path.join(out, `${name}.json`), JSON.stringify(e, null, 2) + "\n");

// Same launch flags as tests/playwright.config.ts: Debian's chromium, off the network.
const browser = await chromium.launch({
  executablePath: "/usr/bin/chromium",
  args: ["--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run", "--disable-background-networking", "--disable-component-update", "--disable-sync"],
});
const expectedOf = new Map<string, Expected>();
try {
  const page = await browser.newPage();
  for (const make of BILLS) {
    const bill = make();
    await page.setContent(html(bill), { waitUntil: "load" });
    const pdf = await page.pdf({ format: "Letter", printBackground: true, preferCSSPageSize: true });
    writeFileSync(path.join(out, `${bill.name}.pdf`), pdf);
    writeJson(bill.name, bill.expected);
    expectedOf.set(bill.name, bill.expected);
  }
} finally {
  await browser.close();
}

const tmp = mkdtempSync(path.join(tmpdir(), "bill-set-5-"));
function render(bill: string, dpi: number): Buffer {
  const prefix = path.join(tmp, `${bill}-${dpi}`);
  execFileSync("pdftoppm", ["-r", String(dpi), "-png", "-f", "1", "-l", "1", "-singlefile", path.join(out, `${bill}.pdf`), prefix]);
  return readFileSync(`${prefix}.png`);
}
/** Light falling off from the top right corner to the bottom left, a little warm. */
function shadeSvg(width: number, height: number, shade: number): Buffer {
  const dark = Math.round(255 * (1 - shade));
  return Buffer.from(
    `<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}"><defs><linearGradient id="g" x1="1" y1="0" x2="0" y2="1">` +
      `<stop offset="0" stop-color="rgb(255,248,232)"/><stop offset="0.55" stop-color="rgb(225,220,205)"/><stop offset="1" stop-color="rgb(${dark},${dark},${Math.round(dark * 0.9)})"/></linearGradient></defs>` +
      `<rect width="100%" height="100%" fill="url(#g)"/></svg>`,
  );
}
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
    const page = render(p.bill, 150);
    const { width = 0, height = 0 } = await sharp(page).metadata();
    const lit = await sharp(page).composite([{ input: shadeSvg(width, height, p.shade), blend: "multiply" }]).png().toBuffer();
    const jpeg = await sharp(lit).rotate(p.angle, { background: "#5e5a55" }).blur(p.blur).jpeg({ quality: 78 }).toBuffer();
    writeFileSync(path.join(out, `${p.name}.jpg`), jpeg);
    writeJson(p.name, { ...expectedOf.get(p.bill)!, source: "ocr" });
  }
} finally {
  rmSync(tmp, { recursive: true, force: true });
}
console.log(`Wrote ${BILLS.length} PDFs, ${SCANS.length} scans and ${PHOTOS.length} photos to ${path.relative(process.cwd(), out)}`);
