// A household's usage year from what is stored for its deal: the newest interval data when there
// is some, else the bills filled by the engine. Pure, so the server's rebuild and the demo seed
// derive it the same way; the result is stored (deal_usage), never derived on a read.
import { usageFromBills } from "@/engine/bills";
import { spreadMonthlyToHourly } from "@/engine/load-shape";
import { HOUR_MONTH } from "@/engine/year-calendar";

export type UsageYear = {
  monthlyKwh: number[];
  /** Measured hours, or the months spread by the reference load shape; null with no usage. */
  hourlyKwh: number[] | null;
  annualKwh: number;
  source: "bills" | "interval" | "none";
  estimatedMonths: boolean[];
  warnings: string[];
  averageCentsPerKwh: number | null;
  fillMethod: string;
};

export type StoredBill = { id: string; periodStart: string; periodEnd: string; kwh: number; costCents: number | null };
export type StoredInterval = { hourlyKwh: number[]; coveragePct: number };

export const NO_USAGE: UsageYear = {
  monthlyKwh: new Array<number>(12).fill(0),
  hourlyKwh: null,
  annualKwh: 0,
  source: "none",
  estimatedMonths: new Array<boolean>(12).fill(true),
  warnings: [],
  averageCentsPerKwh: null,
  fillMethod: "none",
};

/** Below this share of measured hours the year says its gaps were filled (our choice). */
const FULL_COVERAGE_PCT = 90;

export function deriveUsageYear(bills: readonly StoredBill[], interval: StoredInterval | null): UsageYear {
  if (interval) {
    const monthly = new Array<number>(12).fill(0);
    interval.hourlyKwh.forEach((kwh, h) => (monthly[HOUR_MONTH[h]] += kwh));
    return {
      monthlyKwh: monthly,
      hourlyKwh: interval.hourlyKwh,
      annualKwh: monthly.reduce((a, b) => a + b, 0),
      source: "interval",
      estimatedMonths: monthly.map(() => false),
      warnings: interval.coveragePct < FULL_COVERAGE_PCT ? [`Interval data covers ${interval.coveragePct.toFixed(0)} % of the year; the gaps were filled.`] : [],
      averageCentsPerKwh: null,
      fillMethod: "interval",
    };
  }
  if (bills.length === 0) return NO_USAGE;
  const usage = usageFromBills({
    bills: bills.map((b) => ({ id: b.id, startDate: b.periodStart, endDate: b.periodEnd, kwh: b.kwh, costCents: b.costCents ?? undefined })),
    fill: "seasonal",
  });
  return {
    monthlyKwh: usage.monthlyKwh,
    hourlyKwh: spreadMonthlyToHourly(usage.monthlyKwh).hourlyKwh,
    annualKwh: usage.annualKwh,
    source: "bills",
    estimatedMonths: usage.months.map((m) => m.status === "estimated"),
    warnings: usage.warnings,
    averageCentsPerKwh: usage.averageCentsPerKwh,
    fillMethod: usage.fillMethod,
  };
}
