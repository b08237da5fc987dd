/**
 * Time-value-of-money helpers and loan amortisation.
 *
 * pmt, npv and irr follow the numpy-financial conventions (numpy-financial docs, 2019+):
 * payments are signed (money paid out is negative), `npv` discounts the first value at t = 0,
 * and `irr` is the rate at which `npv` is zero.
 */
import { z } from "zod";
import { EngineInputError, parseOrThrow } from "./errors";

/** When payments fall within each period: at its end (0, the default) or its beginning (1). */
export type PaymentTiming = 0 | 1;

function assertFinite(name: string, value: number): void {
  if (!Number.isFinite(value)) {
    throw new EngineInputError([{ path: name, message: "must be a finite number" }]);
  }
}

/**
 * Periodic payment of a loan or annuity (numpy-financial `pmt`):
 *   pmt = −(fv + pv·(1+r)^n)·r / ((1 + r·when)·((1+r)^n − 1)),  and −(fv + pv)/n when r = 0.
 * Example (numpy-financial docs): pmt(0.075/12, 12*15, 200000) = −1854.0247.
 */
export function pmt(rate: number, nper: number, pv: number, fv = 0, when: PaymentTiming = 0): number {
  assertFinite("rate", rate);
  assertFinite("nper", nper);
  assertFinite("pv", pv);
  assertFinite("fv", fv);
  if (nper <= 0) throw new EngineInputError([{ path: "nper", message: "must be greater than 0" }]);
  if (rate <= -1) throw new EngineInputError([{ path: "rate", message: "must be greater than -1" }]);
  if (rate === 0) return -(fv + pv) / nper;
  const growth = Math.pow(1 + rate, nper);
  return (-(fv + pv * growth) * rate) / ((1 + rate * when) * (growth - 1));
}

/**
 * Net present value with the numpy-financial convention: the first value is at t = 0 and is
 * not discounted: npv = Σ values[t] / (1+r)^t.
 * Example (numpy-financial docs): npv(0.08, [−40000, 5000, 8000, 12000, 30000]) = 3065.2227.
 */
export function npv(rate: number, values: readonly number[]): number {
  assertFinite("rate", rate);
  if (rate <= -1) throw new EngineInputError([{ path: "rate", message: "must be greater than -1" }]);
  let total = 0;
  let factor = 1;
  for (let t = 0; t < values.length; t++) {
    const v = values[t];
    if (!Number.isFinite(v)) throw new EngineInputError([{ path: `values.${t}`, message: "must be a finite number" }]);
    total += v / factor;
    factor *= 1 + rate;
  }
  return total;
}

/** d(npv)/d(rate) for Newton's method. */
function npvDerivative(rate: number, values: readonly number[]): number {
  let total = 0;
  for (let t = 1; t < values.length; t++) total -= (t * values[t]) / Math.pow(1 + rate, t + 1);
  return total;
}

const IRR_LOWEST_RATE = -0.99;
const IRR_HIGHEST_RATE = 100;
const IRR_TOLERANCE = 1e-12;

/**
 * Internal rate of return: the rate r where npv(r, values) = 0.
 *
 * Returns null when the values never change sign (no rate can make the NPV zero) or no root is
 * found in (−99 %, 10 000 %). When several roots exist, the one closest to 0 is returned (the
 * same choice numpy-financial makes). Method: the rate axis is scanned for sign changes of the
 * NPV, then each bracket is refined with Newton steps that fall back to bisection whenever a
 * step leaves the bracket (a safeguarded Newton, Press et al. 2007 "rtsafe", from memory).
 * Example (numpy-financial docs): irr([−100, 39, 59, 55, 20]) = 0.28095.
 */
export function irr(values: readonly number[]): number | null {
  const roots = irrRoots(values);
  return roots.reduce<number | null>((best, r) => pickCloserToZero(best, r), null);
}

/**
 * Every rate in (−99 %, 10 000 %) where the NPV of the values is zero, lowest first (found as
 * irr() finds one). More than one appears when the flows change sign more than once (Descartes'
 * rule of signs bounds their number by the sign changes).
 */
export function irrRoots(values: readonly number[]): number[] {
  values.forEach((v, t) => {
    if (!Number.isFinite(v)) throw new EngineInputError([{ path: `values.${t}`, message: "must be a finite number" }]);
  });
  if (!values.some((v) => v > 0) || !values.some((v) => v < 0)) return [];
  // Scan a grid that is fine near 0 and coarser further out.
  const grid: number[] = [];
  for (let r = IRR_LOWEST_RATE; r < 1; r += 0.01) grid.push(r);
  for (let r = 1; r <= IRR_HIGHEST_RATE; r *= 1.05) grid.push(r);
  const roots: number[] = [];
  let prevRate = grid[0];
  let prevNpv = npv(prevRate, values);
  for (let i = 1; i < grid.length; i++) {
    const rate = grid[i];
    const value = npv(rate, values);
    const root =
      prevNpv === 0 ? prevRate : Math.sign(value) !== Math.sign(prevNpv) && Number.isFinite(value) && Number.isFinite(prevNpv) ? refineRoot(values, prevRate, rate, prevNpv) : null;
    // A root on a grid point is seen from both sides: keep it once.
    if (root !== null && !roots.some((r) => Math.abs(r - root) <= 1e-9 * Math.max(1, Math.abs(root)))) roots.push(root);
    prevRate = rate;
    prevNpv = value;
  }
  return roots;
}

/** Why there is no IRR when no rate makes the NPV zero (readers word them by these exact texts). */
export const IRR_REASONS = {
  noOutlay: "not meaningful: no money is paid out, so there is nothing to earn a return on",
  neverPositive: "not meaningful: the cash flows never turn positive",
  noRoot: "not meaningful: no rate between −99 % and 10,000 % brings the net present value to zero",
} as const;
/** The reason when several rates make the NPV zero: how many, and which. */
export const IRR_MANY_ROOTS = /^not meaningful: the yearly cash flow changes sign more than once and (\d+) rates \((.*)\) each bring the net present value to zero$/;

/**
 * The IRR when it means something: exactly one rate makes the NPV zero. Otherwise null with the
 * reason a person can read (no rate at all, or several, as with a loan whose payments outlast
 * the savings and turn the flows negative again: the "multiple IRR" problem, e.g. Brealey, Myers
 * & Allen, "Principles of Corporate Finance", ch. 5, from memory).
 */
export function irrVerdict(values: readonly number[]): { irr: number | null; reason: string | null } {
  const roots = irrRoots(values);
  if (roots.length === 1) return { irr: roots[0], reason: null };
  if (roots.length === 0) {
    const reason = !values.some((v) => v < 0) ? IRR_REASONS.noOutlay : !values.some((v) => v > 0) ? IRR_REASONS.neverPositive : IRR_REASONS.noRoot;
    return { irr: null, reason };
  }
  const list = roots.map((r) => `${(r * 100).toFixed(1)} %`).join(", ");
  return { irr: null, reason: `not meaningful: the yearly cash flow changes sign more than once and ${roots.length} rates (${list}) each bring the net present value to zero` };
}

function pickCloserToZero(current: number | null, candidate: number): number {
  return current === null || Math.abs(candidate) < Math.abs(current) ? candidate : current;
}

function refineRoot(values: readonly number[], low: number, high: number, npvLow: number): number {
  let a = low;
  let b = high;
  let fa = npvLow;
  let x = (a + b) / 2;
  for (let i = 0; i < 200; i++) {
    const fx = npv(x, values);
    if (fx === 0) return x;
    if (Math.sign(fx) === Math.sign(fa)) {
      a = x;
      fa = fx;
    } else {
      b = x;
    }
    const slope = npvDerivative(x, values);
    let next = slope !== 0 ? x - fx / slope : NaN;
    if (!(next > a && next < b)) next = (a + b) / 2; // Newton left the bracket: bisect
    if (Math.abs(next - x) < IRR_TOLERANCE * Math.max(1, Math.abs(x))) return next;
    x = next;
  }
  return x;
}

// ---------------------------------------------------------------------------------------------
// Loans
// ---------------------------------------------------------------------------------------------

/**
 * How the lender's dealer fee is handled (both are common practice in residential solar
 * lending; the lender withholds the fee, as a % of the loan amount, from what it pays the
 * installer):
 * - "added": the fee is added to the homeowner's loan, grossed up so that after the lender
 *   withholds fee% of the loan the installer still receives the amount to finance:
 *   loan = amount / (1 − fee%). The homeowner pays interest on the fee.
 * - "deducted": the homeowner borrows exactly the amount to finance; the installer absorbs the
 *   fee (receives amount × (1 − fee%)). The homeowner's payments do not change.
 */
export const dealerFeeModeSchema = z.enum(["added", "deducted"]);

export const loanInputSchema = z.object({
  /** What the homeowner needs financed (price − down payment − upfront incentives), cents. */
  amountCents: z.number().int().min(0),
  aprPct: z.number().min(0).max(100),
  termMonths: z.number().int().min(1).max(600),
  dealerFeePct: z.number().min(0).max(50).default(0),
  dealerFeeMode: dealerFeeModeSchema.default("added"),
});
export type LoanInput = z.input<typeof loanInputSchema>;

export type AmortizationRow = {
  month: number;
  paymentCents: number;
  interestCents: number;
  principalCents: number;
  balanceCents: number;
};

export type LoanResult = {
  /** The loan principal the homeowner owes at month 0. */
  financedCents: number;
  /** Dealer fee withheld by the lender (paid by the homeowner when "added", by the installer when "deducted"). */
  dealerFeeCents: number;
  /** What the installer receives from the lender. */
  installerProceedsCents: number;
  monthlyPaymentCents: number;
  totalPaidCents: number;
  totalInterestCents: number;
  schedule: AmortizationRow[];
};

/**
 * Level-payment amortisation with monthly compounding at APR/12 (U.S. lending practice).
 * The payment is pmt() rounded to the nearest cent; interest is rounded to the cent each month;
 * the last payment is adjusted so the balance ends at exactly 0.
 */
export function amortizeLoan(input: LoanInput): LoanResult {
  const loan = parseOrThrow(loanInputSchema, input, "loan");
  const fee = loan.dealerFeePct / 100;
  const financedCents =
    loan.dealerFeeMode === "added" ? Math.round(loan.amountCents / (1 - fee)) : loan.amountCents;
  const dealerFeeCents = Math.round(financedCents * fee);
  const installerProceedsCents = financedCents - dealerFeeCents;
  const monthlyRate = loan.aprPct / 100 / 12;
  const level = financedCents === 0 ? 0 : Math.round(-pmt(monthlyRate, loan.termMonths, financedCents));

  const schedule: AmortizationRow[] = [];
  let balance = financedCents;
  let totalPaid = 0;
  let totalInterest = 0;
  for (let month = 1; month <= loan.termMonths; month++) {
    const interest = Math.round(balance * monthlyRate);
    let payment = level;
    if (month === loan.termMonths || payment > balance + interest) payment = balance + interest;
    const principal = payment - interest;
    balance -= principal;
    totalPaid += payment;
    totalInterest += interest;
    schedule.push({ month, paymentCents: payment, interestCents: interest, principalCents: principal, balanceCents: balance });
  }
  return {
    financedCents,
    dealerFeeCents,
    installerProceedsCents,
    monthlyPaymentCents: level,
    totalPaidCents: totalPaid,
    totalInterestCents: totalInterest,
    schedule,
  };
}
