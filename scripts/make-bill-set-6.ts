/**
 * Makes held-out set 6 (tests/fixtures/bills/held-out-6/): six invented bills drawn as HTML/CSS
 * and printed to PDF by Debian's chromium through Playwright, and two photos of two of them (page
 * rendered by poppler's pdftoppm at 150 dpi, lit unevenly, turned, blurred, JPEG with sharp, as
 * scripts/make-bill-set-5.ts does). Each file gets the expected JSON a person reads off the page.
 * Layouts: scripts/lib/bill-set-6/bills.ts; mechanics: scripts/lib/bill-print.ts.
 *
 *   npx tsx scripts/make-bill-set-6.ts
 */
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { linearLight, photograph, printBills, renderPage, writeExpected } from "./lib/bill-print";
import { BILLS, html, PHOTOS } from "./lib/bill-set-6/bills";

const out = path.resolve("tests/fixtures/bills/held-out-6");
mkdirSync(out, { recursive: true });
const expectedOf = await printBills(out, BILLS.map((make) => make()), html);

/** Light falling off from the top left corner to the bottom right, a little cool. */
const light = linearLight({ from: [0, 0.2], to: [1, 1], bright: "rgb(250,252,255)", middle: [0.6, "rgb(222,224,226)"], tint: [0.95, 1, 1] });
const tmp = mkdtempSync(path.join(tmpdir(), "bill-set-6-"));
try {
  for (const p of PHOTOS) {
    const page = renderPage(path.join(out, `${p.bill}.pdf`), 1, 150, tmp);
    writeFileSync(path.join(out, `${p.name}.jpg`), await photograph(page, { ...p, light, background: "#4f5559", quality: 80 }));
    writeExpected(out, p.name, { ...expectedOf.get(p.bill)!, source: "ocr" });
  }
} finally {
  rmSync(tmp, { recursive: true, force: true });
}
console.log(`Wrote ${BILLS.length} PDFs and ${PHOTOS.length} photos to ${path.relative(process.cwd(), out)}`);
