import { describe, expect, it } from "vitest";
import { usageFromBills } from "@/engine/bills";
import { billsFromReading, type ConfirmedMonth } from "./to-bills";

const month = (m: string, kwh: number, days: number | null = null): ConfirmedMonth => ({ month: m, kwh, days, start: null, end: null });
const thirteen = ["2024-11", "2024-12", "2025-01", "2025-02", "2025-03", "2025-04", "2025-05", "2025-06", "2025-07", "2025-08", "2025-09", "2025-10", "2025-11"];

/** A bill of 10/28 to 11/25/2025 with 972 kWh and no amount. */
const current972 = { start: "2025-10-28", end: "2025-11-25", kwh: 972, amountDueCents: null };

describe("billsFromReading", () => {
  it("a 13-month history and the current bill: twelve rows, the history's periods chained back from the current start", () => {
    const rows = billsFromReading(
      {
        start: "2025-10-28",
        end: "2025-11-25",
        kwh: 972,
        amountDueCents: 14291,
      },
      thirteen.map((m, i) => month(m, 900 + i)),
    );
    expect(rows).toHaveLength(12);
    expect(rows.at(-1)).toEqual({
      periodStart: "2025-10-28",
      periodEnd: "2025-11-25",
      kwh: 972,
      costCents: 14291,
      source: "bill",
      periodEstimated: false,
    });
    expect(rows.at(-2)).toEqual({
      periodStart: "2025-09-28",
      periodEnd: "2025-10-28",
      kwh: 911,
      costCents: null,
      source: "history",
      periodEstimated: true,
    });
    expect(rows[0]).toMatchObject({
      periodStart: "2024-11-28",
      periodEnd: "2024-12-28",
      kwh: 901,
    });
    // The engine takes them as one gap-free year.
    const usage = usageFromBills({
      bills: rows.map((r) => ({
        startDate: r.periodStart,
        endDate: r.periodEnd,
        kwh: r.kwh,
      })),
      fill: "seasonal",
    });
    expect(usage.warnings.filter((w) => /No bill covers|overlap/.test(w))).toEqual([]);
  });

  it("printed days set the estimated starts", () => {
    const rows = billsFromReading(current972, [month("2025-09", 800, 30), month("2025-10", 850, 31), month("2025-11", 972, 28)]);
    expect(rows.map((r) => [r.periodStart, r.periodEnd])).toEqual([
      ["2025-08-28", "2025-09-27"],
      ["2025-09-27", "2025-10-28"],
      ["2025-10-28", "2025-11-25"],
    ]);
  });

  it("a history labelled by the month before the read, with the current bill's kWh: that line is the current bill", () => {
    const rows = billsFromReading(current972, [month("2025-09", 800), month("2025-10", 972)]);
    expect(rows.map((r) => r.kwh)).toEqual([800, 972]);
  });

  it("no period on the bill: calendar months; printed periods are kept as printed", () => {
    expect(billsFromReading(null, [month("2025-02", 700)])).toEqual([
      {
        periodStart: "2025-02-01",
        periodEnd: "2025-02-28",
        kwh: 700,
        costCents: null,
        source: "history",
        periodEstimated: true,
      },
    ]);
    expect(
      billsFromReading(null, [
        {
          month: "2025-01",
          kwh: 900,
          days: 31,
          start: "2025-01-01",
          end: "2025-02-01",
        },
      ])[0],
    ).toMatchObject({
      periodStart: "2025-01-01",
      periodEnd: "2025-02-01",
      periodEstimated: false,
    });
  });
});
