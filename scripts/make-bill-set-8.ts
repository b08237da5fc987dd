/**
 * Makes held-out set 8 (tests/fixtures/bills/held-out-8/): eight invented bills of invented
 * utilities drawn as HTML/CSS and printed to PDF by Debian's chromium (three of them two pages),
 * and three phone photos of one-page bills, each with the expected JSON a person reads off the
 * page. Photos: an overhead light falling off diagonally on a wooden desk, a low lamp from the
 * lower right with the sheet sheared and turned 3°, and a soft, grainy shot on a pale table.
 * Layouts: scripts/lib/bill-set-8/; mechanics: scripts/lib/bill-print.ts. Deterministic: the
 * PDFs' print dates are fixed and the grain is seeded. See held-out-8/README.md.
 *
 *   npx tsx scripts/make-bill-set-8.ts
 */
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { lampLight, linearLight, photograph, printBills, renderPage, writeExpected, type PhotoLook } from "./lib/bill-print";
import { marlowe, quenby, tessaly } from "./lib/bill-set-8/bills-a";
import { ferncastle, kittering, oxhollow } from "./lib/bill-set-8/bills-b";
import { ambrose, wendmere } from "./lib/bill-set-8/bills-c";
import { html } from "./lib/bill-set-8/common";

const BILLS = [marlowe, quenby, tessaly, oxhollow, ferncastle, kittering, ambrose, wendmere].map((make) => make());

const PHOTOS: { bill: string; name: string; dpi: number; look: PhotoLook }[] = [
  {
    bill: "marlowe-coop-newest-first",
    name: "marlowe-photo-overhead",
    dpi: 160,
    look: { angle: 2.4, blur: 1.0, shade: 0.4, quality: 80, background: "#7a5a3a", light: linearLight({ from: [0, 0], to: [1, 1], bright: "rgb(246,250,255)", middle: [0.55, "rgb(226,232,240)"], tint: [0.9, 0.95, 1] }) },
  },
  {
    bill: "kittering-past-due-two-meters",
    name: "kittering-photo-low-lamp",
    dpi: 150,
    look: { angle: -3.1, blur: 1.4, shade: 0.55, shear: -0.03, quality: 72, background: "#222222", light: lampLight({ cx: 0.75, cy: 0.8, radius: 1.0, bright: "rgb(255,247,230)", tint: [1, 0.94, 0.84] }) },
  },
  {
    bill: "ambrose-emc-estimated-initials-chart",
    name: "ambrose-photo-soft-grain",
    dpi: 170,
    look: { angle: 0.6, blur: 1.3, shade: 0.3, grain: 10, quality: 78, background: "#d8d4cc", light: linearLight({ from: [0.5, 1], to: [0.5, 0], bright: "rgb(255,246,232)", middle: [0.6, "rgb(240,232,218)"], tint: [1, 0.95, 0.88] }) },
  },
];

const out = path.resolve("tests/fixtures/bills/held-out-8");
mkdirSync(out, { recursive: true });
const expectedOf = await printBills(out, BILLS, html, true);
const tmp = mkdtempSync(path.join(tmpdir(), "bill-set-8-"));
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
