// Reading CSV (RFC 4180) with Papa Parse, keeping each record's line number in the file so
// every error can name its line. Pure: used by the engine's file readers and the server.
import Papa from "papaparse";

/** One record: the file line it starts on (1-based), its cells, and Papa Parse's complaint if any. */
export type CsvRecord = { line: number; cells: string[]; problem?: string };

/** Every record of the text, blank lines included (as one empty cell); a leading BOM is dropped. */
export function readCsvRecords(text: string): CsvRecord[] {
  const normalized = text.replace(/^\uFEFF/, "").replace(/\r\n?/g, "\n");
  const records: CsvRecord[] = [];
  let cursor = 0;
  let newlinesBefore = 0;
  Papa.parse<string[]>(normalized, {
    delimiter: ",",
    newline: "\n",
    skipEmptyLines: false,
    step: (result) => {
      const line = newlinesBefore + 1;
      for (let i = cursor; i < result.meta.cursor; i++) if (normalized.charCodeAt(i) === 10) newlinesBefore++;
      cursor = result.meta.cursor;
      // "Delimiter" only says auto-detection was skipped; quotes and field counts are real problems.
      const problem = result.errors.find((e) => e.type !== "Delimiter")?.message;
      records.push(problem ? { line, cells: result.data, problem } : { line, cells: result.data });
    },
  });
  return records;
}

/** A record with no text in any cell. */
export const isBlankRecord = (r: CsvRecord): boolean => r.cells.every((c) => c.trim() === "");
