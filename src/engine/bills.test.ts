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

/** One bill per calendar month of 2023 (start inclusive, end = first of next month, exclusive). */
function calendarBill(month: number, kwh: number): Bill {
  const pad = (n: number) => String(n).padStart(2, "0");
  const end = month === 12 ? "2024-01-01" : `2023-${pad(month + 1)}-01`;
  return { id: `m${month}`, startDate: `2023-${pad(month)}-01`, endDate: end, kwh };
}

describe("usageFromBills — spreading by day", () => {
  it("spreads two bills straddling month boundaries by day (hand-worked)", () => {
    // Hand-worked (our convention: start inclusive, end exclusive):
    // Bill A 2023-01-15 → 2023-02-14: 30 days (Jan 15–31 = 17, Feb 1–13 = 13), 600 kWh → 20 kWh/day
    //   Jan: 17 × 20 = 340 kWh; Feb: 13 × 20 = 260 kWh
    // Bill B 2023-02-14 → 2023-03-16: 30 days (Feb 14–28 = 15, Mar 1–15 = 15), 450 kWh → 15 kWh/day
    //   Feb: 15 × 15 = 225 kWh; Mar: 15 × 15 = 225 kWh
    // February: 28 of 28 days covered → measured, 260 + 225 = 485 kWh
    // January: 17 of 31 days (54.8 % ≥ 50 %) → measured, scaled: 340 / 17 × 31 = 620 kWh
    // March: 15 of 31 days (48.4 % < 50 %) → estimated from the seasonal shape
    const result = usageFromBills({
      bills: [
        { id: "A", startDate: "2023-01-15", endDate: "2023-02-14", kwh: 600, costCents: 9000 },
        { id: "B", startDate: "2023-02-14", endDate: "2023-03-16", kwh: 450, costCents: 7200 },
      ],
    });
    expect(result.months[0]).toMatchObject({ month: 1, status: "measured", coveredDays: 17 });
    expect(result.months[0].kwh).toBeCloseTo(620, 9);
    expect(result.months[1]).toMatchObject({ month: 2, status: "measured", coveredDays: 28, coverage: 1 });
    expect(result.months[1].kwh).toBeCloseTo(485, 9);
    expect(result.months[2]).toMatchObject({ month: 3, status: "estimated", coveredDays: 15 });
    expect(result.measuredMonths).toBe(2);
    expect(result.fillMethod).toBe("seasonal");
    // Average price: (9000 + 7200) / (600 + 450) = 15.43 ¢/kWh
    expect(result.averageCentsPerKwh).toBeCloseTo(16200 / 1050, 9);
    expect(result.warnings.some((w) => w.includes("Only 2 month(s) measured"))).toBe(true);
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
    expect(result.warnings.some((w) => w.includes("No bill covers 2023-02-01 to 2023-03-01"))).toBe(true);
  });
});

describe("usageFromBills — errors name the bills", () => {
  it("rejects overlapping periods, naming both bills", () => {
    const issues = issuesOf(() =>
      usageFromBills({
        bills: [
          { id: "Jan", startDate: "2023-01-01", endDate: "2023-02-01", kwh: 500 },
          { id: "Late Jan", startDate: "2023-01-25", endDate: "2023-02-25", kwh: 500 },
        ],
      }),
    );
    expect(issues).toHaveLength(1);
    expect(issues[0].path).toBe("bills.1.startDate");
    expect(issues[0].message).toContain('"Late Jan"');
    expect(issues[0].message).toContain('"Jan"');
    expect(issues[0].message).toContain("7 day(s)");
  });

  it("rejects impossible periods and kWh, every bad bill at once", () => {
    const issues = issuesOf(() =>
      usageFromBills({
        bills: [
          { startDate: "2023-03-01", endDate: "2023-02-01", kwh: 500 },
          { startDate: "2023-04-01", endDate: "2023-09-01", kwh: 500 },
          { startDate: "2023-10-01", endDate: "2023-11-01", kwh: 0 },
          { startDate: "2023-11-01", endDate: "2023-12-01", kwh: -4 },
        ],
      }),
    );
    expect(issues.map((i) => i.path)).toEqual(["bills.0.endDate", "bills.1.endDate", "bills.2.kwh", "bills.3.kwh"]);
    expect(issues[0].message).toContain("bill 1");
    expect(issues[1].message).toContain("153-day");
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
