/**
 * The homeowner's cash-flow table over the system's life (25 years by default) and its summary
 * figures: payback, simple ROI, NPV, IRR and LCOE.
 *
 * Conventions (each an editable input unless it is a definition):
 * - Production, year n: year-1 kWh × (1 − d)^(n−1), d = 0.5 %/yr by default: the median
 *   degradation rate of Jordan & Kurtz (2013), "Photovoltaic Degradation Rates — an Analytical
 *   Review", Progress in Photovoltaics 21(1). Compounding each year is our choice; a linear
 *   1 − d·(n−1) differs by under 1 % of output after 25 years.
 * - Bills, year n: the year-1 bill at today's prices × (1 + e)^(n−1), e = 2.5 %/yr nominal by
 *   default (an editable assumption, not a forecast). The escalation applies to the whole bill.
 *   The bill with solar is given for every year (re-billed with that year's degraded
 *   production), or as one year-1 figure, in which case the year-1 savings are scaled by the
 *   degradation factor (an approximation for plans that are not linear in production).
 * - Year 0 is the day of signing: cash pays price − upfront incentives; a loan buyer pays the
 *   down payment and finances price − down payment − upfront incentives (finance.ts,
 *   amortizeLoan). Loan payments fall in the years they are due (12 a year).
 * - Cash flow, year n = savings + incentives paid that year − loan payments − O&M.
 * - Payback: the fractional year at which the cumulative cash flow turns non-negative for the
 *   last time (linear within the year), so with escalation, degradation, loan payments and
 *   incentives as they fall; null when it ends negative. Simple payback, for comparison: net
 *   cost ÷ year-1 savings (no escalation, no degradation); null when year-1 savings are not positive.
 * - Net cost = everything paid for the system (year-0 outlay, loan payments, O&M) − incentives
 *   received after year 0. Simple ROI = (lifetime savings − net cost) / net cost; null when the
 *   net cost is not positive (no money at risk: the ratio has no meaning).
 * - NPV: numpy-financial convention (year 0 undiscounted) at the discount rate; IRR: finance.ts,
 *   given only when exactly one rate makes the NPV zero (irrNote says why not otherwise).
 * - A loan must be paid off within the table: a term longer than the analysis years is refused
 *   (callers lengthen the analysis to the term, never drop payments).
 * - LCOE, discounted (Short, Packey & Holt 1995, "A Manual for the Economic Evaluation of Energy
 *   Efficiency and Renewable Energy Technologies", NREL/TP-462-5173, levelized cost of energy):
 *   LCOE = Σ_t cost_t/(1+r)^t ÷ Σ_t kWh_t/(1+r)^t, with cost_t the homeowner's net system cost
 *   in year t (as in net cost above). Also the simple, undiscounted net cost ÷ lifetime kWh.
 */
import { z } from "zod";
import { parseOrThrow } from "./errors";
import { amortizeLoan, dealerFeeModeSchema, irrVerdict, npv } from "./finance";

/** Jordan & Kurtz (2013): median degradation of PV modules, %/yr. */
export const DEFAULT_DEGRADATION_PCT = 0.5;
/** Default utility price escalation, %/yr nominal (an editable assumption). */
export const DEFAULT_UTILITY_ESCALATION_PCT = 2.5;
/** Default discount rate for NPV and LCOE, %/yr nominal (an editable assumption, our choice). */
export const DEFAULT_DISCOUNT_RATE_PCT = 5;
export const DEFAULT_YEARS = 25;

const cents = z.number().int().min(-1e12).max(1e12);

export const paymentSchema = z.discriminatedUnion("kind", [
  z.object({ kind: z.literal("cash") }),
  z.object({
    kind: z.literal("loan"),
    aprPct: z.number().finite().min(0).max(100),
    termMonths: z.number().int().min(1).max(600),
    dealerFeePct: z.number().finite().min(0).max(50).default(0),
    dealerFeeMode: dealerFeeModeSchema.default("added"),
    downPaymentCents: z.number().int().min(0).default(0),
  }),
]);

export const cashflowInputSchema = z
  .object({
    years: z.number().int().min(1).max(50).default(DEFAULT_YEARS),
    grossPriceCents: z.number().int().min(0).max(1e11),
    /** Incentive cents by year, index 0 = upfront (see incentives.ts `byYear`). */
    incentivesByYear: z.array(z.number().int().min(0).max(1e11)).default([]),
    payment: paymentSchema,
    year1ProductionKwh: z.number().finite().min(0).max(1e9),
    degradationPctPerYear: z.number().finite().min(0).max(10).default(DEFAULT_DEGRADATION_PCT),
    /** Year-1 annual bill without solar, at today's prices. */
    billWithoutSolarCents: cents,
    /** Bill with solar at today's prices: one per year (index 0 = year 1), or the year-1 figure. */
    billWithSolarCents: z.union([cents, z.array(cents).min(1)]),
    utilityEscalationPctPerYear: z.number().finite().min(-10).max(20).default(DEFAULT_UTILITY_ESCALATION_PCT),
    discountRatePct: z.number().finite().min(-50).max(50).default(DEFAULT_DISCOUNT_RATE_PCT),
    /** Operations and maintenance, cents in year 1, escalated at omEscalationPctPerYear. */
    omCentsPerYear: z.number().int().min(0).max(1e9).default(0),
    omEscalationPctPerYear: z.number().finite().min(-10).max(20).default(0),
  })
  .superRefine((v, ctx) => {
    if (Array.isArray(v.billWithSolarCents) && v.billWithSolarCents.length !== v.years) {
      ctx.addIssue({ code: "custom", path: ["billWithSolarCents"], message: `needs one value per year (${v.years})` });
    }
    if (v.incentivesByYear.length > v.years + 1) {
      ctx.addIssue({ code: "custom", path: ["incentivesByYear"], message: `has entries after year ${v.years}` });
    }
    const incentives = v.incentivesByYear.reduce((a, b) => a + b, 0);
    if (incentives > v.grossPriceCents) ctx.addIssue({ code: "custom", path: ["incentivesByYear"], message: "incentives exceed the price" });
    if (v.payment.kind === "loan" && v.payment.termMonths > v.years * 12) {
      ctx.addIssue({
        code: "custom",
        path: ["payment", "termMonths"],
        message: `the loan's ${v.payment.termMonths}-month term runs past the ${v.years}-year analysis: analyse at least ${Math.ceil(v.payment.termMonths / 12)} years so every payment is counted`,
      });
    }
    if (v.payment.kind === "loan" && v.payment.downPaymentCents + (v.incentivesByYear[0] ?? 0) > v.grossPriceCents) {
      ctx.addIssue({ code: "custom", path: ["payment", "downPaymentCents"], message: "down payment plus upfront incentives exceed the price" });
    }
  });
export type CashflowInput = z.input<typeof cashflowInputSchema>;

export type CashflowRow = {
  /** 0 = signing; 1… = years of ownership. */
  year: number;
  productionKwh: number;
  billWithoutSolarCents: number;
  billWithSolarCents: number;
  savingsCents: number;
  incentivesCents: number;
  /** Money paid for the system this year: year-0 outlay, then loan payments. */
  systemPaymentCents: number;
  omCents: number;
  cashFlowCents: number;
  cumulativeCents: number;
};

export type CashflowSummary = {
  netCostCents: number;
  lifetimeSavingsCents: number;
  lifetimeProductionKwh: number;
  /** Year the cumulative cash flow turns positive for good (escalation, degradation, loan payments included). */
  paybackYears: number | null;
  /** Net cost ÷ year-1 savings; null when year-1 savings are not positive. */
  simplePaybackYears: number | null;
  /** (Lifetime savings − net cost) ÷ net cost; net cost is what the homeowner pays (see above). */
  simpleRoi: number | null;
  npvCents: number;
  irr: number | null;
  /** Why irr is null ("not meaningful: …"), else null. */
  irrNote: string | null;
  /** Discounted LCOE (Short, Packey & Holt 1995), ¢/kWh; null without production. */
  lcoeCentsPerKwh: number | null;
  /** Net cost ÷ lifetime kWh, ¢/kWh; null without production. */
  simpleLcoeCentsPerKwh: number | null;
  loan: { financedCents: number; monthlyPaymentCents: number; totalInterestCents: number; dealerFeeCents: number } | null;
  notes: string[];
};

export type CashflowResult = { rows: CashflowRow[]; summary: CashflowSummary };

/** What the customer pays for the system: the year-0 outlay and, for a loan, the payments by year. */
function outlays(v: z.output<typeof cashflowInputSchema>, upfront: number, notes: string[]) {
  let loan: CashflowSummary["loan"] = null;
  const loanByYear = new Array<number>(v.years + 1).fill(0);
  let yearZeroOutlay: number;
  if (v.payment.kind === "cash") {
    yearZeroOutlay = v.grossPriceCents - upfront;
  } else {
    const p = v.payment;
    yearZeroOutlay = p.downPaymentCents;
    const amountCents = v.grossPriceCents - p.downPaymentCents - upfront;
    const result = amortizeLoan({ amountCents, aprPct: p.aprPct, termMonths: p.termMonths, dealerFeePct: p.dealerFeePct, dealerFeeMode: p.dealerFeeMode });
    for (const row of result.schedule) {
      const year = Math.ceil(row.month / 12);
      if (year <= v.years) loanByYear[year] += row.paymentCents;
    }
    loan = {
      financedCents: result.financedCents,
      monthlyPaymentCents: result.monthlyPaymentCents,
      totalInterestCents: result.totalInterestCents,
      dealerFeeCents: result.dealerFeeCents,
    };
  }
  return { loan, loanByYear, yearZeroOutlay };
}

/** Net system cost by year (outlays − later incentives), the flows, and the discounted LCOE. */
function costsAndLcoe(v: z.output<typeof cashflowInputSchema>, rows: CashflowRow[], yearZeroOutlay: number) {
  const d = v.degradationPctPerYear / 100;
  const costByYear = rows.map((r) => (r.year === 0 ? yearZeroOutlay : r.systemPaymentCents + r.omCents - r.incentivesCents));
  const netCost = costByYear.reduce((a, b) => a + b, 0);
  const flows = rows.map((r) => r.cashFlowCents);
  const rate = v.discountRatePct / 100;

  let discountedCost = 0;
  let discountedKwh = 0;
  rows.forEach((r, t) => {
    const f = Math.pow(1 + rate, t);
    discountedCost += costByYear[t] / f;
    discountedKwh += (t === 0 ? 0 : v.year1ProductionKwh * Math.pow(1 - d, t - 1)) / f;
  });
  return { netCost, flows, rate, lcoe: discountedKwh > 0 ? discountedCost / discountedKwh : null };
}

/** Build the year-by-year table and its summary. */
export function buildCashflow(input: CashflowInput): CashflowResult {
  const v = parseOrThrow(cashflowInputSchema, input, "cash flow");
  const notes: string[] = [];
  const d = v.degradationPctPerYear / 100;
  const e = v.utilityEscalationPctPerYear / 100;
  const upfront = v.incentivesByYear[0] ?? 0;

  const { loan, loanByYear, yearZeroOutlay } = outlays(v, upfront, notes);

  const rows: CashflowRow[] = [
    {
      year: 0,
      productionKwh: 0,
      billWithoutSolarCents: 0,
      billWithSolarCents: 0,
      savingsCents: 0,
      incentivesCents: upfront,
      systemPaymentCents: yearZeroOutlay + (v.payment.kind === "cash" ? upfront : 0),
      omCents: 0,
      cashFlowCents: 0 - yearZeroOutlay, // not -x: a zero outlay must print as 0, not −0
      cumulativeCents: 0 - yearZeroOutlay,
    },
  ];
  // Year 0 shows the gross outlay beside the incentive; the cash flow is the net of both (cash)
  // or the down payment alone (loan: the upfront incentive reduced the amount financed).
  if (v.payment.kind === "loan") rows[0].systemPaymentCents = yearZeroOutlay;
  if (v.payment.kind === "loan") rows[0].incentivesCents = 0;

  const year1Savings = v.billWithoutSolarCents - (Array.isArray(v.billWithSolarCents) ? v.billWithSolarCents[0] : v.billWithSolarCents);
  let cumulative = 0 - yearZeroOutlay;
  let lifetimeSavings = 0;
  let lifetimeKwh = 0;
  for (let n = 1; n <= v.years; n++) {
    const degradation = Math.pow(1 - d, n - 1);
    const escalation = Math.pow(1 + e, n - 1);
    const productionKwh = v.year1ProductionKwh * degradation;
    const without = Math.round(v.billWithoutSolarCents * escalation);
    const withAtToday = Array.isArray(v.billWithSolarCents) ? v.billWithSolarCents[n - 1] : v.billWithoutSolarCents - year1Savings * degradation;
    const withSolar = Math.round(withAtToday * escalation);
    const savings = without - withSolar;
    const incentives = v.incentivesByYear[n] ?? 0;
    const om = Math.round(v.omCentsPerYear * Math.pow(1 + v.omEscalationPctPerYear / 100, n - 1));
    const cashFlow = savings + incentives - loanByYear[n] - om;
    cumulative += cashFlow;
    lifetimeSavings += savings;
    lifetimeKwh += productionKwh;
    rows.push({
      year: n,
      productionKwh: Math.round(productionKwh * 10) / 10,
      billWithoutSolarCents: without,
      billWithSolarCents: withSolar,
      savingsCents: savings,
      incentivesCents: incentives,
      systemPaymentCents: loanByYear[n],
      omCents: om,
      cashFlowCents: cashFlow,
      cumulativeCents: cumulative,
    });
  }

  const { netCost, flows, rate, lcoe } = costsAndLcoe(v, rows, yearZeroOutlay);

  return {
    rows,
    summary: {
      netCostCents: netCost,
      lifetimeSavingsCents: lifetimeSavings,
      lifetimeProductionKwh: Math.round(lifetimeKwh * 10) / 10,
      paybackYears: paybackYears(flows),
      simplePaybackYears: rows[1] && rows[1].savingsCents > 0 ? Math.max(0, netCost) / rows[1].savingsCents : null,
      simpleRoi: netCost > 0 ? (lifetimeSavings - netCost) / netCost : null,
      npvCents: Math.round(npv(rate, flows)),
      ...irrOf(flows),
      lcoeCentsPerKwh: lcoe,
      simpleLcoeCentsPerKwh: lifetimeKwh > 0 ? netCost / lifetimeKwh : null,
      loan,
      notes,
    },
  };
}

function irrOf(flows: readonly number[]): { irr: number | null; irrNote: string | null } {
  const verdict = irrVerdict(flows);
  return { irr: verdict.irr, irrNote: verdict.reason };
}

/**
 * Fractional payback from yearly cash flows (index 0 = signing): the point where the cumulative
 * sum turns non-negative for the last time, interpolated linearly within that year.
 * 0 when the cumulative sum is never negative; null when it ends negative.
 */
export function paybackYears(flows: readonly number[]): number | null {
  const cumulative: number[] = [];
  flows.reduce((acc, f, i) => (cumulative[i] = acc + f), 0);
  if (cumulative[cumulative.length - 1] < 0) return null;
  let lastNegative = -1;
  cumulative.forEach((c, i) => {
    if (c < 0) lastNegative = i;
  });
  if (lastNegative === -1) return 0;
  const year = lastNegative + 1;
  // cumulative[year] ≥ 0 > cumulative[lastNegative], so flows[year] > 0.
  return lastNegative + -cumulative[lastNegative] / flows[year];
}
