/**
 * The parts of a quote beyond a plain purchase: a battery (its bills each year through the
 * hourly dispatch, its own savings apart from the solar's, backup hours) and third-party
 * ownership (a lease or PPA: the partner's payments instead of a price; the owner's incentives
 * kept apart from the homeowner's). quote.ts calls these; they never import it.
 */
import { z } from "zod";
import { makeBatteryDispatcher, batterySpecSchema, dispatchSettingsSchema, type DispatchTotals } from "./battery";
import { backupHours, criticalLoadsSchema, type BackupResult } from "./battery-backup";
import { meterOf } from "./battery-report";
import { evaluateIncentives, type IncentiveResult, type IncentiveRuleInput } from "./incentives";
import { makeBillCalculator, type AnnualBill, type RatePlanInput } from "./rates";
import { buildThirdPartyCashflow, splitIncentiveRules, type ThirdPartyResult, type ThirdPartyTermsInput } from "./third-party";
import { HOURS_PER_YEAR, monthlySums, type YearClock } from "./year-calendar";

export const quoteBatterySchema = z.object({
  spec: batterySpecSchema,
  settings: dispatchSettingsSchema,
  criticalLoads: criticalLoadsSchema.optional(),
  /** Installed price of the battery, cents: added to a purchase's price (cash or loan). */
  priceCents: z.number().int().min(0).max(1e9).default(0),
  /** Lease or PPA: the partner's monthly price for the battery in year 1 (escalates with the payments). */
  partnerMonthlyCents: z.number().int().min(0).max(1e8).default(0),
});
export type QuoteBattery = z.output<typeof quoteBatterySchema>;

export type BatteryQuote = {
  spec: QuoteBattery["spec"];
  mode: QuoteBattery["settings"]["mode"];
  priceCents: number;
  partnerMonthlyCents: number;
  year1: { withoutSolarCents: number; solarOnlyCents: number; solarAndBatteryCents: number; solarSavingsCents: number; batterySavingsCents: number };
  /** The battery's own savings over the table's years (bills escalated as the table's). */
  lifetimeBatterySavingsCents: number;
  withBattery: DispatchTotals;
  solarOnly: DispatchTotals;
  backup: BackupResult | null;
  notes: string[];
};

/**
 * Bills with solar and the battery for each year (dispatched again on that year's degraded
 * output; the battery's own capacity is held constant: our simplification, said in the notes),
 * and the battery's year-1 figures beside solar alone.
 */
export function quoteBatteryBills(x: {
  battery: QuoteBattery;
  plan: RatePlanInput;
  clock: YearClock;
  usageHourly: ArrayLike<number>;
  productionHourly: Float64Array;
  years: number;
  degradationPctPerYear: number;
  utilityEscalationPctPerYear: number;
  without: AnnualBill;
  solarOnlyByYear: AnnualBill[];
}): { withByYear: AnnualBill[]; report: BatteryQuote } {
  const dispatch = makeBatteryDispatcher(x.plan, x.clock);
  const bill = makeBillCalculator(x.plan, x.clock);
  const degraded = new Float64Array(HOURS_PER_YEAR);
  const withByYear: AnnualBill[] = [];
  let first: ReturnType<typeof dispatch> | null = null;
  let firstSolarOnly: DispatchTotals | null = null;
  for (let n = 1; n <= x.years; n++) {
    const f = Math.pow(1 - x.degradationPctPerYear / 100, n - 1);
    for (let h = 0; h < HOURS_PER_YEAR; h++) degraded[h] = x.productionHourly[h] * f;
    const run = dispatch({ loadHourlyKwh: x.usageHourly, productionHourlyKwh: degraded, battery: x.battery.spec, settings: x.battery.settings });
    if (n === 1) {
      first = run;
      firstSolarOnly = dispatch({ loadHourlyKwh: x.usageHourly, productionHourlyKwh: degraded, battery: null, settings: x.battery.settings }).totals;
    }
    const meter = meterOf(run);
    withByYear.push(bill(meter.importKwh, meter.exportKwh));
  }
  if (!first || !firstSolarOnly) throw new Error("unreachable: a quote has at least one year");
  const e = x.utilityEscalationPctPerYear / 100;
  const lifetime = withByYear.reduce((s, b, i) => s + Math.round(x.solarOnlyByYear[i].totalCents * Math.pow(1 + e, i)) - Math.round(b.totalCents * Math.pow(1 + e, i)), 0);
  const backup = x.battery.criticalLoads ? backupHours({ battery: x.battery.spec, loads: x.battery.criticalLoads, productionHourlyKwh: x.productionHourly }) : null;
  const solarOnly1 = x.solarOnlyByYear[0].totalCents;
  return {
    withByYear,
    report: {
      spec: x.battery.spec,
      mode: x.battery.settings.mode,
      priceCents: x.battery.priceCents,
      partnerMonthlyCents: x.battery.partnerMonthlyCents,
      year1: {
        withoutSolarCents: x.without.totalCents,
        solarOnlyCents: solarOnly1,
        solarAndBatteryCents: withByYear[0].totalCents,
        solarSavingsCents: x.without.totalCents - solarOnly1,
        batterySavingsCents: solarOnly1 - withByYear[0].totalCents,
      },
      lifetimeBatterySavingsCents: lifetime,
      withBattery: first.totals,
      solarOnly: firstSolarOnly,
      backup,
      notes: [...first.notes, "The battery's capacity is taken as new every year (its fade over the years is not modelled)."],
    },
  };
}

export type ThirdPartyQuote = ThirdPartyResult["summary"] & {
  partner: string;
  endOfTerm: string | null;
  productionGuaranteePct: number | null;
  /** The homeowner's own incentives (rules that name this lease or PPA). */
  homeownerIncentives: IncentiveResult;
  /** What the system's owner claims: it lowers the partner's price, and is never the homeowner's. */
  ownerIncentives: IncentiveResult;
  ownership: string;
};

/** A lease or PPA: the payments, the savings, and who gets which incentive. */
export function quoteThirdParty(x: {
  terms: ThirdPartyTermsInput & { kind: "lease" | "ppa" };
  rules: IncentiveRuleInput[];
  asOf: string;
  installDate?: string;
  grossPriceCents: number;
  kwDc: number;
  productionHourly: Float64Array;
  degradationPctPerYear: number;
  utilityEscalationPctPerYear: number;
  discountRatePct: number;
  without: AnnualBill;
  withByYear: AnnualBill[];
  battery: QuoteBattery | null;
}): { result: ThirdPartyResult; quote: ThirdPartyQuote } {
  const split = splitIncentiveRules(x.rules, x.terms.kind);
  const evaluate = (rules: IncentiveRuleInput[], payment: "lease" | "ppa" | "cash") =>
    evaluateIncentives({ rules, asOf: x.asOf, installDate: x.installDate, grossPriceCents: x.grossPriceCents, systemKwDc: x.kwDc, payment });
  const homeowner = evaluate(split.homeowner, x.terms.kind);
  // The owner buys the system: its rules are judged as a purchase at the system's price.
  const owner = evaluate(split.owner, "cash");
  const result = buildThirdPartyCashflow({
    terms: x.terms,
    systemWattsDc: x.kwDc * 1000,
    year1MonthlyProductionKwh: monthlySums(x.productionHourly),
    degradationPctPerYear: x.degradationPctPerYear,
    billWithoutSolarCents: x.without.totalCents,
    billWithSolarCents: x.withByYear.map((b) => b.totalCents),
    utilityEscalationPctPerYear: x.utilityEscalationPctPerYear,
    discountRatePct: x.discountRatePct,
    extraMonthlyCents: x.battery?.partnerMonthlyCents ?? 0,
    homeownerIncentivesByYear: homeowner.byYear.slice(0, x.terms.termYears + 1),
  });
  return {
    result,
    quote: {
      ...result.summary,
      partner: x.terms.partner,
      endOfTerm: x.terms.endOfTerm ?? null,
      productionGuaranteePct: x.terms.productionGuaranteePct ?? null,
      homeownerIncentives: homeowner,
      ownerIncentives: owner,
      ownership: `${x.terms.partner} owns, maintains and insures the system for the ${x.terms.termYears}-year term; selling the house means the buyer takes over the agreement or it is bought out, as the agreement says.`,
    },
  };
}
