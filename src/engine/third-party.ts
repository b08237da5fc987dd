/**
 * Third-party-owned systems: a lease (a monthly payment) or a power purchase agreement (a price
 * per kWh the system produces). A financing partner owns, maintains and insures the system; the
 * homeowner pays the partner and keeps the bill savings. The terms are the partner's rate sheet.
 *
 * Conventions (each an input unless it is a definition):
 * - Lease, year n: the monthly payment × (1 + escalator)^(n−1), 12 payments a year. The year-1
 *   monthly payment is the rate sheet's price per watt × the system's DC watts, or its price per
 *   kWh × the year-1 expected production ÷ 12 (a lease payment is fixed whatever the sun does).
 * - PPA, month m of year n: expected kWh of that month × (1 − degradation)^(n−1) × the price ×
 *   (1 + escalator)^(n−1): the homeowner pays for what the system is expected to produce.
 * - Each monthly payment is rounded to the cent. An upfront payment falls at signing (year 0).
 * - Bill savings, year n: as for a purchase (cashflow.ts): the year-1 bills at today's prices ×
 *   (1 + utility escalation)^(n−1), the bill with solar re-billed with that year's output.
 * - Incentives go to the party that claims them: a rule applies to the homeowner of a lease or
 *   PPA only when its eligibility names that payment ("lease" or "ppa"); every other rule is the
 *   system owner's (e.g. a business energy credit): it lowers the partner's price (already in the
 *   rate sheet) and is never counted as the homeowner's money.
 * - The payment stream's present value discounts monthly payments at the monthly rate
 *   equivalent to the annual discount rate, (1 + r)^(1/12) − 1, with the upfront payment at t = 0
 *   (numpy-financial's npv convention, finance.ts).
 * - The escalator's effect: total payments minus what the same payments would total with no
 *   escalator (the year-1 payments every year).
 */
import { z } from "zod";
import { parseOrThrow } from "./errors";
import type { CashflowRow } from "./cashflow";
import { npv } from "./finance";
import type { IncentiveRuleInput } from "./incentives";

const text = z.string().trim().max(2000);
const commonTerms = {
  /** The financing partner's name, as on the rate sheet. */
  partner: z.string().trim().min(1).max(200),
  escalatorPctPerYear: z.number().finite().min(0).max(10),
  termYears: z.number().int().min(1).max(30),
  upfrontCents: z.number().int().min(0).max(1e9).default(0),
  /** Share of expected production the partner guarantees, % (information). */
  productionGuaranteePct: z.number().finite().min(0).max(100).optional(),
  /** Buyout and end-of-term options, as the rate sheet words them. */
  endOfTerm: text.optional(),
};

export const leaseTermsSchema = z.object({
  kind: z.literal("lease"),
  payment: z.discriminatedUnion("basis", [
    z.object({ basis: z.literal("per-watt"), monthlyCentsPerWatt: z.number().finite().positive().max(100) }),
    z.object({ basis: z.literal("per-kwh"), centsPerKwh: z.number().finite().positive().max(200) }),
  ]),
  ...commonTerms,
});
export const ppaTermsSchema = z.object({ kind: z.literal("ppa"), centsPerKwh: z.number().finite().positive().max(200), ...commonTerms });
export const thirdPartyTermsSchema = z.discriminatedUnion("kind", [leaseTermsSchema, ppaTermsSchema]);
export type ThirdPartyTermsInput = z.input<typeof thirdPartyTermsSchema>;
export type ThirdPartyKind = z.output<typeof thirdPartyTermsSchema>["kind"];

const cents = z.number().int().min(-1e12).max(1e12);

export const thirdPartyInputSchema = z
  .object({
    terms: thirdPartyTermsSchema,
    systemWattsDc: z.number().finite().positive().max(1e7),
    /** Expected AC production of year 1 by month, kWh (January first). */
    year1MonthlyProductionKwh: z.array(z.number().finite().min(0).max(1e8)).length(12),
    degradationPctPerYear: z.number().finite().min(0).max(10),
    billWithoutSolarCents: cents,
    /** Bill with solar at today's prices, one per year of the term (index 0 = year 1). */
    billWithSolarCents: z.array(cents).min(1),
    utilityEscalationPctPerYear: z.number().finite().min(-10).max(20),
    discountRatePct: z.number().finite().min(-50).max(50),
    /** A monthly adder in year 1 (e.g. the partner's price for a battery), escalated like the payments. */
    extraMonthlyCents: z.number().int().min(0).max(1e8).default(0),
    /** The homeowner's own incentives by year (index 0 = at signing). */
    homeownerIncentivesByYear: z.array(z.number().int().min(0).max(1e11)).default([]),
  })
  .superRefine((v, ctx) => {
    if (v.billWithSolarCents.length !== v.terms.termYears) ctx.addIssue({ code: "custom", path: ["billWithSolarCents"], message: `needs one value per year of the ${v.terms.termYears}-year term` });
    if (v.homeownerIncentivesByYear.length > v.terms.termYears + 1) ctx.addIssue({ code: "custom", path: ["homeownerIncentivesByYear"], message: `has entries after year ${v.terms.termYears}` });
  });
export type ThirdPartyInput = z.input<typeof thirdPartyInputSchema>;

/**
 * A year of the table, in the purchase table's shape (cashflow.ts): `systemPaymentCents` is what
 * the partner is paid that year (year 0: the upfront payment), `omCents` is 0 (the owner
 * maintains the system), `cashFlowCents` = savings + incentives − payments.
 */
export type ThirdPartyRow = CashflowRow;

export type ThirdPartySummary = {
  kind: ThirdPartyKind;
  termYears: number;
  upfrontCents: number;
  /** Upfront + every payment over the term. */
  totalPaidCents: number;
  firstYearPaymentsCents: number;
  /** Year 1's payments ÷ 12 (a lease's payment; a PPA's average month). */
  firstYearMonthlyCents: number;
  lastYearMonthlyCents: number;
  /** Every payment over the term (upfront excluded) ÷ the term's months. */
  averageMonthlyCents: number;
  /** What the escalator adds over the term to the year-1 payments repeated every year. */
  escalatorEffectCents: number;
  lifetimeBillSavingsCents: number;
  homeownerIncentivesCents: number;
  /** Bill savings + the homeowner's incentives − total paid. */
  netSavingsCents: number;
  firstYearNetCents: number;
  /** Present value of the upfront and monthly payments at the discount rate. */
  paymentsPresentValueCents: number;
  /** NPV of the yearly net flows (year 0 undiscounted). */
  npvCents: number;
};

export type ThirdPartyResult = { rows: ThirdPartyRow[]; monthlyPaymentsCents: number[]; summary: ThirdPartySummary };

/** The monthly payments over the term, January of year 1 first. */
function monthlyPayments(v: z.output<typeof thirdPartyInputSchema>): number[] {
  const t = v.terms;
  const esc = t.escalatorPctPerYear / 100;
  const d = v.degradationPctPerYear / 100;
  const year1Kwh = v.year1MonthlyProductionKwh.reduce((a, b) => a + b, 0);
  const out: number[] = [];
  for (let n = 1; n <= t.termYears; n++) {
    const escalation = Math.pow(1 + esc, n - 1);
    for (let m = 0; m < 12; m++) {
      let cents: number;
      if (t.kind === "lease") cents = (t.payment.basis === "per-watt" ? v.systemWattsDc * t.payment.monthlyCentsPerWatt : (year1Kwh * t.payment.centsPerKwh) / 12) * escalation;
      else cents = v.year1MonthlyProductionKwh[m] * Math.pow(1 - d, n - 1) * t.centsPerKwh * escalation;
      out.push(Math.round(cents + v.extraMonthlyCents * escalation));
    }
  }
  return out;
}

/** The homeowner's year-by-year table and summary for a lease or PPA. */
export function buildThirdPartyCashflow(input: ThirdPartyInput): ThirdPartyResult {
  const v = parseOrThrow(thirdPartyInputSchema, input, "lease or PPA");
  const t = v.terms;
  const payments = monthlyPayments(v);
  const e = v.utilityEscalationPctPerYear / 100;
  const d = v.degradationPctPerYear / 100;
  const year1Kwh = v.year1MonthlyProductionKwh.reduce((a, b) => a + b, 0);
  const incentive0 = v.homeownerIncentivesByYear[0] ?? 0;
  const rows: ThirdPartyRow[] = [
    {
      year: 0,
      productionKwh: 0,
      billWithoutSolarCents: 0,
      billWithSolarCents: 0,
      savingsCents: 0,
      incentivesCents: incentive0,
      systemPaymentCents: t.upfrontCents,
      omCents: 0,
      cashFlowCents: incentive0 - t.upfrontCents,
      cumulativeCents: incentive0 - t.upfrontCents,
    },
  ];
  for (let n = 1; n <= t.termYears; n++) {
    const escalation = Math.pow(1 + e, n - 1);
    const without = Math.round(v.billWithoutSolarCents * escalation);
    const withSolar = Math.round(v.billWithSolarCents[n - 1] * escalation);
    const paid = payments.slice((n - 1) * 12, n * 12).reduce((a, b) => a + b, 0);
    const incentives = v.homeownerIncentivesByYear[n] ?? 0;
    const net = without - withSolar + incentives - paid;
    rows.push({
      year: n,
      productionKwh: Math.round(year1Kwh * Math.pow(1 - d, n - 1) * 10) / 10,
      billWithoutSolarCents: without,
      billWithSolarCents: withSolar,
      savingsCents: without - withSolar,
      incentivesCents: incentives,
      systemPaymentCents: paid,
      omCents: 0,
      cashFlowCents: net,
      cumulativeCents: rows[n - 1].cumulativeCents + net,
    });
  }
  const sumOf = (k: keyof ThirdPartyRow) => rows.reduce((s, r) => s + (r[k] as number), 0);
  const monthlyRate = Math.pow(1 + v.discountRatePct / 100, 1 / 12) - 1;
  const totalPaid = sumOf("systemPaymentCents");
  const paymentsOnly = totalPaid - t.upfrontCents;
  return {
    rows,
    monthlyPaymentsCents: payments,
    summary: {
      kind: t.kind,
      termYears: t.termYears,
      upfrontCents: t.upfrontCents,
      totalPaidCents: totalPaid,
      firstYearPaymentsCents: rows[1].systemPaymentCents,
      firstYearMonthlyCents: Math.round(rows[1].systemPaymentCents / 12),
      lastYearMonthlyCents: Math.round(rows[t.termYears].systemPaymentCents / 12),
      averageMonthlyCents: Math.round(paymentsOnly / payments.length),
      escalatorEffectCents: paymentsOnly - rows[1].systemPaymentCents * t.termYears,
      lifetimeBillSavingsCents: sumOf("savingsCents"),
      homeownerIncentivesCents: sumOf("incentivesCents"),
      netSavingsCents: sumOf("cashFlowCents"),
      firstYearNetCents: rows[1].cashFlowCents,
      paymentsPresentValueCents: Math.round(npv(monthlyRate, [t.upfrontCents, ...payments])),
      npvCents: Math.round(
        npv(
          v.discountRatePct / 100,
          rows.map((r) => r.cashFlowCents),
        ),
      ),
    },
  };
}

/**
 * Which incentive rules are the homeowner's under a lease or PPA (their eligibility names that
 * payment) and which the system owner's (rules open to any payment: the partner, owning the
 * system, claims them). Rules limited to other payments (a purchase-only credit) are neither.
 */
export function splitIncentiveRules<R extends IncentiveRuleInput>(rules: readonly R[], kind: ThirdPartyKind): { homeowner: R[]; owner: R[] } {
  const payments = (r: R) => r.eligibility?.payment as readonly string[] | undefined;
  return { homeowner: rules.filter((r) => payments(r)?.includes(kind) === true), owner: rules.filter((r) => payments(r) === undefined) };
}
