import { describe, expect, it } from "vitest";
import fc from "fast-check";
import * as financial from "financial";
import { amortizeLoan, irr, irrVerdict, npv, pmt } from "./finance";
import { EngineInputError } from "./errors";

describe("pmt", () => {
  it("matches numpy-financial's documented example", () => {
    // numpy-financial docs, `pmt`: pmt(0.075/12, 12*15, 200000) = -1854.0247200054619
    expect(pmt(0.075 / 12, 180, 200000)).toBeCloseTo(-1854.0247, 4);
  });

  it("handles a zero rate as a straight division", () => {
    expect(pmt(0, 10, 1000)).toBeCloseTo(-100, 10);
  });

  it("agrees with the npm `financial` package (reference implementation)", () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0.0001, max: 0.05, noNaN: true }),
        fc.integer({ min: 1, max: 480 }),
        fc.double({ min: 100, max: 1e7, noNaN: true }),
        fc.constantFrom<0 | 1>(0, 1),
        (rate, nper, pv, when) => {
          const ours = pmt(rate, nper, pv, 0, when);
          const ref = financial.pmt(rate, nper, pv, 0, when === 0 ? financial.PaymentDueTime.End : financial.PaymentDueTime.Begin);
          expect(Math.abs(ours - ref)).toBeLessThanOrEqual(1e-9 * Math.max(1, Math.abs(ref)));
        },
      ),
    );
  });
});

describe("npv", () => {
  it("matches numpy-financial's documented example (first value at t = 0)", () => {
    // numpy-financial docs, `npv`: npv(0.08, [-40_000, 5_000, 8_000, 12_000, 30_000]) = 3065.22266817
    expect(npv(0.08, [-40000, 5000, 8000, 12000, 30000])).toBeCloseTo(3065.2227, 4);
  });

  it("agrees with the npm `financial` package", () => {
    fc.assert(
      fc.property(
        fc.double({ min: -0.5, max: 1, noNaN: true }),
        fc.array(fc.double({ min: -1e6, max: 1e6, noNaN: true }), { minLength: 1, maxLength: 30 }),
        (rate, values) => {
          const ours = npv(rate, values);
          const ref = financial.npv(rate, values);
          expect(Math.abs(ours - ref)).toBeLessThanOrEqual(1e-7 * Math.max(1, Math.abs(ref)));
        },
      ),
    );
  });
});

describe("irr", () => {
  it("matches numpy-financial's documented example", () => {
    // numpy-financial docs, `irr`: round(npf.irr([-100, 39, 59, 55, 20]), 5) = 0.28095
    expect(irr([-100, 39, 59, 55, 20])).toBeCloseTo(0.28095, 5);
  });

  it("returns null when the values never change sign", () => {
    expect(irr([100, 20, 30])).toBeNull();
    expect(irr([-100, -20])).toBeNull();
    expect(irr([0, 0, 0])).toBeNull();
  });

  it("handles a negative rate", () => {
    // Hand check: -100 then 90 one period later → (90/100) - 1 = -0.10
    expect(irr([-100, 90])).toBeCloseTo(-0.1, 10);
  });

  it("agrees with the npm `financial` package on conventional cash flows, and zeroes the NPV", () => {
    fc.assert(
      fc.property(
        fc.double({ min: 1000, max: 50000, noNaN: true }),
        fc.array(fc.double({ min: 0, max: 10000, noNaN: true }), { minLength: 2, maxLength: 25 }),
        (cost, inflows) => {
          fc.pre(inflows.reduce((a, b) => a + b, 0) > 0.2 * cost);
          const values = [-cost, ...inflows];
          const ours = irr(values);
          expect(ours).not.toBeNull();
          const r = ours as number;
          expect(Math.abs(npv(r, values))).toBeLessThan(1e-6 * cost);
          const ref = financial.irr(values, 0.1, 1e-10, 500);
          if (Number.isFinite(ref) && ref > -1 && Math.abs(npv(ref, values)) < 1e-6 * cost) {
            // A conventional flow (one sign change) has one root (Descartes' rule of signs).
            expect(r).toBeCloseTo(ref, 6);
          }
        },
      ),
    );
  });
});

describe("amortizeLoan", () => {
  it("pays a loan off to exactly zero with the numpy-financial payment", () => {
    // Same loan as numpy-financial's pmt example: $200,000 at 7.5 % APR over 180 months → $1,854.02
    const loan = amortizeLoan({ amountCents: 20_000_000, aprPct: 7.5, termMonths: 180 });
    expect(loan.monthlyPaymentCents).toBe(185402);
    expect(loan.schedule).toHaveLength(180);
    expect(loan.schedule[179].balanceCents).toBe(0);
    expect(loan.totalPaidCents - loan.totalInterestCents).toBe(20_000_000);
    // First month's interest: 200,000 × 0.075/12 = 1,250.00
    expect(loan.schedule[0].interestCents).toBe(125000);
  });

  it("grosses the loan up when the dealer fee is added, keeps it when deducted", () => {
    // added: 20,000 / (1 − 0.20) = 25,000 financed; fee 5,000; installer receives 20,000.
    const added = amortizeLoan({ amountCents: 2_000_000, aprPct: 5, termMonths: 120, dealerFeePct: 20, dealerFeeMode: "added" });
    expect(added.financedCents).toBe(2_500_000);
    expect(added.dealerFeeCents).toBe(500_000);
    expect(added.installerProceedsCents).toBe(2_000_000);
    // deducted: 20,000 financed; fee 4,000 withheld; installer receives 16,000.
    const deducted = amortizeLoan({ amountCents: 2_000_000, aprPct: 5, termMonths: 120, dealerFeePct: 20, dealerFeeMode: "deducted" });
    expect(deducted.financedCents).toBe(2_000_000);
    expect(deducted.installerProceedsCents).toBe(1_600_000);
  });

  it("handles a 0 % APR loan", () => {
    const loan = amortizeLoan({ amountCents: 1_200_000, aprPct: 0, termMonths: 12 });
    expect(loan.monthlyPaymentCents).toBe(100_000);
    expect(loan.totalInterestCents).toBe(0);
  });

  it("rejects bad input naming the field", () => {
    expect(() => amortizeLoan({ amountCents: -5, aprPct: 5, termMonths: 12 })).toThrow(EngineInputError);
    // Fails when nothing is thrown, or something else is.
    const err = (() => {
      try {
        amortizeLoan({ amountCents: 100, aprPct: 5, termMonths: 0 });
      } catch (e) {
        return e;
      }
      return null;
    })();
    expect(err).toBeInstanceOf(EngineInputError);
    expect((err as EngineInputError).issues[0].path).toBe("termMonths");
  });
});

describe("irrVerdict: an IRR only when it means something", () => {
  it("one root: the IRR (numpy-financial docs example, 0.28095)", () => {
    const v = irrVerdict([-100, 39, 59, 55, 20]);
    expect(v.irr).toBeCloseTo(0.28095, 5);
    expect(v.reason).toBeNull();
  });
  it("two roots: not meaningful, both named (−100, +230, −132 has NPV 0 at 10 % and 20 %, hand-worked: 1.1² = 1.21, 1.2² = 1.44)", () => {
    const v = irrVerdict([-100, 230, -132]);
    expect(v.irr).toBeNull();
    expect(v.reason).toBe("not meaningful: the yearly cash flow changes sign more than once and 2 rates (10.0 %, 20.0 %) each bring the net present value to zero");
  });
  it("no sign change: not meaningful, with the reason", () => {
    expect(irrVerdict([0, 10, 10]).reason).toContain("no money is paid out");
    expect(irrVerdict([-10, -1, 0]).reason).toContain("never turn positive");
  });
});
