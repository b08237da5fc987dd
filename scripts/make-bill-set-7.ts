/**
 * Makes held-out set 7 (tests/fixtures/bills/held-out-7/): eight invented bills of invented
 * utilities drawn as HTML/CSS and printed to PDF by Debian's chromium (three of them two pages, one
 * landscape), and three phone photos of one-page bills, each with the expected JSON a person reads
 * off the page. The photos differ from sets 5 and 6: a desk lamp's pool of light with the page
 * sheared, a landscape sheet turned 3.8° under warm side light, and a dim, grainy, lower-resolution
 * shot. Layouts: scripts/lib/bill-set-7/; mechanics: scripts/lib/bill-print.ts. Deterministic:
 * the PDFs' print dates are fixed and the grain is seeded.
 *
 *   npx tsx scripts/make-bill-set-7.ts
 */
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { lampLight, linearLight, photograph, printBills, renderPage, writeExpected, type PhotoLook } from "./lib/bill-print";
import { html } from "./lib/bill-set-5/bills";
import { brindlemarsh, heddlestone, orlestone, tallowind } from "./lib/bill-set-7/bills-a";
import { gorsewick, pollardine, ravelstoke, westerhythe } from "./lib/bill-set-7/bills-b";

const BILLS = [brindlemarsh, orlestone, tallowind, heddlestone, pollardine, gorsewick, ravelstoke, westerhythe].map((make) => make());

const PHOTOS: { bill: string; name: string; dpi: number; look: PhotoLook }[] = [
  {
    bill: "orlestone-city-combined-across",
    name: "orlestone-photo-lamp",
    dpi: 150,
    look: { angle: -1.9, blur: 1.3, shade: 0.5, shear: 0.035, quality: 76, background: "#3b3a36", light: lampLight({ cx: 0.38, cy: 0.3, radius: 0.85, bright: "rgb(255,250,238)", tint: [1, 0.96, 0.86] }) },
  },
  {
    bill: "gorsewick-landscape-estimated",
    name: "gorsewick-photo-side-light",
    dpi: 150,
    look: { angle: 3.8, blur: 1.1, shade: 0.45, quality: 82, background: "#6b5f52", light: linearLight({ from: [0, 0.5], to: [1, 0.5], bright: "rgb(255,244,222)", middle: [0.5, "rgb(236,226,206)"], tint: [1, 0.93, 0.82] }) },
  },
  {
    bill: "pollardine-past-due-year-grid",
    name: "pollardine-photo-dim",
    dpi: 130,
    look: { angle: -0.8, blur: 0.9, shade: 0.35, grain: 18, quality: 70, background: "#2a2c30", light: linearLight({ from: [0.5, 0], to: [0.5, 1], bright: "rgb(205,208,212)", middle: [0.5, "rgb(188,190,194)"], tint: [0.92, 0.95, 1] }) },
  },
];

const out = path.resolve("tests/fixtures/bills/held-out-7");
mkdirSync(out, { recursive: true });
const expectedOf = await printBills(out, BILLS, html, true);
const tmp = mkdtempSync(path.join(tmpdir(), "bill-set-7-"));
try {
  for (const p of PHOTOS) {
    const page = renderPage(path.join(out, `${p.bill}.pdf`), 1, p.dpi, tmp);
    writeFileSync(path.join(out, `${p.name}.jpg`), await photograph(page, p.look));
    writeExpected(out, p.name, { ...expectedOf.get(p.bill)!, source: "ocr" });
  }
} finally {
  rmSync(tmp, { recursive: true, force: true });
}
console.log(`Wrote ${BILLS.length} PDFs and ${PHOTOS.length} photos to ${path.relative(process.cwd(), out)}`);
