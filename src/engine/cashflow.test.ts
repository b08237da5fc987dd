import { describe, expect, it } from "vitest";
import fc from "fast-check";
import * as financial from "financial";
import { buildCashflow, paybackYears, type CashflowInput } from "./cashflow";
import { amortizeLoan } from "./finance";
import { EngineInputError } from "./errors";

const flatCase: CashflowInput = {
  grossPriceCents: 2_000_000,
  payment: { kind: "cash" },
  year1ProductionKwh: 10_000,
  degradationPctPerYear: 0,
  billWithoutSolarCents: 200_000,
  billWithSolarCents: 20_000,
  utilityEscalationPctPerYear: 0,
  discountRatePct: 0,
};

describe("buildCashflow — cash", () => {
  it("level savings: payback, ROI, NPV, LCOE (hand-worked)", () => {
    // Savings 200,000 − 20,000 = 180,000 ¢/yr for 25 years; cost 2,000,000 ¢.
    // Payback 2,000,000 / 180,000 = 11.111 years; lifetime savings 4,500,000.
    // ROI (4,500,000 − 2,000,000) / 2,000,000 = 1.25; NPV at 0 % = 2,500,000.
    // LCOE at 0 %: 2,000,000 ¢ / 250,000 kWh = 8 ¢/kWh.
    const { rows, summary } = buildCashflow(flatCase);
    expect(rows).toHaveLength(26);
    expect(rows[0].cashFlowCents).toBe(-2_000_000);
    expect(rows[25].cumulativeCents).toBe(2_500_000);
    expect(summary.paybackYears).toBeCloseTo(2_000_000 / 180_000, 10);
    expect(summary.simpleRoi).toBeCloseTo(1.25, 12);
    expect(summary.npvCents).toBe(2_500_000);
    expect(summary.lcoeCentsPerKwh).toBeCloseTo(8, 10);
    expect(summary.simpleLcoeCentsPerKwh).toBeCloseTo(8, 10);
    // IRR against the npm `financial` package (reference implementation of numpy-financial's irr).
    expect(summary.irr).toBeCloseTo(financial.irr(rows.map((r) => r.cashFlowCents)), 8);
  });

  it("applies degradation (Jordan & Kurtz 2013 default 0.5 %/yr) and 2.5 %/yr escalation (hand-worked)", () => {
    // Year-1 savings 240,000 − 24,000 = 216,000 ¢.
    // Year 2: without 240,000 × 1.025 = 246,000; with (240,000 − 216,000 × 0.995) × 1.025 = 25,080 × 1.025 = 25,707.
    // Year 25 production: 10,000 × 0.995^24 = 8,866.5 kWh.
    const { rows } = buildCashflow({
      ...flatCase,
      degradationPctPerYear: undefined,
      utilityEscalationPctPerYear: undefined,
      billWithoutSolarCents: 240_000,
      billWithSolarCents: 24_000,
    });
    expect(rows[2].billWithoutSolarCents).toBe(246_000);
    expect(rows[2].billWithSolarCents).toBe(25_707);
    expect(rows[2].savingsCents).toBe(246_000 - 25_707);
    expect(rows[25].productionKwh).toBeCloseTo(8866.5, 1);
  });

  it("takes per-year bills with solar and year-n incentives", () => {
    const years = 3;
    const { rows, summary } = buildCashflow({
      ...flatCase,
      years,
      grossPriceCents: 1_000_000,
      incentivesByYear: [100_000, 300_000],
      billWithSolarCents: [20_000, 25_000, 30_000],
    });
    // Year 0: −(1,000,000 − 100,000) = −900,000; year 1: 180,000 + 300,000 = 480,000; year 2: 175,000; year 3: 170,000.
    expect(rows.map((r) => r.cashFlowCents)).toEqual([-900_000, 480_000, 175_000, 170_000]);
    // Net cost: 900,000 − 300,000 = 600,000; cumulative −75,000 after year 3 → no payback.
    expect(summary.netCostCents).toBe(600_000);
    expect(summary.paybackYears).toBeNull();
  });
});

describe("buildCashflow — loan", () => {
  it("puts the down payment at year 0 and the amortisation payments in their years", () => {
    const input: CashflowInput = {
      ...flatCase,
      incentivesByYear: [0, 600_000],
      payment: { kind: "loan", aprPct: 6.99, termMonths: 240, dealerFeePct: 15, dealerFeeMode: "added", downPaymentCents: 200_000 },
    };
    const { rows, summary } = buildCashflow(input);
    const loan = amortizeLoan({ amountCents: 1_800_000, aprPct: 6.99, termMonths: 240, dealerFeePct: 15, dealerFeeMode: "added" });
    expect(rows[0].cashFlowCents).toBe(-200_000);
    const yearly = (y: number) => loan.schedule.slice((y - 1) * 12, y * 12).reduce((a, r) => a + r.paymentCents, 0);
    expect(rows[1].systemPaymentCents).toBe(yearly(1));
    expect(rows[20].systemPaymentCents).toBe(yearly(20));
    expect(rows[21].systemPaymentCents).toBe(0);
    expect(rows[1].cashFlowCents).toBe(180_000 + 600_000 - yearly(1));
    // Net cost: 200,000 down + all payments − 600,000 incentive.
    expect(summary.netCostCents).toBe(200_000 + loan.totalPaidCents - 600_000);
    expect(summary.loan?.financedCents).toBe(Math.round(1_800_000 / 0.85));
  });
});

describe("loan payments agree with the npm `financial` package (property test)", () => {
  it("each full year of the table pays 12 × round(−pmt(APR/12, n, financed))", () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 100_000, max: 10_000_000 }),
        fc.double({ min: 0.5, max: 25, noNaN: true }),
        fc.constantFrom(60, 120, 180, 240, 300),
        fc.double({ min: 0, max: 30, noNaN: true }),
        (price, apr, term, fee) => {
          const { rows, summary } = buildCashflow({
            ...flatCase,
            grossPriceCents: price,
            payment: { kind: "loan", aprPct: apr, termMonths: term, dealerFeePct: fee, dealerFeeMode: "added" },
          });
          const financed = summary.loan!.financedCents;
          expect(financed).toBe(Math.round(price / (1 - fee / 100)));
          const level = Math.round(-financial.pmt(apr / 100 / 12, term, financed));
          expect(Math.abs(summary.loan!.monthlyPaymentCents - level)).toBeLessThanOrEqual(1);
          // Every year before the last pays 12 level payments; the last month absorbs rounding.
          for (let y = 1; y < term / 12; y++) expect(rows[y].systemPaymentCents).toBe(12 * summary.loan!.monthlyPaymentCents);
          const paid = rows.reduce((a, r) => a + (r.year > 0 ? r.systemPaymentCents : 0), 0);
          expect(paid).toBe(financed + summary.loan!.totalInterestCents);
        },
      ),
      { numRuns: 100 },
    );
  });
});

describe("summary figures agree with the npm `financial` package (property test)", () => {
  it("NPV and IRR of the table's cash flows; every figure finite", () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 500_000, max: 8_000_000 }),
        fc.integer({ min: 50_000, max: 600_000 }),
        fc.double({ min: 0, max: 0.9, noNaN: true }),
        fc.double({ min: 0, max: 2, noNaN: true }),
        fc.double({ min: 0, max: 6, noNaN: true }),
        fc.double({ min: 0, max: 12, noNaN: true }),
        fc.boolean(),
        (price, without, offsetShare, degradation, escalation, discount, useLoan) => {
          const { rows, summary } = buildCashflow({
            grossPriceCents: price,
            payment: useLoan ? { kind: "loan", aprPct: 7, termMonths: 180, downPaymentCents: Math.round(price / 10) } : { kind: "cash" },
            year1ProductionKwh: 9000,
            degradationPctPerYear: degradation,
            billWithoutSolarCents: without,
            billWithSolarCents: Math.round(without * (1 - offsetShare)),
            utilityEscalationPctPerYear: escalation,
            discountRatePct: discount,
          });
          const flows = rows.map((r) => r.cashFlowCents);
          expect(Math.abs(summary.npvCents - financial.npv(discount / 100, flows))).toBeLessThanOrEqual(0.5 + 1e-9 * Math.abs(summary.npvCents));
          if (summary.irr !== null) {
            const ref = financial.irr(flows, 0.05, 1e-12, 1000);
            if (Number.isFinite(ref) && Math.abs(financial.npv(ref, flows)) < 1e-3 * price) expect(summary.irr).toBeCloseTo(ref, 5);
          }
          const numbers = [
            ...rows.flatMap((r) => Object.values(r)),
            summary.npvCents,
            summary.netCostCents,
            summary.lcoeCentsPerKwh ?? 0,
            summary.simpleRoi ?? 0,
            summary.paybackYears ?? 0,
          ];
          expect(numbers.every((x) => Number.isFinite(x))).toBe(true);
          expect(rows.every((r) => Number.isInteger(r.cashFlowCents) && Number.isInteger(r.cumulativeCents))).toBe(true);
        },
      ),
      { numRuns: 200 },
    );
  });
});

describe("paybackYears", () => {
  it("interpolates within the year and takes the last crossing (hand-worked)", () => {
    expect(paybackYears([-100, 40, 40, 40])).toBeCloseTo(2.5, 12); // −100 → −60 → −20 → +20: 2 + 20/40
    expect(paybackYears([0, 10, -20, 30])).toBeCloseTo(2 + 10 / 30, 12); // 0 → 10 → −10 → 20
    expect(paybackYears([0, 5])).toBe(0);
    expect(paybackYears([-100, 10])).toBeNull();
  });
});

describe("validation", () => {
  it("names the bad fields", () => {
    try {
      buildCashflow({ ...flatCase, years: 3, billWithSolarCents: [1, 2], grossPriceCents: -1, year1ProductionKwh: Number.POSITIVE_INFINITY });
      throw new Error("expected failure");
    } catch (e) {
      expect(e).toBeInstanceOf(EngineInputError);
      const paths = (e as EngineInputError).issues.map((i) => i.path);
      expect(paths).toEqual(expect.arrayContaining(["grossPriceCents", "year1ProductionKwh"]));
    }
    expect(() => buildCashflow({ ...flatCase, years: 3, billWithSolarCents: [1, 2] })).toThrow(/one value per year/);
    expect(() => buildCashflow({ ...flatCase, incentivesByYear: [3_000_000] })).toThrow(/exceed the price/);
  });
});
