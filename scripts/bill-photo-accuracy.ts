/**
 * Measures OCR on the whole bill corpus as photos: each bill's first page rendered by pdftoppm at
 * DPI (default 200, about a phone photo of a letter page), turned 1.2°, blurred and darkened with
 * sharp, then read as the app reads a photo. Counts the current-bill fields and history months
 * (a history printed on page 2 is not in a photo of page 1 and counts as missed).
 *
 *   npx tsx scripts/bill-photo-accuracy.ts [DPI]      (a few seconds a bill)
 */
import { execFileSync } from "node:child_process";
import { mkdtempSync, readdirSync, readFileSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import sharp from "sharp";
import { billJson, type BillJson } from "../src/lib/bill-reader";
import { readBillByOcr } from "../src/lib/bill-reader/ocr-pages";

const dpi = process.argv[2] ?? "200";
const dirs = ["tests/fixtures/bills", "tests/fixtures/bills/held-out"];
const tmp = mkdtempSync(path.join(tmpdir(), "bill-photo-accuracy-"));
let [fields, fieldsRight, months, monthsRight] = [0, 0, 0, 0];
try {
  for (const dir of dirs) {
    for (const f of readdirSync(dir).filter((n) => n.endsWith(".pdf"))) {
      const name = f.slice(0, -4);
      execFileSync("pdftoppm", ["-r", dpi, "-png", "-f", "1", "-l", "1", "-singlefile", path.join(dir, f), path.join(tmp, name)]);
      const photo = await sharp(path.join(tmp, `${name}.png`)).rotate(1.2, { background: "#6b6660" }).blur(1).modulate({ brightness: 0.85 }).jpeg({ quality: 82 }).toBuffer();
      const expected = JSON.parse(readFileSync(path.join(dir, `${name}.json`), "utf8")) as BillJson;
      const got = billJson((await readBillByOcr(new Uint8Array(photo), "image")).reading, "ocr");
      const misses = (["start", "end", "kwh", "amountDueCents"] as const).filter((k) => got.current[k] !== expected.current[k]);
      const read = new Map(got.history.map((h) => [h.month, h.kwh]));
      const hits = expected.history.filter((h) => read.get(h.month) === h.kwh).length;
      [fields, fieldsRight, months, monthsRight] = [fields + 4, fieldsRight + 4 - misses.length, months + expected.history.length, monthsRight + hits];
      console.log(`${path.relative("tests/fixtures/bills", path.join(dir, name))}: fields ${4 - misses.length}/4${misses.length ? ` (missed ${misses.join(", ")})` : ""}, history ${hits}/${expected.history.length}`);
    }
  }
  console.log(`current-bill fields ${fieldsRight}/${fields}, history months ${monthsRight}/${months}, all ${(((fieldsRight + monthsRight) / (fields + months)) * 100).toFixed(1)} %`);
} finally {
  rmSync(tmp, { recursive: true, force: true });
}
