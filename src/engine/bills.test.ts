import { describe, expect, it } from "vitest";
import { dailyMeanTempC, fitDegreeDayModel, monthlyDegreeDays, usageFromBills, type Bill } from "./bills";
import { referenceMonthlyKwh } from "./load-shape";
import { EngineInputError } from "./errors";
import { MONTH_DAYS, MONTH_START_DAY } from "./year-calendar";

function issuesOf(fn: () => unknown): { path: string; message: string }[] {
  try {
    fn();
  } catch (e) {
    if (e instanceof EngineInputError) return e.issues;
    throw e;
  }
  throw new Error("expected an EngineInputError");
}

const pad = (n: number) => String(n).padStart(2, "0");
/** One bill per calendar month of 2023, first to last day (both days included). */
function calendarBill(month: number, kwh: number): Bill {
  return { id: `m${month}`, startDate: `2023-${pad(month)}-01`, endDate: `2023-${pad(month)}-${MONTH_DAYS[month - 1]}`, kwh };
}

describe("usageFromBills — spreading by day", () => {
  it("spreads two bills straddling month boundaries by day (hand-worked)", () => {
    // Hand-worked (our convention: both dates included; a bill starting on another's end date
    // takes that day, as with meter-read dates):
    // Bill A 2023-01-15 → 2023-02-14, and B starts 2023-02-14, so A covers Jan 15 – Feb 13:
    //   30 days (Jan 15–31 = 17, Feb 1–13 = 13), 600 kWh → 20 kWh/day: Jan 340, Feb 260
    // Bill B 2023-02-14 → 2023-03-16, nothing starts on 16 March, so Feb 14 – Mar 16 inclusive:
    //   31 days (Feb 14–28 = 15, Mar 1–16 = 16), 450 kWh → 450/31 kWh/day: Feb 217.742, Mar 232.258
    // February: 28 of 28 days → measured, 260 + 15 × 450/31 = 477.742 kWh
    // January: 17 of 31 days (54.8 % > 50 %) → measured, scaled: 340 / 17 × 31 = 620 kWh
    // March: 16 of 31 days (51.6 % > 50 %) → measured, scaled: 16 × 450/31 / 16 × 31 = 450 kWh
    const result = usageFromBills({
      bills: [
        { id: "A", startDate: "2023-01-15", endDate: "2023-02-14", kwh: 600, costCents: 9000 },
        { id: "B", startDate: "2023-02-14", endDate: "2023-03-16", kwh: 450, costCents: 7200 },
      ],
    });
    expect(result.months[0]).toMatchObject({ month: 1, status: "measured", coveredDays: 17 });
    expect(result.months[0].kwh).toBeCloseTo(620, 9);
    expect(result.months[1]).toMatchObject({ month: 2, status: "measured", coveredDays: 28, coverage: 1 });
    expect(result.months[1].kwh).toBeCloseTo(260 + (15 * 450) / 31, 9);
    expect(result.months[2]).toMatchObject({ month: 3, status: "measured", coveredDays: 16 });
    expect(result.months[2].kwh).toBeCloseTo(450, 9);
    expect(result.measuredMonths).toBe(3);
    expect(result.fillMethod).toBe("seasonal");
    // Average price: (9000 + 7200) / (600 + 450) = 15.43 ¢/kWh
    expect(result.averageCentsPerKwh).toBeCloseTo(16200 / 1050, 9);
    expect(result.warnings).toContain("3 month(s) measured; estimated: April, May, June, July, August, September, October, November, December (billed days kept, the rest filled in).");
  });

  it("a bill from 1 to 31 January is a full January: nothing scaled", () => {
    const result = usageFromBills({ bills: [{ startDate: "2023-01-01", endDate: "2023-01-31", kwh: 744 }] });
    expect(result.months[0]).toMatchObject({ status: "measured", coveredDays: 31, coverage: 1, kwh: 744 });
    expect(result.warnings.some((w) => w.includes("scaled up"))).toBe(false);
    // Printed with meter-read dates (same day of the month at both ends): 1 March – 1 April is March.
    const read = usageFromBills({ bills: [{ startDate: "2023-03-01", endDate: "2023-04-01", kwh: 620 }] });
    expect(read.months[2]).toMatchObject({ coveredDays: 31, coverage: 1, kwh: 620 });
    expect(read.months[3].coveredDays).toBe(0);
  });

  it("a month covered half or less keeps its billed kWh and fills only the uncovered days", () => {
    // January full (744 kWh); February 1–10 (100 kWh, 10 of 28 days = 35.7 % → estimated).
    // Seasonal fill: scale = 744 / ref[Jan]; February = 100 + ref[Feb] × scale × 18/28.
    const ref = referenceMonthlyKwh();
    const result = usageFromBills({
      bills: [
        { startDate: "2023-01-01", endDate: "2023-01-31", kwh: 744 },
        { startDate: "2023-02-01", endDate: "2023-02-10", kwh: 100 },
      ],
    });
    expect(result.months[1]).toMatchObject({ status: "estimated", coveredDays: 10 });
    expect(result.months[1].kwh).toBeCloseTo(100 + ((ref[1] * 744) / ref[0]) * (18 / 28), 9);
    expect(result.warnings.find((w) => w.startsWith("1 month(s) measured; estimated: February,"))).toBeDefined();
  });

  it("twelve monthly bills on meter-read dates are a year, not more; thirteen are more", () => {
    // Reads on the 14th from 2023-01-14 to 2024-01-14: 12 bills, 365 days in all.
    const reads = Array.from({ length: 14 }, (_, k) => `${2023 + Math.floor(k / 12)}-${pad((k % 12) + 1)}-14`);
    const bills = (n: number) => Array.from({ length: n }, (_, k) => ({ startDate: reads[k], endDate: reads[k + 1], kwh: 900 }));
    const year = usageFromBills({ bills: bills(12) });
    expect(year.measuredMonths).toBe(12);
    expect(year.warnings.some((w) => w.includes("more than a year"))).toBe(false);
    // The last bill (2023-12-14 – 2024-01-14) has the same day of the month at both ends: read dates too.
    expect(year.months.reduce((a, m) => a + m.coveredDays, 0)).toBe(365);
    const more = usageFromBills({ bills: bills(13) });
    expect(more.warnings.some((w) => w.includes("more than a year"))).toBe(true);
  });

  it("fills missing months from the reference load's monthly shape", () => {
    // Measured: January 750 kWh and July 1684 kWh = 2 × the reference (≈375, ≈842) → scale ≈ 2.
    const ref = referenceMonthlyKwh();
    const result = usageFromBills({ bills: [calendarBill(1, 2 * ref[0]), calendarBill(7, 2 * ref[6])] });
    expect(result.fillMethod).toBe("seasonal");
    result.monthlyKwh.forEach((v, m) => expect(v).toBeCloseTo(2 * ref[m], 6));
    expect(result.months.filter((m) => m.status === "estimated")).toHaveLength(10);
  });

  it("uses a custom seasonal shape when given", () => {
    const result = usageFromBills({ bills: [calendarBill(1, 100)], seasonalShape: [1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12] });
    expect(result.monthlyKwh[11]).toBeCloseTo(1200, 9);
  });

  it("reports gaps between bills", () => {
    const result = usageFromBills({ bills: [calendarBill(1, 500), calendarBill(3, 500)] });
    expect(result.warnings).toContain("No bill covers 28 day(s) between 2023-01-31 and 2023-03-01.");
  });
});

describe("usageFromBills — errors name the bills", () => {
  it("rejects overlapping periods, naming both bills", () => {
    const issues = issuesOf(() =>
      usageFromBills({
        bills: [
          { id: "Jan", startDate: "2023-01-01", endDate: "2023-01-31", kwh: 500 },
          { id: "Late Jan", startDate: "2023-01-25", endDate: "2023-02-25", kwh: 500 },
        ],
      }),
    );
    expect(issues).toHaveLength(1);
    expect(issues[0].path).toBe("bills.1.startDate");
    expect(issues[0].message).toContain('"Late Jan"');
    expect(issues[0].message).toContain('"Jan"');
    expect(issues[0].message).toContain("7 day(s)"); // 25 – 31 January
  });

  it("rejects impossible periods and kWh, every bad bill at once", () => {
    const issues = issuesOf(() =>
      usageFromBills({
        bills: [
          { startDate: "2023-03-01", endDate: "2023-02-01", kwh: 500 },
          { startDate: "2023-04-01", endDate: "2023-09-02", kwh: 500 },
          { startDate: "2023-10-01", endDate: "2023-11-01", kwh: 0 },
          { startDate: "2023-11-01", endDate: "2023-12-01", kwh: -4 },
        ],
      }),
    );
    expect(issues.map((i) => i.path)).toEqual(["bills.0.endDate", "bills.1.endDate", "bills.2.kwh", "bills.3.kwh"]);
    expect(issues[0].message).toContain("bill 1");
    expect(issues[1].message).toContain("155-day"); // 1 April – 2 September, both included
  });

  it("rejects malformed dates via the schema", () => {
    const issues = issuesOf(() => usageFromBills({ bills: [{ startDate: "2023-02-30", endDate: "2023-03-01", kwh: 5 }] }));
    expect(issues[0].path).toBe("bills.0.startDate");
  });
});

describe("PRISM-style degree-day fill (Fels 1986)", () => {
  // Synthetic typical year: daily mean 15 − 12·cos(2π(d − 15)/365) °C with a ±4 °C daily swing
  // (zero mean within each day, so daily means are exact).
  const hourlyTempC = Array.from({ length: 8760 }, (_, h) => {
    const d = Math.floor(h / 24);
    const daily = 15 - 12 * Math.cos((2 * Math.PI * (d - 15)) / 365);
    return daily + 4 * Math.sin((2 * Math.PI * (h % 24)) / 24);
  });
  // Known model: α = 12 kWh/day, β_h = 0.8 kWh/HDD at τ_h = 16 °C, β_c = 1.5 kWh/CDD at τ_c = 22 °C.
  const dd = monthlyDegreeDays(dailyMeanTempC(hourlyTempC), 16, 22);
  const trueMonthly = MONTH_DAYS.map((days, m) => 12 * days + 0.8 * dd.hdd[m] + 1.5 * dd.cdd[m]);
  const measured = [1, 2, 3, 4, 6, 7, 8, 10, 12];

  it("computes daily means from hourly temperatures", () => {
    const daily = dailyMeanTempC(hourlyTempC);
    expect(daily[MONTH_START_DAY[6] + 10]).toBeCloseTo(15 - 12 * Math.cos((2 * Math.PI * (191 - 15)) / 365), 9);
  });

  it("recovers known α, β and reference temperatures from synthetic monthly data", () => {
    const fit = fitDegreeDayModel(
      measured.map((month) => ({ month: month - 1, kwhPerDay: trueMonthly[month - 1] / MONTH_DAYS[month - 1] })),
      hourlyTempC,
    );
    expect(fit).not.toBeNull();
    expect(fit!.model).toBe("heating+cooling");
    expect(fit!.heatingBaseC).toBe(16);
    expect(fit!.coolingBaseC).toBe(22);
    expect(fit!.alphaKwhPerDay).toBeCloseTo(12, 6);
    expect(fit!.betaHeatingKwhPerDegreeDay).toBeCloseTo(0.8, 6);
    expect(fit!.betaCoolingKwhPerDegreeDay).toBeCloseTo(1.5, 6);
    expect(fit!.r2).toBeCloseTo(1, 9);
  });

  it("fills the unmeasured months from the fit in usageFromBills", () => {
    const result = usageFromBills({
      bills: measured.map((month) => calendarBill(month, trueMonthly[month - 1])),
      hourlyTempC,
    });
    expect(result.fillMethod).toBe("degree-day");
    expect(result.measuredMonths).toBe(9);
    for (const month of [5, 9, 11]) {
      expect(result.months[month - 1].status).toBe("estimated");
      expect(result.monthlyKwh[month - 1]).toBeCloseTo(trueMonthly[month - 1], 4);
    }
  });

  it("falls back to the seasonal shape with fewer than 6 measured months", () => {
    const result = usageFromBills({
      bills: [1, 2, 3, 4].map((month) => calendarBill(month, trueMonthly[month - 1])),
      hourlyTempC,
    });
    expect(result.fillMethod).toBe("seasonal");
    expect(result.warnings.some((w) => w.includes("at least 6 measured months"))).toBe(true);
  });
});
