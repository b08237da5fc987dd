/**
 * Reads a utility bill the way the Energy tab does and prints what the app would suggest.
 *
 *   npm run read-bill -- FILE [--json]
 *   npm run read-bill -- PAGE1.jpg PAGE2.jpg … [--json]     (photos of one bill's pages, read as one bill)
 *
 * FILE: a PDF with a text layer, a scanned PDF or a photo (JPEG, PNG): scans and photos are read by
 * OCR (Debian's tesseract-ocr, installed by scripts/bootstrap.mjs). --json prints only the JSON (docs/read-bill.md describes it):
 *   {"current":{"start","end","kwh","amountDueCents"},"history":[{"month","kwh"}],"source","warnings"}
 */
import { readFileSync } from "node:fs";
import { billJson, readBill, type BillReading, type Found } from "../src/lib/bill-reader";
import { ocrTooPoor, readBillByOcr, type OcrPages } from "../src/lib/bill-reader/ocr-pages";
import { pdfPages, pagesText } from "../src/lib/bill-reader/pdf-pages";

function usage(message: string): never {
  console.error(`${message}\nusage: npm run read-bill -- FILE [--json]  or  npm run read-bill -- PAGE1.jpg PAGE2.jpg … [--json]`);
  process.exit(2);
}

const args = process.argv.slice(2);
const json = args.includes("--json");
const files = args.filter((a) => a !== "--json");
if (!files.length) usage("Give the bill's file.");
const readOrQuit = (file: string) => {
  try {
    return new Uint8Array(readFileSync(file));
  } catch {
    usage(`Cannot read ${file}.`);
  }
};
const all = files.map(readOrQuit);
const kindOf = (b: Uint8Array) => {
  const head = Buffer.from(b.subarray(0, 8));
  if (head.subarray(0, 5).toString("latin1") === "%PDF-") return "pdf";
  return head.subarray(0, 3).equals(Buffer.from([0xff, 0xd8, 0xff])) || head.equals(Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a])) ? "image" : null;
};
files.forEach((f, i) => kindOf(all[i]) || usage(`${f} is neither a PDF nor a photo (JPEG or PNG).`));
// Several files are one bill's pages photographed one by one: photos only, read by OCR together.
if (files.length > 1 && all.some((b) => kindOf(b) !== "image")) usage("Several files are read as one bill only when each is a photo (JPEG or PNG) of one of its pages.");
const bytes = all[0];
const isPdf = kindOf(bytes) === "pdf";

/** Fewer characters than this in a PDF's text layer: a scan, read by OCR (as the app does). */
const MIN_PDF_TEXT_CHARS = 20;
const pages = isPdf ? await pdfPages(bytes).catch(() => usage(`${files[0]} cannot be read as a PDF (damaged or protected).`)) : [];
let ocr: OcrPages | null = null;
let reading = readBill(pages);
if (!isPdf || pagesText(pages).replace(/\s/g, "").length < MIN_PDF_TEXT_CHARS) {
  try {
    ({ reading, ocr } = await readBillByOcr(isPdf ? bytes : all, isPdf ? "pdf" : "image"));
  } catch (err) {
    console.error(err instanceof Error ? err.message : String(err));
    process.exit(1);
  }
}
const out = billJson(reading, ocr ? "ocr" : "text");
if (ocr) {
  const found = [reading.period, reading.kwh, reading.amountDue, reading.history].filter(Boolean).length;
  const poor = ocrTooPoor(ocr, found);
  if (poor) out.warnings.unshift(poor);
}

if (json) {
  console.log(JSON.stringify(out));
} else {
  const at = (f: Found<unknown> | null | undefined) => (f ? `  [page ${f.where.page}, line ${f.where.line}, ${f.confidence}]` : "");
  const r: BillReading = reading;
  console.log(`Period       ${out.current.start ?? "?"} → ${out.current.end ?? "?"}${at(r.period?.start)}`);
  console.log(`kWh          ${out.current.kwh ?? "?"}${r.estimated ? " (estimated reading)" : ""}${at(r.kwh)}`);
  console.log(`Amount due   ${out.current.amountDueCents == null ? "?" : `$${(out.current.amountDueCents / 100).toFixed(2)}`}${at(r.amountDue)}`);
  for (const a of r.amountAlternatives) console.log(`   or        $${(a.value / 100).toFixed(2)}  “${a.label ?? ""}”${at(a)}`);
  console.log(`History      ${out.history.length ? `${out.history.length} months (${r.history?.layout}, ${r.history?.confidence})` : "none"}`);
  for (const m of r.history?.months ?? []) console.log(`   ${m.month}  ${String(m.kwh).padStart(6)} kWh${m.days ? `  ${m.days} days` : ""}`);
  for (const w of out.warnings) console.log(`⚑ ${w}`);
}
