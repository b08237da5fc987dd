/**
 * Makes held-out set 6 (tests/fixtures/bills/held-out-6/): six invented bills drawn as HTML/CSS
 * and printed to PDF by Debian's chromium through Playwright, and two photos of two of them (page
 * rendered by poppler's pdftoppm at 150 dpi, lit unevenly, turned, blurred, JPEG with sharp, as
 * scripts/make-bill-set-5.ts does). Each file gets the expected JSON a person reads off the page.
 * Layouts: scripts/lib/bill-set-6/bills.ts.
 *
 *   npx tsx scripts/make-bill-set-6.ts
 */
import { execFileSync } from "node:child_process";
import { mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { chromium } from "playwright";
import sharp from "sharp";
import type { Expected } from "./lib/bill-set-5/bills";
import { BILLS, html, PHOTOS } from "./lib/bill-set-6/bills";

const out = path.resolve("tests/fixtures/bills/held-out-6");
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
    writeFileSync(path.join(out, `${bill.name}.pdf`), await page.pdf({ format: "Letter", printBackground: true, preferCSSPageSize: true }));
    writeJson(bill.name, bill.expected);
    expectedOf.set(bill.name, bill.expected);
  }
} finally {
  await browser.close();
}

/** Light falling off from the top left corner to the bottom right, a little cool. */
function shadeSvg(width: number, height: number, shade: number): Buffer {
  const dark = Math.round(255 * (1 - shade));
  return Buffer.from(
    `<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}"><defs><linearGradient id="g" x1="0" y1="0.2" x2="1" y2="1">` +
      `<stop offset="0" stop-color="rgb(250,252,255)"/><stop offset="0.6" stop-color="rgb(222,224,226)"/><stop offset="1" stop-color="rgb(${Math.round(dark * 0.95)},${dark},${dark})"/></linearGradient></defs>` +
      `<rect width="100%" height="100%" fill="url(#g)"/></svg>`,
  );
}
const tmp = mkdtempSync(path.join(tmpdir(), "bill-set-6-"));
try {
  for (const p of PHOTOS) {
    const prefix = path.join(tmp, p.bill);
    execFileSync("pdftoppm", ["-r", "150", "-png", "-f", "1", "-l", "1", "-singlefile", path.join(out, `${p.bill}.pdf`), prefix]);
    const page = readFileSync(`${prefix}.png`);
    const { width = 0, height = 0 } = await sharp(page).metadata();
    const lit = await sharp(page).composite([{ input: shadeSvg(width, height, p.shade), blend: "multiply" }]).png().toBuffer();
    const jpeg = await sharp(lit).rotate(p.angle, { background: "#4f5559" }).blur(p.blur).jpeg({ quality: 80 }).toBuffer();
    writeFileSync(path.join(out, `${p.name}.jpg`), jpeg);
    writeJson(p.name, { ...expectedOf.get(p.bill)!, source: "ocr" });
  }
} finally {
  rmSync(tmp, { recursive: true, force: true });
}
console.log(`Wrote ${BILLS.length} PDFs and ${PHOTOS.length} photos to ${path.relative(process.cwd(), out)}`);
