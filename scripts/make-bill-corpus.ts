/**
 * Writes the bill reader's test corpus: invented bills of invented utilities as text PDFs,
 * each with the JSON the reader must give (tests/fixtures/bills/NAME.pdf and NAME.json).
 *
 *   npx tsx scripts/make-bill-corpus.ts
 *
 * The expected JSON comes from what each bill prints, never from the reader.
 */
import { mkdirSync, writeFileSync } from "node:fs";
import path from "node:path";
import { billsA } from "./lib/bill-corpus/bills-a";
import { billsB } from "./lib/bill-corpus/bills-b";
import { heldOut } from "./lib/bill-corpus/held-out";
import { heldOut2 } from "./lib/bill-corpus/held-out-2";
import { heldOut3 } from "./lib/bill-corpus/held-out-3";
import { heldOut4 } from "./lib/bill-corpus/held-out-4";
import { families6 } from "./lib/bill-corpus/families-6";

const root = path.resolve(import.meta.dirname, "../tests/fixtures/bills");
for (const [dir, bills] of [
  // The held-out sets joined the corpus once their first measure was taken and their misses fixed.
  // families-6: the families held-out set 6 missed, drawn in other layouts than set 6.
  [root, [...billsA, ...billsB, ...heldOut, ...heldOut2, ...families6]],
  // Measured, never tuned on: not read by the corpus test.
  [path.join(root, "held-out"), heldOut3],
  [path.join(root, "held-out-4"), heldOut4],
] as const) {
  mkdirSync(dir, { recursive: true });
  for (const bill of bills) {
    writeFileSync(path.join(dir, `${bill.name}.pdf`), await bill.make());
    writeFileSync(path.join(dir, `${bill.name}.json`), JSON.stringify(bill.expected, null, 2) + "\n");
  }
  console.log(`${bills.length} bills in ${path.relative(process.cwd(), dir)}`);
}
