import fc from "fast-check";
import { npv as financialNpv, pv as financialPv } from "financial";
import { describe, expect, it } from "vitest";
import { buildThirdPartyCashflow, splitIncentiveRules, type ThirdPartyInput, type ThirdPartyTermsInput } from "./third-party";
import type { IncentiveRuleInput } from "./incentives";

// Present values are checked against the npm `financial` package (a port of numpy-financial):
// the stream is rebuilt here from the rate sheet by hand, then discounted by `financial`.
const monthlyKwh = [600, 700, 900, 1000, 1100, 1150, 1150, 1100, 950, 800, 650, 560]; // 10,660 kWh
const base = (terms: ThirdPartyTermsInput, overrides: Partial<ThirdPartyInput> = {}): ThirdPartyInput => ({
  terms,
  systemWattsDc: 8000,
  year1MonthlyProductionKwh: monthlyKwh,
  degradationPctPerYear: 0.5,
  billWithoutSolarCents: 240_000,
  billWithSolarCents: new Array(terms.termYears).fill(40_000),
  utilityEscalationPctPerYear: 2.5,
  discountRatePct: 5,
  ...overrides,
});
const monthlyRate = (annualPct: number) => Math.pow(1 + annualPct / 100, 1 / 12) - 1;

describe("lease", () => {
  it("per kWh, no escalator: the payments' present value is financial's annuity value", () => {
    // 10,660 kWh × 9 ¢ ÷ 12 = 7,995 ¢ a month, 240 months, 50,000 ¢ upfront.
    const terms: ThirdPartyTermsInput = { kind: "lease", partner: "Partner A", payment: { basis: "per-kwh", centsPerKwh: 9 }, escalatorPctPerYear: 0, termYears: 20, upfrontCents: 50_000 };
    const r = buildThirdPartyCashflow(base(terms));
    expect(r.monthlyPaymentsCents.every((p) => p === 7995)).toBe(true);
    const expected = 50_000 - financialPv(monthlyRate(5), 240, 7995);
    expect(r.summary.paymentsPresentValueCents).toBe(Math.round(expected));
    // 50,000 + 240 × 7,995 = 1,968,800 ¢.
    expect(r.summary.totalPaidCents).toBe(1_968_800);
    expect(r.summary.escalatorEffectCents).toBe(0);
  });

  it("per watt with a 2.9 % escalator: each year's payment, the totals and the present value", () => {
    // 8,000 W × 1.5 ¢/W = 12,000 ¢ a month in year 1; year 2: 12,000 × 1.029 = 12,348 ¢.
    const terms: ThirdPartyTermsInput = { kind: "lease", partner: "Partner A", payment: { basis: "per-watt", monthlyCentsPerWatt: 1.5 }, escalatorPctPerYear: 2.9, termYears: 25 };
    const r = buildThirdPartyCashflow(base(terms));
    expect(r.rows[1].systemPaymentCents).toBe(144_000);
    expect(r.rows[2].systemPaymentCents).toBe(12 * 12_348);
    expect(r.summary.firstYearMonthlyCents).toBe(12_000);
    const stream = Array.from({ length: 25 * 12 }, (_, i) => Math.round(12_000 * Math.pow(1.029, Math.floor(i / 12))));
    expect(r.monthlyPaymentsCents).toEqual(stream);
    const total = stream.reduce((a, b) => a + b, 0);
    expect(r.summary.totalPaidCents).toBe(total);
    expect(r.summary.escalatorEffectCents).toBe(total - 25 * 144_000);
    expect(r.summary.averageMonthlyCents).toBe(Math.round(total / 300));
    expect(Math.abs(r.summary.paymentsPresentValueCents - financialNpv(monthlyRate(5), [0, ...stream]))).toBeLessThanOrEqual(0.5);
  });
});

describe("PPA", () => {
  it("payments follow the degraded expected production: year 1 = 10,660 kWh × 14 ¢; year 2 each month × 0.995 × 1.02", () => {
    const terms: ThirdPartyTermsInput = { kind: "ppa", partner: "Partner B", centsPerKwh: 14, escalatorPctPerYear: 2, termYears: 20 };
    const r = buildThirdPartyCashflow(base(terms));
    // 600 × 14 = 8,400 ¢ in January … 10,660 × 14 = 149,240 ¢ in year 1.
    expect(r.monthlyPaymentsCents.slice(0, 12)).toEqual(monthlyKwh.map((k) => k * 14));
    expect(r.rows[1].systemPaymentCents).toBe(149_240);
    // January of year 2: 600 × 0.995 × 14 × 1.02 = 8,525.16 → 8,525 ¢.
    expect(r.monthlyPaymentsCents[12]).toBe(8525);
    const stream = Array.from({ length: 240 }, (_, i) => Math.round(monthlyKwh[i % 12] * Math.pow(0.995, Math.floor(i / 12)) * 14 * Math.pow(1.02, Math.floor(i / 12))));
    expect(r.monthlyPaymentsCents).toEqual(stream);
    expect(Math.abs(r.summary.paymentsPresentValueCents - financialNpv(monthlyRate(5), [0, ...stream]))).toBeLessThanOrEqual(0.5);
    expect(r.rows[2].productionKwh).toBeCloseTo(10_606.7, 1);
  });

  it("the yearly net flows (savings − payments) and their NPV, against financial", () => {
    const terms: ThirdPartyTermsInput = { kind: "ppa", partner: "Partner B", centsPerKwh: 14, escalatorPctPerYear: 2, termYears: 20, upfrontCents: 10_000 };
    const r = buildThirdPartyCashflow(base(terms, { homeownerIncentivesByYear: [0, 25_000] }));
    // Year 1: bills 240,000 − 40,000 = 200,000 ¢ saved; 25,000 ¢ rebate; 149,240 ¢ paid → 75,760 ¢.
    expect(r.rows[1].cashFlowCents).toBe(75_760);
    expect(r.rows[0].cashFlowCents).toBe(-10_000);
    expect(r.summary.npvCents).toBe(
      Math.round(
        financialNpv(
          0.05,
          r.rows.map((x) => x.cashFlowCents),
        ),
      ),
    );
    expect(r.summary.netSavingsCents).toBe(r.summary.lifetimeBillSavingsCents + 25_000 - r.summary.totalPaidCents);
  });
});

describe("properties (fast-check)", () => {
  it("total paid = upfront + every monthly payment; present value matches financial to the cent, and is not above the total at a non-negative rate", () => {
    const arbTerms = fc.oneof(
      fc.record({
        kind: fc.constant("lease" as const),
        partner: fc.constant("P"),
        payment: fc.record({ basis: fc.constant("per-watt" as const), monthlyCentsPerWatt: fc.double({ min: 0.5, max: 3, noNaN: true }) }),
        escalatorPctPerYear: fc.double({ min: 0, max: 4, noNaN: true }),
        termYears: fc.integer({ min: 1, max: 25 }),
        upfrontCents: fc.integer({ min: 0, max: 500_000 }),
      }),
      fc.record({
        kind: fc.constant("ppa" as const),
        partner: fc.constant("P"),
        centsPerKwh: fc.double({ min: 5, max: 30, noNaN: true }),
        escalatorPctPerYear: fc.double({ min: 0, max: 4, noNaN: true }),
        termYears: fc.integer({ min: 1, max: 25 }),
        upfrontCents: fc.integer({ min: 0, max: 500_000 }),
      }),
    );
    fc.assert(
      fc.property(arbTerms, fc.double({ min: 0, max: 12, noNaN: true }), (terms, rate) => {
        const r = buildThirdPartyCashflow(base(terms, { discountRatePct: rate }));
        const total = terms.upfrontCents + r.monthlyPaymentsCents.reduce((a, b) => a + b, 0);
        expect(r.summary.totalPaidCents).toBe(total);
        const expected = financialNpv(monthlyRate(rate), [terms.upfrontCents, ...r.monthlyPaymentsCents]);
        expect(Math.abs(r.summary.paymentsPresentValueCents - expected)).toBeLessThanOrEqual(0.5);
        expect(r.summary.paymentsPresentValueCents).toBeLessThanOrEqual(total);
      }),
      { numRuns: 80 },
    );
  });
});

describe("incentives go to the party that claims them", () => {
  const rules: IncentiveRuleInput[] = [
    { id: "credit", name: "30 % energy credit", amount: { kind: "percent", pct: 30 }, startDate: "2026-01-01", endDate: "2032-12-31" },
    { id: "rebate", name: "Utility rebate", amount: { kind: "fixed", amountCents: 50_000 }, startDate: "2026-01-01", endDate: "2032-12-31", eligibility: { payment: ["cash", "loan", "lease"] } },
  ];
  it("a rule is the homeowner's only when it names the lease or PPA; a rule open to any payment is the owner's", () => {
    const lease = splitIncentiveRules(rules, "lease");
    expect([lease.homeowner.map((r) => r.id), lease.owner.map((r) => r.id)]).toEqual([["rebate"], ["credit"]]);
    // The rebate is not for PPAs, and is nobody's here: the owner claims only rules open to any payment.
    const ppa = splitIncentiveRules(rules, "ppa");
    expect([ppa.homeowner.map((r) => r.id), ppa.owner.map((r) => r.id)]).toEqual([[], ["credit"]]);
  });
});

describe("input checks", () => {
  it("needs one bill with solar per year of the term", () => {
    const terms: ThirdPartyTermsInput = { kind: "ppa", partner: "Partner B", centsPerKwh: 14, escalatorPctPerYear: 2, termYears: 20 };
    expect(() => buildThirdPartyCashflow(base(terms, { billWithSolarCents: [1, 2] }))).toThrow(/billWithSolarCents: needs one value per year of the 20-year term/);
  });
});
