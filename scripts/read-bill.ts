/**
 * Reads a utility bill the way the Energy tab does and prints what the app would suggest.
 *
 *   npm run read-bill -- FILE [--json]
 *
 * FILE: a PDF with a text layer. --json prints only the JSON (docs/read-bill.md describes it):
 *   {"current":{"start","end","kwh","amountDueCents"},"history":[{"month","kwh"}],"source","warnings"}
 */
import { readFileSync } from "node:fs";
import { billJson, readBill, type BillReading, type Found } from "../src/lib/bill-reader";
import { pdfPages } from "../src/lib/bill-reader/pdf-pages";

function usage(message: string): never {
  console.error(`${message}\nusage: npm run read-bill -- FILE [--json]`);
  process.exit(2);
}

const args = process.argv.slice(2);
const json = args.includes("--json");
const files = args.filter((a) => a !== "--json");
if (files.length !== 1) usage(files.length ? "Give one file." : "Give the bill's file.");
let bytes: Uint8Array;
try {
  bytes = new Uint8Array(readFileSync(files[0]));
} catch {
  usage(`Cannot read ${files[0]}.`);
}
if (Buffer.from(bytes.subarray(0, 5)).toString("latin1") !== "%PDF-") usage(`${files[0]} is not a PDF (photos need OCR, which this command does not do yet).`);

const pages = await pdfPages(bytes).catch(() => usage(`${files[0]} cannot be read as a PDF (damaged or protected).`));
const reading = readBill(pages);
const out = billJson(reading, "text");
if (pages.every((p) => p.items.length === 0)) out.warnings.unshift("The PDF has no text layer (a scan): nothing could be read.");

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
