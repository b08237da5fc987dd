// The figures a design and an offer show, from the engine and the price book. Pure: no server
// or browser imports, so the Design tab runs it on every keystroke and the server runs the same
// code when it saves (and never trusts figures sent by a browser).
//
// Pieces reused from the engine: estimateProduction's system shape (production.ts), the sizing
// helper (sizing.ts), the string check (string-check.ts), bills (rates.ts), incentives
// (incentives.ts) and the 25-year table (cashflow.ts); quote.ts chains them the same way.
import type { Role } from "@/lib/enums";
import { buildCashflow, DEFAULT_DEGRADATION_PCT, DEFAULT_DISCOUNT_RATE_PCT, DEFAULT_UTILITY_ESCALATION_PCT, DEFAULT_YEARS, type CashflowRow } from "@/engine/cashflow";
import { amortizeLoan } from "@/engine/finance";
import { evaluateIncentives, type IncentiveResult } from "@/engine/incentives";
import type { SystemDesign } from "@/engine/production";
import { makeBillCalculator, type RatePlanInput } from "@/engine/rates";
import { sizeSystem, DEFAULT_MAX_DC_AC_RATIO, type SizingResult } from "@/engine/sizing";
import { checkString, maxModulesInSeries, CAUTION as STRING_CAUTION, type StringCheckResult } from "@/engine/string-check";
import { HOURS_PER_YEAR, HOUR_MONTH, MONTH_DAYS, monthlySums } from "@/engine/year-calendar";
import { formatCents } from "@/lib/format";
import { priceOffer, PricingInputError, type OfferPrice } from "@/lib/pricing";
import type { DesignFace } from "@/lib/schemas/design";
import type { PaymentInput } from "@/lib/schemas/offer";
import { incentiveRulesForEngine, type PriceBook } from "@/lib/schemas/price-book";

/** Shown beside every offer's money figures. */
export const OFFER_CAUTION =
  "Estimates, not a guarantee: production depends on weather, shading and upkeep, and bills on the utility's future prices. Tax and financial figures are not tax, legal or financial advice; ask a qualified advisor.";
export { STRING_CAUTION };

// ── Equipment as the engine sees it ──────────────────────────────────────────────────────

/** The module fields the figures need (a catalog row fits). */
export type ModuleSpec = {
  stcWatts: number;
  vocV: number;
  iscA: number;
  vmpV: number;
  impA: number;
  gammaPmaxPctPerC: number;
  betaVocPctPerC: number;
  /** The datasheet's maximum series fuse rating, A (NEC 690.9(A)); null when not in the catalog. */
  maxSeriesFuseA?: number | null;
};

/** The inverter fields the figures need (a catalog row fits). */
export type InverterSpec = {
  kind: "string" | "micro";
  acWatts: number;
  efficiencyPct: number;
  maxDcVoltageV: number | null;
  mpptMinV: number | null;
  mpptMaxV: number | null;
  maxInputCurrentA: number | null;
  mpptCount: number | null;
  modulesPerUnit: number | null;
};

type FaceLike = Pick<DesignFace, "name" | "tiltDeg" | "azimuthDeg" | "solarAccessPct">;

/** AC watts one module's share of a microinverter gives (a unit may take 1–4 modules). */
export function microAcWattsPerModule(inv: InverterSpec): number {
  return inv.acWatts / Math.max(1, inv.modulesPerUnit ?? 1);
}

/** Total AC rating of the inverters, kW. */
export function inverterAcKw(inv: InverterSpec, inverterCount: number, moduleCount: number): number {
  return inv.kind === "micro" ? (microAcWattsPerModule(inv) * moduleCount) / 1000 : (inv.acWatts * inverterCount) / 1000;
}

/**
 * The engine's system design for faces and their module counts (faces with 0 modules are left
 * out); null when no module is placed.
 */
export function engineSystem(
  faces: readonly FaceLike[],
  counts: readonly number[],
  mod: ModuleSpec,
  inv: InverterSpec,
  opts: { inverterCount: number; lossesPct: number },
): SystemDesign | null {
  const placed = faces.map((f, i) => ({ f, n: counts[i] ?? 0 })).filter((x) => x.n > 0);
  if (placed.length === 0) return null;
  return {
    faces: placed.map(({ f, n }) => ({
      name: f.name,
      tiltDeg: f.tiltDeg,
      azimuthDeg: f.azimuthDeg,
      moduleCount: n,
      moduleWatts: mod.stcWatts,
      solarAccessPct: f.solarAccessPct,
      gammaPctPerC: mod.gammaPmaxPctPerC,
      mount: "roof",
    })),
    inverter:
      inv.kind === "micro"
        ? { kind: "micro", acWattsPerModule: microAcWattsPerModule(inv), efficiencyPct: inv.efficiencyPct }
        : { kind: "string", acKw: (inv.acWatts * opts.inverterCount) / 1000, efficiencyPct: inv.efficiencyPct },
    losses: { totalPct: opts.lossesPct },
  };
}

/** What an injected production model returns (production.ts estimateProduction fits). */
export type ProduceFn = (system: SystemDesign) => { hourlyAcW: ArrayLike<number>; annualAcKwh: number; dcKw: number };

/**
 * The sizing helper for a design: each face's specific yield from the production model run
 * for that face alone (all its slots, unclipped), then the engine's sizeSystem.
 */
export function sizeDesign(args: {
  faces: readonly (FaceLike & { usableSlots: number })[];
  mod: ModuleSpec;
  inv: InverterSpec;
  inverterCount: number;
  lossesPct: number;
  annualUsageKwh: number;
  targetOffsetPct: number;
  produce: ProduceFn;
}): SizingResult {
  const { faces, mod, inv } = args;
  const yields = faces.map((f) => {
    if (f.usableSlots === 0) return 0;
    const probeInverter: InverterSpec = inv.kind === "micro" ? inv : { ...inv, acWatts: f.usableSlots * mod.stcWatts * 2 };
    const sys = engineSystem([f], [f.usableSlots], mod, probeInverter, { inverterCount: 1, lossesPct: args.lossesPct });
    if (!sys) return 0;
    const out = args.produce(sys);
    return out.dcKw > 0 ? out.annualAcKwh / out.dcKw : 0;
  });
  return sizeSystem({
    annualUsageKwh: args.annualUsageKwh,
    targetOffsetPct: args.targetOffsetPct,
    moduleWatts: mod.stcWatts,
    faces: faces.map((f, i) => ({ id: String(i), usableSlots: f.usableSlots, specificYieldKwhPerKw: yields[i] })),
    inverterAcKw: inv.kind === "string" ? (inv.acWatts * args.inverterCount) / 1000 : undefined,
    maxDcAcRatio: DEFAULT_MAX_DC_AC_RATIO,
    dcAcMode: "warn",
  });
}

// ── Production typed from another source ─────────────────────────────────────────────────

/**
 * Hours of the manual daylight shape: 06:00–18:00 local standard time, a half sine peaking at
 * noon. Used only when no weather file covers the site and the rep typed a figure from another
 * source; it spreads that figure over daylight hours so time-of-use bills can be computed, and
 * the offer says so. It is not weather.
 */
const DAYLIGHT_START = 6;
const DAYLIGHT_END = 18;

export const MANUAL_SHAPE_NOTE =
  "Production was typed from another source (no weather file covers this site); for the bills it is spread over each day's 06:00–18:00 hours with a half-sine shape.";

/** 8760 hourly kWh from a typed annual figure (months by days unless 12 monthly figures are given). */
export function manualProductionHourly(annualKwh: number, monthlyKwh: readonly number[] | null): Float64Array {
  const months = monthlyKwh ?? MONTH_DAYS.map((d) => (annualKwh * d) / 365);
  const shape = new Float64Array(24);
  let shapeSum = 0;
  for (let h = DAYLIGHT_START; h < DAYLIGHT_END; h++) {
    shape[h] = Math.sin((Math.PI * (h + 0.5 - DAYLIGHT_START)) / (DAYLIGHT_END - DAYLIGHT_START));
    shapeSum += shape[h];
  }
  const out = new Float64Array(HOURS_PER_YEAR);
  for (let i = 0; i < HOURS_PER_YEAR; i++) {
    const m = HOUR_MONTH[i];
    out[i] = (months[m] / MONTH_DAYS[m]) * (shape[i % 24] / shapeSum);
  }
  return out;
}

// ── String check for a string plan ───────────────────────────────────────────────────────

export type StringPlanCheck = {
  /** Longest string whose cold Voc stays within the inverter and the 600 V limit. */
  maxInSeries: number;
  /** One result per distinct string length. */
  results: { modulesInSeries: number; strings: number; result: StringCheckResult }[];
  /** Problems that keep the check from running (missing inverter data, no strings). */
  problems: string[];
};

function stringBase(mod: ModuleSpec, inv: InverterSpec, lowestTempC: number, highestTempC: number) {
  return {
    module: {
      vocV: mod.vocV,
      vmpV: mod.vmpV,
      iscA: mod.iscA,
      impA: mod.impA,
      vocCoeffPctPerC: mod.betaVocPctPerC,
      vmpCoeffPctPerC: mod.gammaPmaxPctPerC,
      ...(mod.maxSeriesFuseA ? { maxSeriesFuseA: mod.maxSeriesFuseA } : {}),
    },
    inverter: {
      maxDcInputV: inv.maxDcVoltageV ?? 0,
      mpptMinV: inv.mpptMinV ?? 0,
      mpptMaxV: inv.mpptMaxV ?? 0,
      ...(inv.maxInputCurrentA ? { maxInputIscA: inv.maxInputCurrentA } : {}),
    },
    lowestTempC,
    highestTempC,
  };
}

/** NEC 690.7/690.8 checks of each string length in the plan (string inverters only). */
export function checkStringPlan(mod: ModuleSpec, inv: InverterSpec, inverterCount: number, plan: { stringSizes: readonly number[]; lowestTempC: number; highestTempC: number }): StringPlanCheck {
  const problems: string[] = [];
  if (inv.kind !== "string") return { maxInSeries: 0, results: [], problems: ["Microinverters have no series strings to check."] };
  if (!inv.maxDcVoltageV || !inv.mpptMinV || !inv.mpptMaxV) {
    return { maxInSeries: 0, results: [], problems: ["The inverter's catalog entry lacks its maximum DC voltage or MPPT window."] };
  }
  const base = stringBase(mod, inv, plan.lowestTempC, plan.highestTempC);
  const maxInSeries = maxModulesInSeries(base);
  if (plan.stringSizes.length === 0) problems.push("No strings yet: use the suggestion or type the string sizes.");
  const inputs = Math.max(1, (inv.mpptCount ?? 1) * inverterCount);
  const bySize = new Map<number, number>();
  for (const n of plan.stringSizes) bySize.set(n, (bySize.get(n) ?? 0) + 1);
  // Strings share the MPPT inputs as evenly as they can: the busiest input carries this many in parallel.
  const parallel = Math.max(1, Math.ceil(plan.stringSizes.length / inputs));
  const results = [...bySize.entries()]
    .sort((a, b) => b[0] - a[0])
    .map(([modulesInSeries, strings]) => ({ modulesInSeries, strings, result: checkString({ ...base, modulesInSeries, stringsInParallel: parallel }) }));
  return { maxInSeries, results, problems };
}

/**
 * Suggested string sizes for `total` modules: the fewest strings within the longest allowed
 * length, as equal as whole modules allow, and never below the MPPT minimum when avoidable.
 */
export function suggestStrings(total: number, mod: ModuleSpec, inv: InverterSpec, lowestTempC: number, highestTempC: number): number[] {
  if (inv.kind !== "string" || total <= 0 || !inv.maxDcVoltageV || !inv.mpptMinV || !inv.mpptMaxV) return [];
  const maxN = maxModulesInSeries(stringBase(mod, inv, lowestTempC, highestTempC));
  if (maxN === 0) return [];
  const count = Math.ceil(total / maxN);
  const sizes = Array.from({ length: count }, (_, i) => Math.floor(total / count) + (i < total % count ? 1 : 0));
  return sizes;
}

// ── An offer's figures ───────────────────────────────────────────────────────────────────

export type OfferAssumptions = {
  years: number;
  degradationPctPerYear: number;
  utilityEscalationPctPerYear: number;
  discountRatePct: number;
};

export const DEFAULT_OFFER_ASSUMPTIONS: OfferAssumptions = {
  years: DEFAULT_YEARS,
  degradationPctPerYear: DEFAULT_DEGRADATION_PCT,
  utilityEscalationPctPerYear: DEFAULT_UTILITY_ESCALATION_PCT,
  discountRatePct: DEFAULT_DISCOUNT_RATE_PCT,
};

export type OfferFiguresInput = {
  book: PriceBook;
  /** Role of the person giving the discount. */
  role: Role;
  /** Offer date, YYYY-MM-DD: incentives are evaluated at it. */
  asOf: string;
  /** The job's planned install date, YYYY-MM-DD, for credits that count at installation; default: asOf + DEFAULT_INSTALL_LEAD_DAYS. */
  expectedInstallDate?: string;
  moduleCount: number;
  moduleWatts: number;
  /** Year-1 production, 8760 hourly kWh AC. */
  productionHourlyKwh: ArrayLike<number>;
  /** Usage, 8760 hourly kWh. */
  usageHourlyKwh: ArrayLike<number>;
  ratePlan: RatePlanInput;
  /** The IANA zone whose wall clock the plan's time-of-use hours are read on: the plan's utility's (usually the site's). */
  timeZone: string;
  /** The site's IANA zone, whose standard time the hourly rows are in (default: `timeZone`). */
  siteTimeZone?: string;
  payment: PaymentInput;
  adderIds: readonly string[];
  lineItemIds: readonly string[];
  discountCents: number;
  assumptions?: Partial<OfferAssumptions>;
  notes?: string[];
};

export type OfferSummary = {
  moduleCount: number;
  kwDc: number;
  annualProductionKwh: number;
  offsetPct: number;
  grossCents: number;
  discountCents: number;
  /** What the customer signs for, before incentives. */
  contractCents: number;
  incentivesCents: number;
  /** Contract − incentives. */
  netCostCents: number;
  monthlyLoanPaymentCents: number | null;
  year1SavingsCents: number;
  /** Year the cumulative cash flow turns positive (escalation, degradation and loan payments included). */
  paybackYears: number | null;
  /** Net cost ÷ year-1 savings (figures saved before this field have none). */
  simplePaybackYears?: number | null;
  /** Paid at signing and taken off the loan (loans only). */
  downPaymentCents?: number | null;
  /** Borrowed: price − down payment − incentives applied at signing, before any dealer fee (loans only). */
  loanAmountCents?: number | null;
  /** ROI's denominator: what the homeowner pays for the system over the table (down payment or price, loan payments, upkeep) less incentives received. */
  roiBasisCents?: number;
  simpleRoi: number | null;
  /** Bill savings over the table's years. */
  lifetimeSavingsCents: number;
  /** Cumulative cash flow at the table's last year. */
  lifetimeNetCents: number;
  npvCents: number;
  irr: number | null;
  /** Why there is no IRR ("not meaningful: …"). */
  irrNote?: string | null;
  lcoeCentsPerKwh: number | null;
};

export type OfferFigures = {
  version: 1;
  asOf: string;
  summary: OfferSummary;
  price: OfferPrice;
  discountNeedsApproval: boolean;
  discountLimitCents: number | null;
  incentives: IncentiveResult;
  monthly: { usageKwh: number[]; productionKwh: number[]; billWithoutSolarCents: number[]; billWithSolarCents: number[] };
  rows: CashflowRow[];
  assumptions: OfferAssumptions & { ratePlanName: string; calendarYear: number; installDate?: ExpectedInstall };
  notes: string[];
  caution: string;
  /** Where the weather year was measured (set by the server for a station's year; absent for a typed figure and on older figures). */
  weatherStation?: WeatherStationPlace;
};

/** A weather station's name and position. */
export type WeatherStationPlace = { name: string; latitude: number; longitude: number };

const round = (x: number, digits = 1) => Math.round(x * 10 ** digits) / 10 ** digits;

/** Days from offer to installation assumed when no install date is planned yet (our choice; typical permitting and scheduling). */
export const DEFAULT_INSTALL_LEAD_DAYS = 60;

/** The install date credits that count at installation were judged on, and where it came from. */
export type ExpectedInstall = { date: string; source: "job" | "lead_time" };

export function expectedInstall(input: Pick<OfferFiguresInput, "asOf" | "expectedInstallDate">): ExpectedInstall {
  return input.expectedInstallDate ? { date: input.expectedInstallDate, source: "job" } : { date: addDays(input.asOf, DEFAULT_INSTALL_LEAD_DAYS), source: "lead_time" };
}

/** "2026-12-15, the job's planned install date" */
export function describeExpectedInstall(e: ExpectedInstall): string {
  return e.source === "job" ? `${e.date}, the job's planned install date` : `${e.date}, the offer date + ${DEFAULT_INSTALL_LEAD_DAYS} days (no install date planned yet)`;
}

function addDays(isoDate: string, days: number): string {
  const [y, m, d] = isoDate.split("-").map(Number);
  return new Date(Date.UTC(y, m - 1, d + days)).toISOString().slice(0, 10);
}

/** The figures a person reads first, rounded as shown. */
function summaryOf(x: {
  input: OfferFiguresInput;
  kwDc: number;
  price: OfferPrice;
  incentives: IncentiveResult;
  cashflow: ReturnType<typeof buildCashflow>;
  downPaymentCents: number;
  annualProductionKwh: number;
  annualUsageKwh: number;
  year1SavingsCents: number;
}): OfferSummary {
  const { price, incentives } = x;
  const s = x.cashflow.summary;
  const roundOrNull = (v: number | null, digits: number) => (v === null ? null : round(v, digits));
  return {
    moduleCount: x.input.moduleCount,
    kwDc: x.kwDc,
    annualProductionKwh: round(x.annualProductionKwh),
    offsetPct: x.annualUsageKwh > 0 ? round((x.annualProductionKwh / x.annualUsageKwh) * 100, 1) : 0,
    grossCents: price.grossCents,
    discountCents: price.discountCents,
    contractCents: price.contractCents,
    incentivesCents: incentives.totalCents,
    netCostCents: price.contractCents - incentives.totalCents,
    monthlyLoanPaymentCents: s.loan ? s.loan.monthlyPaymentCents : null,
    year1SavingsCents: x.year1SavingsCents,
    paybackYears: roundOrNull(s.paybackYears, 2),
    simplePaybackYears: roundOrNull(s.simplePaybackYears, 2),
    downPaymentCents: x.input.payment.kind === "loan" ? x.downPaymentCents : null,
    loanAmountCents: x.input.payment.kind === "loan" ? price.contractCents - x.downPaymentCents - incentives.upfrontCents : null,
    roiBasisCents: s.netCostCents,
    simpleRoi: roundOrNull(s.simpleRoi, 4),
    lifetimeSavingsCents: s.lifetimeSavingsCents,
    lifetimeNetCents: x.cashflow.rows[x.cashflow.rows.length - 1].cumulativeCents,
    npvCents: s.npvCents,
    irr: roundOrNull(s.irr, 6),
    irrNote: s.irrNote,
    lcoeCentsPerKwh: roundOrNull(s.lcoeCentsPerKwh, 2),
  };
}

/** What a loan takes off the amount borrowed at signing: at least the deposit, never more than the price. */
function downPaymentFor(payment: PaymentInput, price: OfferPrice): number {
  if (payment.kind !== "loan") return 0;
  const downPaymentCents = payment.downPaymentCents ?? price.depositCents;
  if (downPaymentCents < price.depositCents) {
    throw new PricingInputError("payment.downPaymentCents", `the ${formatCents(price.depositCents)} deposit is paid at signing and counts toward the price, so the down payment is at least that`);
  }
  if (downPaymentCents > price.contractCents) throw new PricingInputError("payment.downPaymentCents", "the down payment is more than the price");
  return downPaymentCents;
}

/** The bill without solar, and with solar for each year of the table (re-billed with that year's degraded output). */
function billsByYear(input: OfferFiguresInput, calendarYear: number, a: OfferAssumptions) {
  const bill = makeBillCalculator(input.ratePlan, { calendarYear, timeZone: input.timeZone, rowsTimeZone: input.siteTimeZone ?? null });
  const without = bill(input.usageHourlyKwh, null);
  const produced = Float64Array.from(input.productionHourlyKwh);
  const degraded = new Float64Array(HOURS_PER_YEAR);
  const withByYear = [];
  for (let n = 1; n <= a.years; n++) {
    const f = Math.pow(1 - a.degradationPctPerYear / 100, n - 1);
    for (let h = 0; h < HOURS_PER_YEAR; h++) degraded[h] = produced[h] * f;
    withByYear.push(bill(input.usageHourlyKwh, degraded));
  }
  return { without, withByYear, produced };
}

/**
 * Credits that count at installation are judged on the expected install date; a dealer fee
 * inside the loan is part of what the homeowner pays for the system (the credit's basis). The
 * fee depends on the amount borrowed, which upfront incentives lower: one pass without it finds
 * those, the second prices the fee in.
 */
function offerIncentives(input: OfferFiguresInput, price: OfferPrice, kwDc: number, downPaymentCents: number): IncentiveResult {
  const installDate = expectedInstall(input).date;
  const incentivesWith = (dealerFeeCents: number) =>
    evaluateIncentives({ rules: incentiveRulesForEngine(input.book), asOf: input.asOf, installDate, grossPriceCents: price.contractCents, dealerFeeCents, systemKwDc: kwDc, payment: input.payment.kind });
  const first = incentivesWith(0);
  if (input.payment.kind !== "loan" || input.payment.dealerFeePct <= 0) return first;
  const borrowed = Math.max(0, price.contractCents - downPaymentCents - first.upfrontCents);
  const { dealerFeeCents } = amortizeLoan({ amountCents: borrowed, aprPct: input.payment.aprPct, termMonths: input.payment.termMonths, dealerFeePct: input.payment.dealerFeePct, dealerFeeMode: "added" });
  return incentivesWith(dealerFeeCents);
}

/** Price, bills, incentives and the 25-year table for one offer. Throws PricingInputError / EngineInputError on bad input. */
export function computeOfferFigures(input: OfferFiguresInput): OfferFigures {
  const a: OfferAssumptions = { ...DEFAULT_OFFER_ASSUMPTIONS, ...input.assumptions };
  const notes = [...(input.notes ?? [])];
  const dcWatts = input.moduleCount * input.moduleWatts;
  const kwDc = dcWatts / 1000;
  const price = priceOffer(input.book, {
    dcWatts,
    moduleCount: input.moduleCount,
    adderIds: input.adderIds,
    lineItemIds: input.lineItemIds,
    discountCents: input.discountCents,
    role: input.role,
  });

  // A loan is counted to its last payment: the analysis runs at least its term.
  const loanYears = input.payment.kind === "loan" ? Math.ceil(input.payment.termMonths / 12) : 0;
  if (loanYears > a.years) {
    notes.push(`The table runs ${loanYears} years, the loan's term, instead of the usual ${a.years}, so every loan payment is counted.`);
    a.years = loanYears;
  }
  const downPaymentCents = downPaymentFor(input.payment, price);
  const calendarYear = Number(input.asOf.slice(0, 4));
  const { without, withByYear, produced } = billsByYear(input, calendarYear, a);
  const incentives = offerIncentives(input, price, kwDc, downPaymentCents);
  if (incentives.byYear.length > a.years + 1) notes.push(`Incentives paid after year ${a.years} are left out.`);

  const productionMonthly = monthlySums(produced);
  const annualProduction = productionMonthly.reduce((s, v) => s + v, 0);
  const usageMonthly = monthlySums(input.usageHourlyKwh);
  const annualUsage = usageMonthly.reduce((s, v) => s + v, 0);

  const cashflow = buildCashflow({
    years: a.years,
    grossPriceCents: price.contractCents,
    incentivesByYear: incentives.byYear.slice(0, a.years + 1),
    payment:
      input.payment.kind === "cash"
        ? { kind: "cash" }
        : { kind: "loan", aprPct: input.payment.aprPct, termMonths: input.payment.termMonths, dealerFeePct: input.payment.dealerFeePct, dealerFeeMode: "added", downPaymentCents },
    year1ProductionKwh: annualProduction,
    degradationPctPerYear: a.degradationPctPerYear,
    billWithoutSolarCents: without.totalCents,
    billWithSolarCents: withByYear.map((b) => b.totalCents),
    utilityEscalationPctPerYear: a.utilityEscalationPctPerYear,
    discountRatePct: a.discountRatePct,
  });
  notes.push(...cashflow.summary.notes);

  return {
    version: 1,
    asOf: input.asOf,
    summary: summaryOf({ input, kwDc, price, incentives, cashflow, downPaymentCents, annualProductionKwh: annualProduction, annualUsageKwh: annualUsage, year1SavingsCents: without.totalCents - withByYear[0].totalCents }),
    price,
    discountNeedsApproval: price.discountNeedsApproval,
    discountLimitCents: price.discountLimitCents,
    incentives,
    monthly: {
      usageKwh: usageMonthly.map((v) => round(v)),
      productionKwh: productionMonthly.map((v) => round(v)),
      billWithoutSolarCents: without.months.map((m) => m.totalCents),
      billWithSolarCents: withByYear[0].months.map((m) => m.totalCents),
    },
    rows: cashflow.rows,
    assumptions: { ...a, ratePlanName: input.ratePlan.name, calendarYear, installDate: expectedInstall(input) },
    notes,
    caution: OFFER_CAUTION,
  };
}
