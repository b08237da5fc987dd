// What payback, ROI, simple payback and IRR mean, in plain words and with the offer's own
// numbers. The Offers tab, the homeowner's page and the proposal PDF all print these strings,
// so the three never explain a figure differently. The definitions follow src/engine/cashflow.ts.
import { IRR_MANY_ROOTS, IRR_REASONS } from "@/engine/finance";
import { formatCents } from "@/lib/format";
import type { Locale } from "@/lib/i18n/locales";
import { translator } from "@/lib/i18n/translator";
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

type T = ReturnType<typeof translator<"figures">>;

/** Who pays what, in the ROI's denominator: the price net of credits for cash; the down payment and the loan's payments for a loan. */
function roiBasisText(kind: "cash" | "loan", s: Figures["summary"], t: T, locale: Locale): string {
  const amount = formatCents(s.roiBasisCents ?? s.netCostCents, locale);
  if (kind === "cash") return t("basisCash", { amount });
  return s.downPaymentCents ? t("basisLoanDown", { amount, down: formatCents(s.downPaymentCents, locale) }) : t("basisLoan", { amount });
}

/** Why there is no IRR, in the reader's language: the engine's reasons by their exact text (a reason we have no words for is printed as the engine wrote it). */
function irrText(note: string, t: T): string {
  const known = (Object.keys(IRR_REASONS) as (keyof typeof IRR_REASONS)[]).find((k) => IRR_REASONS[k] === note);
  if (known) return t(`irrWhy.${known}`);
  const many = note.match(IRR_MANY_ROOTS);
  if (many) return t("irrWhy.manyRoots", { count: Number(many[1]), rates: many[2] });
  return t("irr", { note });
}

/** The definitions in the reader's language (the homeowner's page and PDF pass theirs; the Offers tab English). */
export function figureDefinitions(f: Figures, paymentKind: "cash" | "loan", locale: Locale = "en"): FigureDefinitions {
  const { summary: s, assumptions: a } = f;
  const t = translator(locale, "figures");
  const rates = { escalation: pct(a.utilityEscalationPctPerYear), degradation: pct(a.degradationPctPerYear) };
  const payback = t(paymentKind === "loan" ? "paybackLoan" : "payback", rates);
  const roi = t("roi", { years: a.years, basis: roiBasisText(paymentKind, s, t, locale) });
  const simplePayback =
    s.simplePaybackYears === undefined ? null : s.simplePaybackYears === null ? t("simpleNone") : t("simple", { years: s.simplePaybackYears.toFixed(1) });
  const irr = s.irr === null && s.irrNote ? irrText(s.irrNote, t) : null;
  return { payback, roi, simplePayback, irr };
}

/**
 * One line on what each other figure of an offer means, for the homeowner's page (payback and
 * ROI have their own, above). Our wording; `years` is how many years the figures cover.
 */
export function figureMeanings(years: number, locale: Locale = "en") {
  const t = translator(locale, "figures.meanings");
  const keys = ["production", "usage", "offset", "price", "netCost", "monthlyLoan", "deposit", "billWithout", "billWith", "year1Savings"] as const;
  return { ...Object.fromEntries(keys.map((k) => [k, t(k)])), lifetimeSavings: t("lifetimeSavings", { years }), ahead: t("ahead", { years }) } as Record<(typeof keys)[number] | "lifetimeSavings" | "ahead", string>;
}
