// Every bill of the corpus (tests/fixtures/bills, made by scripts/make-bill-corpus.ts) is read
// from its PDF and every field compared with what the bill prints.
import { readdirSync, readFileSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { billJson, readBill, type BillJson } from "./index";
import { pdfPages } from "./pdf-pages";

const dir = path.resolve(import.meta.dirname, "../../../tests/fixtures/bills");
const names = readdirSync(dir)
  .filter((f) => f.endsWith(".pdf"))
  .map((f) => f.slice(0, -4));

describe("the bill corpus: invented bills of invented utilities", () => {
  it("has at least 12 bills, one of them two pages long", async () => {
    expect(names.length).toBeGreaterThanOrEqual(12);
    const pages = await Promise.all(names.map(async (n) => (await pdfPages(new Uint8Array(readFileSync(path.join(dir, `${n}.pdf`))))).length));
    expect(pages.some((n) => n >= 2)).toBe(true);
  });

  it.each(names)("%s: every field read right", async (name) => {
    const expected = JSON.parse(readFileSync(path.join(dir, `${name}.json`), "utf8")) as BillJson;
    const got = billJson(readBill(await pdfPages(new Uint8Array(readFileSync(path.join(dir, `${name}.pdf`))))), "text");
    expect(got.current).toEqual(expected.current);
    expect(got.history).toEqual(expected.history);
    for (const w of expected.warnings) expect(got.warnings.join(" ").toLowerCase()).toContain(w);
    if (!expected.warnings.includes("estimated")) expect(got.warnings.join(" ")).not.toMatch(/estimated \(page/);
  });
});
