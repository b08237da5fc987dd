// What the rep confirmed from a bill, as rows of the bills table: the current period as read,
// and the months of its printed history, oldest first. A history that prints only months gets
// estimated periods: each ends where the next begins, back from the current period's start
// (a month long, or the printed days), or calendar months when the bill has no period.
import { addDays, addMonths, dayNumber } from "./dates";

type ConfirmedCurrent = {
  start: string;
  end: string;
  kwh: number;
  amountDueCents: number | null;
} | null;
export type ConfirmedMonth = {
  month: string;
  kwh: number;
  days: number | null;
  start: string | null;
  end: string | null;
};
export type BillTableRow = {
  periodStart: string;
  periodEnd: string;
  kwh: number;
  costCents: number | null;
  source: "bill" | "history";
  periodEstimated: boolean;
};

/** A usage year is twelve months: older history months than that are left out. */
const YEAR_MONTHS = 12;

const lastDay = (month: string) => addDays(addMonths(`${month}-01`, 1), -1);

export function billsFromReading(current: ConfirmedCurrent, history: readonly ConfirmedMonth[]): BillTableRow[] {
  const rows: BillTableRow[] = [];
  let months = [...history].filter((m) => m.kwh > 0).sort((a, b) => a.month.localeCompare(b.month));
  if (current) {
    rows.push({
      periodStart: current.start,
      periodEnd: current.end,
      kwh: current.kwh,
      costCents: current.amountDueCents,
      source: "bill",
      periodEstimated: false,
    });
    const endMonth = current.end.slice(0, 7);
    // The history's own line for the current bill (labelled by its read month, or by the month before with the same kWh).
    months = months.filter((m) => (m.start ? dayNumber(m.end!) <= dayNumber(current.start) : m.month < endMonth));
    const newest = months.at(-1);
    if (newest && !newest.start && newest.kwh === current.kwh && newest.month === addMonths(`${endMonth}-01`, -1).slice(0, 7)) months.pop();
  }
  months = months.slice(-(YEAR_MONTHS - rows.length));
  let anchor = current?.start ?? null;
  const older: BillTableRow[] = [];
  for (const m of [...months].reverse()) {
    let row: BillTableRow;
    if (m.start && m.end)
      row = {
        periodStart: m.start,
        periodEnd: m.end,
        kwh: m.kwh,
        costCents: null,
        source: "history",
        periodEstimated: false,
      };
    else if (anchor)
      row = {
        periodStart: m.days ? addDays(anchor, -m.days) : addMonths(anchor, -1),
        periodEnd: anchor,
        kwh: m.kwh,
        costCents: null,
        source: "history",
        periodEstimated: true,
      };
    else
      row = {
        periodStart: `${m.month}-01`,
        periodEnd: lastDay(m.month),
        kwh: m.kwh,
        costCents: null,
        source: "history",
        periodEstimated: true,
      };
    older.push(row);
    anchor = row.periodStart;
  }
  return [...older.reverse(), ...rows];
}
