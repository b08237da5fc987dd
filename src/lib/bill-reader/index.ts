// Reads a utility bill's text (pages of positioned text from the PDF's text layer or OCR) into
// what the rep confirms: the current period, its kWh, the amount due and the usage history,
// each with where it was printed and how sure the reader is. Pure: no I/O.
import { readAmount } from "./amount";
import { findDates } from "./dates";
import { readHistory } from "./history";
import { readKwh, readEstimated } from "./kwh";
import { billLines, type BillPage, type Cell, type Line } from "./layout";
import { readPeriod } from "./period";
import type { BillReading } from "./types";

export type { BillPage, TextItem } from "./layout";
export { pagesFromText } from "./layout";
export type { BillHistory, BillReading, Confidence, Found, HistoryMonth, Where } from "./types";

/** The month the history's newest label falls in or before: the period's end, else the bill's latest date. */
function anchorMonth(lines: Line[]): string | null {
  const first = readPeriod(lines);
  if (first) return first.end.value.slice(0, 7);
  const dates = lines.flatMap((l) => findDates(l.text).map((d) => d.iso)).sort();
  return dates.at(-1)?.slice(0, 7) ?? null;
}

/** The lines without the history's cells: a history table beside the charges leaves the charges. */
function withoutCells(lines: Line[], cells: Set<Cell>): Line[] {
  return lines.flatMap((l) => {
    const kept = l.cells.filter((c) => !cells.has(c));
    if (kept.length === l.cells.length) return [l];
    return kept.length ? [{ ...l, cells: kept, text: kept.map((c) => c.text).join("  ") }] : [];
  });
}

export function readBill(pages: readonly BillPage[]): BillReading {
  const all = billLines(pages);
  const history = readHistory(all, anchorMonth(all));
  const lines = withoutCells(all, history.cells);
  const period = readPeriod(lines);
  const kwh = readKwh(lines);
  const amount = readAmount(lines);
  const estimatedAt = readEstimated(lines);
  const warnings = [...history.warnings, ...kwh.warnings, ...amount.warnings];
  if (!period) warnings.push("No billing period was found on the bill.");
  if (!kwh.kwh) warnings.push("No kWh figure for this period was found on the bill.");
  if (!amount.amountDue) warnings.push("No amount due was found on the bill.");
  if (estimatedAt) warnings.push(`The meter reading was estimated (page ${estimatedAt.page}, line ${estimatedAt.line}): this period's kWh is the utility's estimate.`);
  return {
    period,
    kwh: kwh.kwh,
    estimated: !!estimatedAt,
    amountDue: amount.amountDue,
    amountAlternatives: amount.alternatives,
    history: history.history,
    warnings,
  };
}

/** The reading as the command prints it (and as the corpus's expected files are written). */
export type BillJson = {
  current: {
    start: string | null;
    end: string | null;
    kwh: number | null;
    amountDueCents: number | null;
  };
  history: { month: string; kwh: number }[];
  source: "text" | "ocr";
  warnings: string[];
};

export function billJson(r: BillReading, source: "text" | "ocr"): BillJson {
  return {
    current: {
      start: r.period?.start.value ?? null,
      end: r.period?.end.value ?? null,
      kwh: r.kwh?.value ?? null,
      amountDueCents: r.amountDue?.value ?? null,
    },
    history: (r.history?.months ?? []).map((m) => ({
      month: m.month,
      kwh: m.kwh,
    })),
    source,
    warnings: r.warnings,
  };
}
