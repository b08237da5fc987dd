/**
 * Measures the bill reader on a folder of bills with their expected JSON (NAME.pdf + NAME.json,
 * as scripts/make-bill-corpus.ts writes them): each current-bill field, each history month, and
 * whether a wrong amount was ever given without the rep being shown the right one.
 *
 *   npx tsx scripts/bill-accuracy.ts [DIR]     (default: tests/fixtures/bills, the corpus)
 *
 * Photos (NAME.jpg / .png) and scanned PDFs (no text layer) in DIR are read by OCR first, as
 * `npm run read-bill` and the app do; they are counted the same way.
 *
 * Run it on bills written after the reader changed, before changing it again, to measure it
 * on layouts it was not tuned on (docs/read-bill.md keeps those first runs).
 */
import { readdirSync, readFileSync } from "node:fs";
import path from "node:path";
import { billJson, readBill, type BillJson } from "../src/lib/bill-reader";
import { readBillByOcr } from "../src/lib/bill-reader/ocr-pages";
import { pdfPages, pagesText } from "../src/lib/bill-reader/pdf-pages";

const dir = path.resolve(process.argv[2] ?? "tests/fixtures/bills");
const fields = ["start", "end", "kwh", "amountDueCents"] as const;
let [right, total, monthsRight, monthsTotal, historiesRight, silentWrongAmounts] = [0, 0, 0, 0, 0, 0];
/** Fewer characters than this in a PDF's text layer: a scan, read by OCR (as scripts/read-bill.ts does). */
const MIN_PDF_TEXT_CHARS = 20;
async function read(file: string) {
  const bytes = new Uint8Array(readFileSync(path.join(dir, file)));
  const pages = file.endsWith(".pdf") ? await pdfPages(bytes) : [];
  if (file.endsWith(".pdf") && pagesText(pages).replace(/\s/g, "").length >= MIN_PDF_TEXT_CHARS) return { reading: readBill(pages), source: "text" as const };
  const { reading } = await readBillByOcr(bytes, file.endsWith(".pdf") ? "pdf" : "image");
  return { reading, source: "ocr" as const };
}

const names = readdirSync(dir).filter((f) => /\.(pdf|jpe?g|png)$/.test(f));
for (const file of names) {
  const expected = JSON.parse(readFileSync(path.join(dir, file.replace(/\.(pdf|jpe?g|png)$/, ".json")), "utf8")) as BillJson;
  const { reading, source } = await read(file);
  const got = billJson(reading, source);
  const misses: string[] = [];
  for (const f of fields) {
    total++;
    if (got.current[f] === expected.current[f]) right++;
    else misses.push(`${f} ${got.current[f]} (want ${expected.current[f]})`);
  }
  const gotMonths = new Map(got.history.map((h) => [h.month, h.kwh]));
  const monthHits = expected.history.filter((h) => gotMonths.get(h.month) === h.kwh).length;
  [monthsRight, monthsTotal] = [monthsRight + monthHits, monthsTotal + expected.history.length];
  const historyRight = JSON.stringify(got.history) === JSON.stringify(expected.history);
  if (historyRight) historiesRight++;
  else misses.push(`history ${monthHits}/${expected.history.length} months (${got.history.length} read)`);
  const amountWrong = got.current.amountDueCents !== expected.current.amountDueCents;
  const shown = reading.amountAlternatives.some((a) => a.value === expected.current.amountDueCents) && reading.amountDue?.confidence !== "high";
  if (amountWrong && got.current.amountDueCents !== null && !shown) silentWrongAmounts++;
  console.log(`${misses.length ? "✗" : "✓"} ${file}${misses.length ? `: ${misses.join("; ")}` : ""}`);
}
const pct = (a: number, b: number) => (b ? `${((a / b) * 100).toFixed(0)} %` : "n/a");
console.log(`\n${names.length} bills in ${path.relative(process.cwd(), dir) || "."}`);
console.log(`current-bill fields right: ${right}/${total} (${pct(right, total)})`);
console.log(`history months right:      ${monthsRight}/${monthsTotal} (${pct(monthsRight, monthsTotal)}); whole histories right ${historiesRight}/${names.length}`);
console.log(`all fields (4 per bill + 1 per history month): ${right + monthsRight}/${total + monthsTotal} (${pct(right + monthsRight, total + monthsTotal)})`);
console.log(`wrong amounts given as certain without the right one shown: ${silentWrongAmounts}`);
