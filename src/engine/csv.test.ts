import { describe, expect, it } from "vitest";
import { isBlankRecord, readCsvRecords } from "./csv";

describe("readCsvRecords", () => {
  it("keeps the file line each record starts on, across quoted line breaks, CRLF and blank lines", () => {
    const text = '\uFEFFa,b\r\n"x\ny",2\r\n\r\n"say ""hi""",3\n';
    const records = readCsvRecords(text).filter((r) => !isBlankRecord(r));
    expect(records).toEqual([
      { line: 1, cells: ["a", "b"] },
      { line: 2, cells: ["x\ny", "2"] },
      { line: 5, cells: ['say "hi"', "3"] },
    ]);
  });

  it("names a broken quote as a problem of its record", () => {
    const [, bad] = readCsvRecords('a,b\n"open,2\n');
    expect(bad.line).toBe(2);
    expect(bad.problem).toMatch(/quote/i);
  });
});
