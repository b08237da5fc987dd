// What payback, ROI, simple payback and IRR mean, in plain words and with the offer's own
// numbers. The Offers tab, the homeowner's page and the proposal PDF all print these strings,
// so the three never explain a figure differently. The definitions follow src/engine/cashflow.ts.
import { formatCents } from "@/lib/format";
import type { OfferAssumptions, OfferSummary } from "@/lib/offer-figures";

type Figures = {
  summary: Pick<OfferSummary, "paybackYears" | "simplePaybackYears" | "roiBasisCents" | "downPaymentCents" | "lifetimeSavingsCents" | "irr" | "irrNote" | "netCostCents">;
  assumptions: Pick<OfferAssumptions, "years" | "degradationPctPerYear" | "utilityEscalationPctPerYear">;
};

export type FigureDefinitions = {
  payback: string;
  roi: string;
  /** Null for figures saved before the simple payback was computed. */
  simplePayback: string | null;
  /** Why there is no IRR; null when there is one. */
  irr: string | null;
};

const pct = (v: number) => `${v.toLocaleString("en-US", { maximumFractionDigits: 2 })} %`;

/** Who pays what, in the ROI's denominator: the price net of credits for cash; the down payment and the loan's payments for a loan. */
function roiBasisText(kind: "cash" | "loan", s: Figures["summary"]): string {
  const basis = formatCents(s.roiBasisCents ?? s.netCostCents);
  if (kind === "cash") return `${basis}, the cash price after the incentives and credits`;
  const down = s.downPaymentCents ? `the ${formatCents(s.downPaymentCents)} down payment plus ` : "";
  return `${basis}, ${down}all the loan's payments, less incentives paid back to you later`;
}

export function figureDefinitions(f: Figures, paymentKind: "cash" | "loan"): FigureDefinitions {
  const { summary: s, assumptions: a } = f;
  const loanPart = paymentKind === "loan" ? ", loan payments as they fall due" : "";
  const payback =
    `Payback is the year in which the running total of bill savings, incentives and what you pay turns positive` +
    ` (electricity prices rising ${pct(a.utilityEscalationPctPerYear)} a year, panel output falling ${pct(a.degradationPctPerYear)} a year${loanPart}).`;
  const roi = `Simple ROI = (bill savings over ${a.years} years − what you pay) ÷ what you pay. What you pay: ${roiBasisText(paymentKind, s)}.`;
  const simplePayback =
    s.simplePaybackYears === undefined
      ? null
      : s.simplePaybackYears === null
        ? "Simple payback (net cost ÷ first-year savings): none, as the first year saves nothing."
        : `Simple payback (net cost ÷ first-year savings, without price rises or panel wear): ${s.simplePaybackYears.toFixed(1)} years.`;
  const irr = s.irr === null && s.irrNote ? `IRR ${s.irrNote}.` : null;
  return { payback, roi, simplePayback, irr };
}

/**
 * One line on what each other figure of an offer means, for the homeowner's page (payback and
 * ROI have their own, above). Our wording; `years` is how many years the figures cover.
 */
export function figureMeanings(years: number) {
  return {
    production: "What the panels should make in their first year, in a typical year's weather.",
    usage: "What your home uses in a year, from your bills or meter readings.",
    offset: "How much of your yearly use the panels make; over 100 % means they make more than you use.",
    price: "What you pay for the system, before any incentive or tax credit.",
    netCost: "The price less the incentives and tax credits expected for this system.",
    monthlyLoan: "The loan's monthly payment.",
    deposit: "Paid after you sign; it counts toward the price.",
    billWithout: "Your electricity bills for a year at your utility's rates, without solar.",
    billWith: "The same year's bills with the panels making part of your electricity.",
    year1Savings: "The difference between those two bills.",
    lifetimeSavings: `Bill savings added up over ${years} years, with electricity prices rising as assumed below.`,
    ahead: `Bill savings and incentives over ${years} years, less everything you pay; below zero means you pay more than you save.`,
  } as const;
}
