/**
 * One offer, end to end, from a JSON case: usage → (sizing) → production → bills before and
 * after solar → price and incentives → the 25-year table and its summary figures.
 *
 * The core stays pure: files are read by the caller (scripts/quote.ts) and the production model
 * is injected (`produce`), so this module can be tested with a stand-in and reused by the web
 * app with whatever weather it has loaded. The case format is documented in docs/quote-case.md.
 */
import { z } from "zod";
import { EngineInputError, parseOrThrow } from "./errors";
import { billSchema, fillMethodSchema, usageFromBills } from "./bills";
import { spreadMonthlyToHourly } from "./load-shape";
import { importIntervalData } from "./green-button";
import { makeBillCalculator, ratePlanSchema, type AnnualBill } from "./rates";
import { siteTimeZone } from "./site-time-zone";
import { amortizeLoan } from "./finance";
import { dcAcRatioWarning, sizeSystem, DEFAULT_MAX_DC_AC_RATIO, type SizingResult } from "./sizing";
import { evaluateIncentives, incentiveRuleSchema, type IncentiveResult } from "./incentives";
import { quoteBatteryBills, quoteBatterySchema, quoteThirdParty, type BatteryQuote, type ThirdPartyQuote } from "./quote-options";
import { leaseTermsSchema, ppaTermsSchema } from "./third-party";
import { buildCashflow, paybackYears, paymentSchema, DEFAULT_DEGRADATION_PCT, DEFAULT_DISCOUNT_RATE_PCT, DEFAULT_UTILITY_ESCALATION_PCT, DEFAULT_YEARS, type CashflowResult, type CashflowSummary } from "./cashflow";
import { checkString, stringCheckInputSchema, CAUTION, type StringCheckResult } from "./string-check";
import { HOURS_PER_YEAR, isTimeZone, monthlySums } from "./year-calendar";

const isoDate = z
  .string()
  .regex(/^\d{4}-\d{2}-\d{2}$/, "must be a date as YYYY-MM-DD")
  .refine((s) => {
    const [y, m, d] = s.split("-").map(Number);
    const t = new Date(Date.UTC(y, m - 1, d));
    return t.getUTCFullYear() === y && t.getUTCMonth() === m - 1 && t.getUTCDate() === d;
  }, "is not a real calendar date");

const caseFaceSchema = z.object({
  name: z.string().min(1).max(100),
  tiltDeg: z.number().finite().min(0).max(90),
  azimuthDeg: z.number().finite().min(0).max(360),
  /** Module positions that fit on the face. */
  usableSlots: z.number().int().min(0).max(1000),
  /** Modules placed; omit when `targetOffsetPct` sizes the system. */
  modules: z.number().int().min(0).max(1000).optional(),
  solarAccessPct: z.union([z.number().finite().min(0).max(100), z.array(z.number().finite().min(0).max(100)).length(12)]).default(100),
  mount: z.enum(["roof", "open-rack"]).default("roof"),
});

export const quoteCaseSchema = z
  .object({
    name: z.string().min(1).max(200),
    /** Offer date: incentives are evaluated at it. */
    asOf: isoDate,
    /** Expected installation date, for incentives that count at installation (default: asOf). */
    installDate: isoDate.optional(),
    site: z.object({
      latitude: z.number().finite().min(-90).max(90),
      longitude: z.number().finite().min(-180).max(180),
      utcOffsetHours: z.number().finite().min(-12).max(14).optional(),
      /** IANA time zone for time-of-use clock hours; default: looked up from the coordinates. */
      timeZone: z.string().refine(isTimeZone, { message: "is not a known time zone (IANA name, e.g. America/New_York)" }).optional(),
    }),
    /** Weather file, path relative to the case file (read by the caller). */
    weather: z.object({ file: z.string().min(1) }),
    usage: z.discriminatedUnion("kind", [
      z.object({ kind: z.literal("bills"), bills: z.array(billSchema).min(1), fill: fillMethodSchema.default("auto") }),
      z.object({ kind: z.literal("monthly"), monthlyKwh: z.array(z.number().finite().min(0)).length(12) }),
      z.object({ kind: z.literal("interval"), file: z.string().min(1) }),
    ]),
    design: z.object({
      module: z.object({
        watts: z.number().finite().min(10).max(1500),
        /** Pmax temperature coefficient, %/°C, from the datasheet. */
        gammaPctPerC: z.number().finite().min(-1).max(0).optional(),
      }),
      faces: z.array(caseFaceSchema).min(1).max(24),
      inverter: z.discriminatedUnion("kind", [
        z.object({ kind: z.literal("string"), acKw: z.number().finite().positive().max(10_000), efficiencyPct: z.number().finite().min(80).max(99.5).optional() }),
        z.object({ kind: z.literal("micro"), acWattsPerModule: z.number().finite().positive().max(2000), efficiencyPct: z.number().finite().min(80).max(99.5).optional() }),
      ]),
      /** Combined system losses, % (default: the production model's PVWatts breakdown). */
      lossesPct: z.number().finite().min(0).max(99).optional(),
      /** When given, the sizing helper sets each face's module count. */
      targetOffsetPct: z.number().finite().min(1).max(200).optional(),
      maxDcAcRatio: z.number().finite().min(0.8).max(3).default(DEFAULT_MAX_DC_AC_RATIO),
      /** Optional string check (string inverters): module and inverter electrical data and temperatures. */
      stringCheck: z.unknown().optional(),
    }),
    ratePlan: ratePlanSchema,
    price: z.object({
      /** Base price per watt DC, cents (from the price book's size band). */
      perWattCents: z.number().finite().min(0).max(10_000),
      adders: z.array(z.object({ label: z.string().min(1), amountCents: z.number().int().min(0) })).default([]),
      discountCents: z.number().int().min(0).default(0),
    }),
    incentives: z.array(incentiveRuleSchema).default([]),
    /** Cash, a loan, or a partner's lease or PPA (third-party.ts). */
    financing: z.discriminatedUnion("kind", [...paymentSchema.options, leaseTermsSchema, ppaTermsSchema]),
    /** A battery with the system (battery.ts): its bills, savings and backup hours. */
    battery: quoteBatterySchema.optional(),
    assumptions: z
      .object({
        years: z.number().int().min(1).max(50).default(DEFAULT_YEARS),
        degradationPctPerYear: z.number().finite().min(0).max(10).default(DEFAULT_DEGRADATION_PCT),
        utilityEscalationPctPerYear: z.number().finite().min(-10).max(20).default(DEFAULT_UTILITY_ESCALATION_PCT),
        discountRatePct: z.number().finite().min(-50).max(50).default(DEFAULT_DISCOUNT_RATE_PCT),
        omCentsPerYear: z.number().int().min(0).default(0),
        /** Calendar year whose weekdays the time-of-use periods follow (default: the offer's year). */
        calendarYear: z.number().int().min(1900).max(2200).optional(),
      })
      .default({ years: DEFAULT_YEARS, degradationPctPerYear: DEFAULT_DEGRADATION_PCT, utilityEscalationPctPerYear: DEFAULT_UTILITY_ESCALATION_PCT, discountRatePct: DEFAULT_DISCOUNT_RATE_PCT, omCentsPerYear: 0 }),
  })
  .superRefine((c, ctx) => {
    c.design.faces.forEach((f, i) => {
      if (c.design.targetOffsetPct === undefined && f.modules === undefined) {
        ctx.addIssue({ code: "custom", path: ["design", "faces", i, "modules"], message: "give the module count, or a design.targetOffsetPct to size the system" });
      }
      if (f.modules !== undefined && f.modules > f.usableSlots) {
        ctx.addIssue({ code: "custom", path: ["design", "faces", i, "modules"], message: `${f.modules} modules do not fit in ${f.usableSlots} usable slots` });
      }
    });
  });
export type QuoteCaseInput = z.input<typeof quoteCaseSchema>;
type QuoteCase = z.output<typeof quoteCaseSchema>;
type Purchase = z.output<typeof paymentSchema>;

/** What the production model is asked for: faces with module counts, the inverter, losses. */
export type ProductionDesign = {
  faces: {
    name: string;
    tiltDeg: number;
    azimuthDeg: number;
    moduleCount: number;
    moduleWatts: number;
    solarAccessPct: number | number[];
    gammaPctPerC?: number;
    mount: "roof" | "open-rack";
  }[];
  inverter: { kind: "string"; acKw?: number; dcAcRatio?: number; efficiencyPct?: number } | { kind: "micro"; acWattsPerModule: number; efficiencyPct?: number };
  losses?: { totalPct: number };
};

export type ProductionOutput = { hourlyAcKwh: ArrayLike<number>; dcKw: number; acKw: number };
/** The production model, injected (scripts/quote.ts wires src/engine/production.ts). */
export type ProduceFn<W> = (design: ProductionDesign, weather: W) => ProductionOutput;

export type QuoteContext<W> = {
  weather: W;
  produce: ProduceFn<W>;
  /** The site's typical-year hourly air temperature (for the degree-day fill of missing bills). */
  hourlyTempC?: ArrayLike<number>;
  /** Text of the interval-data file when usage.kind is "interval". */
  intervalText?: string;
  /** Where the weather came from, for the report. */
  weatherLabel?: string;
  /** The weather file's standard UTC offset, used for interval data when neither the file nor the case gives one. */
  weatherUtcOffsetHours?: number;
  /** What the caller found about the weather (timing against the sun, distance to the station), for the notes. */
  weatherNotes?: string[];
};

type MonthlyBillSummary = { month: number; withoutSolarCents: number; withSolarCents: number; importKwh: number; exportKwh: number };

export type QuoteResult = {
  name: string;
  asOf: string;
  usage: { source: string; monthlyKwh: number[]; annualKwh: number; estimated: boolean; notes: string[] };
  design: {
    faces: { name: string; modules: number; kwDc: number; specificYieldKwhPerKw: number | null }[];
    modules: number;
    kwDc: number;
    kwAc: number;
    dcAcRatio: number | null;
    sizing: SizingResult | null;
  };
  production: { monthlyKwh: number[]; annualKwh: number; specificYieldKwhPerKw: number; offsetPct: number; weather: string | null };
  bills: { year1WithoutSolarCents: number; year1WithSolarCents: number; year1SavingsCents: number; months: MonthlyBillSummary[] };
  price: { grossCents: number; perWattCents: number; adders: { label: string; amountCents: number }[]; discountCents: number };
  incentives: IncentiveResult;
  /** The year-by-year table; its summary is a purchase's (null for a lease or PPA: see thirdParty). */
  cashflow: { rows: CashflowResult["rows"]; summary: CashflowSummary | null };
  /** A lease's or PPA's own figures (null for a purchase). */
  thirdParty: ThirdPartyQuote | null;
  /** The battery's figures, apart from the solar's (null without one). */
  battery: BatteryQuote | null;
  summary: {
    kwDc: number;
    annualProductionKwh: number;
    offsetPct: number;
    grossPriceCents: number;
    incentivesCents: number;
    netPriceCents: number;
    year1SavingsCents: number;
    lifetimeSavingsCents: number;
    /** Year the cumulative cash flow turns positive (escalation, degradation, loan payments included). */
    paybackYears: number | null;
    /** Net cost ÷ year-1 savings. */
    simplePaybackYears: number | null;
    /** ROI's denominator: down payment or price, loan payments and upkeep, less incentives received. */
    roiBasisCents: number;
    simpleRoi: number | null;
    npvCents: number;
    irr: number | null;
    /** Why irr is null ("not meaningful: …"). */
    irrNote: string | null;
    lcoeCentsPerKwh: number | null;
    monthlyLoanPaymentCents: number | null;
  };
  stringCheck: StringCheckResult | null;
  assumptions: Record<string, number | string>;
  notes: string[];
  caution: string;
};

const sum = (xs: ArrayLike<number>) => {
  let s = 0;
  for (let i = 0; i < xs.length; i++) s += xs[i];
  return s;
};
const round = (x: number, digits = 1) => Math.round(x * 10 ** digits) / 10 ** digits;

function checkHourly(name: string, series: ArrayLike<number>): void {
  if (series.length !== HOURS_PER_YEAR) throw new EngineInputError([{ path: name, message: `expected ${HOURS_PER_YEAR} hourly values, got ${series.length}` }], "quote");
  for (let h = 0; h < HOURS_PER_YEAR; h++) {
    if (!(Number.isFinite(series[h]) && series[h] >= 0)) throw new EngineInputError([{ path: `${name}.${h}`, message: "must be a finite number ≥ 0" }], "quote");
  }
}

/** Run the whole chain for one case. */
/** Step 1 of a quote: the 8760 hourly kWh of usage, from bills, twelve months or interval data. */
function quoteUsage<W>(c: QuoteCase, ctx: QuoteContext<W>): { usageHourly: number[]; usageSource: string; usageEstimated: boolean; usageNotes: string[] } {
  let usageHourly: number[];
  let usageSource: string;
  let usageEstimated: boolean;
  const usageNotes: string[] = [];
  if (c.usage.kind === "bills") {
    const temps = ctx.hourlyTempC ? Array.from(ctx.hourlyTempC) : undefined;
    const year = usageFromBills({ bills: c.usage.bills, fill: c.usage.fill, hourlyTempC: temps });
    usageHourly = spreadMonthlyToHourly(year.monthlyKwh).hourlyKwh;
    usageSource = `${c.usage.bills.length} bill(s); ${year.measuredMonths} month(s) measured, fill: ${year.fillMethod}; hours from the reference load shape`;
    usageEstimated = true;
    usageNotes.push(...year.warnings);
  } else if (c.usage.kind === "monthly") {
    usageHourly = spreadMonthlyToHourly(c.usage.monthlyKwh).hourlyKwh;
    usageSource = "12 monthly kWh; hours from the reference load shape";
    usageEstimated = true;
  } else {
    if (ctx.intervalText === undefined) throw new EngineInputError([{ path: "usage.file", message: "the interval file's text was not supplied" }], "quote");
    const profile = importIntervalData(ctx.intervalText, { utcOffsetHours: c.site.utcOffsetHours ?? ctx.weatherUtcOffsetHours });
    usageHourly = profile.hourlyKwh;
    usageSource = `interval data: ${profile.readings} readings, ${round(profile.coverage * 100)} % of hours measured`;
    usageEstimated = profile.coverage < 1;
    usageNotes.push(...profile.notes);
  }
  return { usageHourly, usageSource, usageEstimated, usageNotes };
}

/** Step 2 of a quote: the faces' module counts (sized to the target offset when one is given) and the production model's design. */
function quoteLayout<W>(c: QuoteCase, ctx: QuoteContext<W>, annualUsage: number, notes: string[]) {
  const d = c.design;
  const inverter: ProductionDesign["inverter"] =
    d.inverter.kind === "string"
      ? { kind: "string", acKw: d.inverter.acKw, ...(d.inverter.efficiencyPct !== undefined ? { efficiencyPct: d.inverter.efficiencyPct } : {}) }
      : { kind: "micro", acWattsPerModule: d.inverter.acWattsPerModule, ...(d.inverter.efficiencyPct !== undefined ? { efficiencyPct: d.inverter.efficiencyPct } : {}) };
  const losses = d.lossesPct !== undefined ? { totalPct: d.lossesPct } : undefined;
  const faceFor = (f: (typeof d.faces)[number], moduleCount: number): ProductionDesign["faces"][number] => ({
    name: f.name,
    tiltDeg: f.tiltDeg,
    azimuthDeg: f.azimuthDeg,
    moduleCount,
    moduleWatts: d.module.watts,
    solarAccessPct: f.solarAccessPct,
    mount: f.mount,
    ...(d.module.gammaPctPerC !== undefined ? { gammaPctPerC: d.module.gammaPctPerC } : {}),
  });

  let counts = d.faces.map((f) => f.modules ?? 0);
  let sizing: SizingResult | null = null;
  const specificYield: (number | null)[] = d.faces.map(() => null);
  if (d.targetOffsetPct !== undefined) {
    // Each face alone, unclipped (DC/AC 1.0 string inverter, or the design's micros), gives its kWh per kW DC.
    d.faces.forEach((f, i) => {
      if (f.usableSlots === 0) return;
      const probeInverter: ProductionDesign["inverter"] = inverter.kind === "micro" ? inverter : { kind: "string", dcAcRatio: 1 };
      const out = ctx.produce({ faces: [faceFor(f, f.usableSlots)], inverter: probeInverter, losses }, ctx.weather);
      specificYield[i] = out.dcKw > 0 ? sum(out.hourlyAcKwh) / out.dcKw : 0;
    });
    sizing = sizeSystem({
      annualUsageKwh: annualUsage,
      targetOffsetPct: d.targetOffsetPct,
      moduleWatts: d.module.watts,
      faces: d.faces.map((f, i) => ({ id: f.name, usableSlots: f.usableSlots, specificYieldKwhPerKw: specificYield[i] ?? 0 })),
      inverterAcKw: d.inverter.kind === "string" ? d.inverter.acKw : undefined,
      maxDcAcRatio: d.maxDcAcRatio,
      dcAcMode: "limit",
    });
    counts = sizing.modulesByFace.map((f) => f.modules);
    notes.push(...sizing.warnings);
  }
  const placed = d.faces.map((f, i) => ({ f, n: counts[i] })).filter((x) => x.n > 0);
  if (placed.length === 0) throw new EngineInputError([{ path: "design.faces", message: "no modules placed on any face" }], "quote");
  const totalModules = placed.reduce((s, x) => s + x.n, 0);
  const kwDc = (totalModules * d.module.watts) / 1000;

  return { d, inverter, losses, faceFor, counts, sizing, specificYield, placed, totalModules, kwDc };
}

/** The quote's headline figures, rounded as reported. */
function quoteSummary(x: { kwDc: number; annualProduction: number; offsetPct: number; grossCents: number; incentives: IncentiveResult; year1SavingsCents: number; s: CashflowSummary }): QuoteResult["summary"] {
  const { kwDc, annualProduction, offsetPct, grossCents, incentives, s } = x;
return {
    kwDc,
    annualProductionKwh: round(annualProduction),
    offsetPct: round(offsetPct, 2),
    grossPriceCents: grossCents,
    incentivesCents: incentives.totalCents,
    netPriceCents: grossCents - incentives.totalCents,
    year1SavingsCents: x.year1SavingsCents,
    lifetimeSavingsCents: s.lifetimeSavingsCents,
    paybackYears: s.paybackYears === null ? null : round(s.paybackYears, 2),
    simplePaybackYears: s.simplePaybackYears === null ? null : round(s.simplePaybackYears, 2),
    simpleRoi: s.simpleRoi === null ? null : round(s.simpleRoi, 4),
    roiBasisCents: s.netCostCents,
    npvCents: s.npvCents,
    irr: s.irr === null ? null : round(s.irr, 6),
    irrNote: s.irrNote,
    lcoeCentsPerKwh: s.lcoeCentsPerKwh === null ? null : round(s.lcoeCentsPerKwh, 2),
    monthlyLoanPaymentCents: s.loan ? s.loan.monthlyPaymentCents : null,
  };
}

/** Step 4 of a quote: the bill without solar, and with solar for each year of the table (re-billed with that year's degraded output). */
function quoteBills(c: QuoteCase, years: number, degradationPctPerYear: number, calendarYear: number, usageHourly: number[], productionHourly: Float64Array) {
  const clock = { calendarYear, timeZone: c.site.timeZone ?? siteTimeZone(c.site.latitude, c.site.longitude) };
  const bill = makeBillCalculator(c.ratePlan, clock);
  const without = bill(usageHourly, null);
  const degraded = new Float64Array(HOURS_PER_YEAR);
  const withByYear: AnnualBill[] = [];
  for (let n = 1; n <= years; n++) {
    const f = Math.pow(1 - degradationPctPerYear / 100, n - 1);
    for (let h = 0; h < HOURS_PER_YEAR; h++) degraded[h] = productionHourly[h] * f;
    withByYear.push(bill(usageHourly, degraded));
  }
  return { without, withByYear, clock };
}

/** Step 5 of a quote: the incentives; a dealer fee inside the loan is part of the system cost a percent credit takes (see incentives.ts). */
function quoteIncentives(c: QuoteCase, financing: Purchase, grossCents: number, kwDc: number): IncentiveResult {
  const incentivesWith = (dealerFeeCents: number) =>
    evaluateIncentives({ rules: c.incentives, asOf: c.asOf, installDate: c.installDate, grossPriceCents: grossCents, dealerFeeCents, systemKwDc: kwDc, payment: financing.kind });
  const first = incentivesWith(0);
  if (financing.kind === "loan" && financing.dealerFeePct > 0 && financing.dealerFeeMode === "added") {
    const f = financing;
    const borrowed = Math.max(0, grossCents - f.downPaymentCents - first.upfrontCents);
    return incentivesWith(amortizeLoan({ amountCents: borrowed, aprPct: f.aprPct, termMonths: f.termMonths, dealerFeePct: f.dealerFeePct, dealerFeeMode: "added" }).dealerFeeCents);
  }
  return first;
}

/** Step 5's table: the cash flow over the analysis years. */
function quoteCashflow(financing: Purchase, a: QuoteCase["assumptions"], grossCents: number, incentives: IncentiveResult, annualProduction: number, without: AnnualBill, withByYear: AnnualBill[]) {
  return buildCashflow({
    years: a.years,
    grossPriceCents: grossCents,
    incentivesByYear: incentives.byYear.slice(0, a.years + 1),
    payment: financing,
    year1ProductionKwh: annualProduction,
    degradationPctPerYear: a.degradationPctPerYear,
    billWithoutSolarCents: without.totalCents,
    billWithSolarCents: withByYear.map((b) => b.totalCents),
    utilityEscalationPctPerYear: a.utilityEscalationPctPerYear,
    discountRatePct: a.discountRatePct,
    omCentsPerYear: a.omCentsPerYear,
  });
}

const pickAssumptions = (a: QuoteCase["assumptions"]) => ({
  years: a.years,
  degradationPctPerYear: a.degradationPctPerYear,
  utilityEscalationPctPerYear: a.utilityEscalationPctPerYear,
  discountRatePct: a.discountRatePct,
  omCentsPerYear: a.omCentsPerYear,
});

/** Year 1's bills without and with solar, month by month. */
function billsReport(without: AnnualBill, withYear1: AnnualBill): QuoteResult["bills"] {
return {
    year1WithoutSolarCents: without.totalCents,
    year1WithSolarCents: withYear1.totalCents,
    year1SavingsCents: without.totalCents - withYear1.totalCents,
    months: without.months.map((m, i) => ({
      month: m.month,
      withoutSolarCents: m.totalCents,
      withSolarCents: withYear1.months[i].totalCents,
      importKwh: round(withYear1.months[i].importKwh),
      exportKwh: round(withYear1.months[i].exportKwh),
    })),
  };
}

type MoneyInputs = { grossCents: number; kwDc: number; annualProduction: number; productionHourly: Float64Array; without: AnnualBill; withByYear: AnnualBill[] };
type Headline = { kwDc: number; annualProduction: number; offsetPct: number; grossCents: number; year1SavingsCents: number };

/** Step 5 of a quote: incentives and the table, for a purchase (cash, loan) or a partner's lease or PPA. */
function quoteMoney(c: QuoteCase, a: QuoteCase["assumptions"], m: MoneyInputs) {
  const f = c.financing;
  if (f.kind === "cash" || f.kind === "loan") {
    const incentives = quoteIncentives(c, f, m.grossCents, m.kwDc);
    const cashflow = quoteCashflow(f, a, m.grossCents, incentives, m.annualProduction, m.without, m.withByYear);
    const notes = [...(incentives.byYear.length > a.years + 1 ? [`Incentives paid after year ${a.years} are left out.`] : []), ...cashflow.summary.notes];
    return { incentives, cashflow, thirdParty: null, notes, summaryOf: (h: Headline) => quoteSummary({ ...h, incentives, s: cashflow.summary }) };
  }
  const { result, quote } = quoteThirdParty({ terms: f, rules: c.incentives, asOf: c.asOf, installDate: c.installDate, grossPriceCents: m.grossCents, kwDc: m.kwDc, productionHourly: m.productionHourly, degradationPctPerYear: a.degradationPctPerYear, utilityEscalationPctPerYear: a.utilityEscalationPctPerYear, discountRatePct: a.discountRatePct, without: m.without, withByYear: m.withByYear, battery: c.battery ?? null });
  const notes = quote.ownerIncentives.totalCents > 0 ? [`${quote.partner} owns the system and claims its incentives (${quote.ownerIncentives.applied.map((i) => i.name).join(", ")}); they lower its price and are not the homeowner's.`] : [];
  const paid = quote.totalPaidCents - quote.homeownerIncentivesCents;
  // A lease or PPA has no purchase price: the headline carries what the homeowner pays over the term.
  const summaryOf = (h: Headline): QuoteResult["summary"] => ({
    ...quoteSummary({ ...h, incentives: quote.homeownerIncentives, s: { netCostCents: paid, lifetimeSavingsCents: quote.lifetimeBillSavingsCents, paybackYears: paybackYears(result.rows.map((r) => r.cashFlowCents)), simplePaybackYears: null, simpleRoi: null, npvCents: quote.npvCents, irr: null, irrNote: `not computed for a ${f.kind}: the homeowner buys no system to earn a return on`, lcoeCentsPerKwh: null, simpleLcoeCentsPerKwh: null, loan: null, lifetimeProductionKwh: 0, notes: [] } }),
    netPriceCents: paid,
  });
  return { incentives: quote.homeownerIncentives, cashflow: { rows: result.rows, summary: null }, thirdParty: quote, notes, summaryOf };
}

export function buildQuote<W>(input: QuoteCaseInput, ctx: QuoteContext<W>): QuoteResult {
  const c = parseOrThrow(quoteCaseSchema, input, "quote case");
  const notes: string[] = [...(ctx.weatherNotes ?? [])];
  // A loan is counted to its last payment: the analysis runs at least its term.
  // A lease or PPA is counted over its term.
  const loanYears = c.financing.kind === "loan" ? Math.ceil(c.financing.termMonths / 12) : 0;
  const a = { ...c.assumptions, years: c.financing.kind === "lease" || c.financing.kind === "ppa" ? c.financing.termYears : Math.max(c.assumptions.years, loanYears) };
  const calendarYear = a.calendarYear ?? Number(c.asOf.slice(0, 4));

  // 1. Usage: 8760 hourly kWh.
  const { usageHourly, usageSource, usageEstimated, usageNotes } = quoteUsage(c, ctx);
  const usageMonthly = monthlySums(usageHourly);
  const annualUsage = sum(usageMonthly);
  if (!(annualUsage > 0)) throw new EngineInputError([{ path: "usage", message: "annual usage must be greater than 0 kWh" }], "quote");

  // 2. Design: sizing when a target offset is given.
  const { d, inverter, losses, faceFor, counts, sizing, specificYield, placed, totalModules, kwDc } = quoteLayout(c, ctx, annualUsage, notes);

  // 3. Production.
  const production = ctx.produce({ faces: placed.map((x) => faceFor(x.f, x.n)), inverter, losses }, ctx.weather);
  checkHourly("production.hourlyAcKwh", production.hourlyAcKwh);
  const productionHourly = Float64Array.from(production.hourlyAcKwh);
  const productionMonthly = monthlySums(productionHourly);
  const annualProduction = sum(productionMonthly);
  const dcAcRatio = d.inverter.kind === "string" ? kwDc / d.inverter.acKw : d.module.watts / d.inverter.acWattsPerModule;
  const dcAcNote = dcAcRatioWarning(d.inverter.kind, dcAcRatio, d.inverter.kind === "string" ? d.maxDcAcRatio : undefined);
  if (dcAcNote) notes.push(dcAcNote);

  // 4. Bills: year 1 without and with solar; with solar re-billed for each year's degraded output (and the battery dispatched again).
  const { without, withByYear: solarOnlyByYear, clock } = quoteBills(c, a.years, a.degradationPctPerYear, calendarYear, usageHourly, productionHourly);
  const batteryBills = c.battery
    ? quoteBatteryBills({ battery: c.battery, plan: c.ratePlan, clock, usageHourly, productionHourly, years: a.years, degradationPctPerYear: a.degradationPctPerYear, utilityEscalationPctPerYear: a.utilityEscalationPctPerYear, without, solarOnlyByYear })
    : null;
  const withByYear = batteryBills?.withByYear ?? solarOnlyByYear;
  const withYear1 = withByYear[0];
  if (a.years > c.assumptions.years) notes.push(`The table runs ${a.years} years, the ${c.financing.kind}'s term, instead of ${c.assumptions.years}, so every payment is counted.`);
  if (a.years < c.assumptions.years) notes.push(`The table runs ${a.years} years, the ${c.financing.kind}'s term, instead of ${c.assumptions.years}.`);

  // 5. Price, incentives, cash flow.
  const addersCents = c.price.adders.reduce((s, x) => s + x.amountCents, 0);
  const grossCents = Math.max(0, Math.round(kwDc * 1000 * c.price.perWattCents) + addersCents - c.price.discountCents) + (c.battery?.priceCents ?? 0);
  const money = quoteMoney(c, a, { grossCents, kwDc, annualProduction, productionHourly, without, withByYear });
  notes.push(...money.notes);

  // 6. String check (optional).
  const stringCheck: StringCheckResult | null = d.stringCheck === undefined ? null : checkString(parseOrThrow(stringCheckInputSchema, d.stringCheck, "design.stringCheck"));

  const offsetPct = (annualProduction / annualUsage) * 100;
  return {
    name: c.name,
    asOf: c.asOf,
    usage: { source: usageSource, monthlyKwh: usageMonthly.map((v) => round(v)), annualKwh: round(annualUsage), estimated: usageEstimated, notes: usageNotes },
    design: {
      faces: d.faces.map((f, i) => ({ name: f.name, modules: counts[i], kwDc: (counts[i] * d.module.watts) / 1000, specificYieldKwhPerKw: specificYield[i] === null ? null : round(specificYield[i] ?? 0) })),
      modules: totalModules,
      kwDc,
      kwAc: production.acKw,
      dcAcRatio: dcAcRatio === null ? null : round(dcAcRatio, 3),
      sizing,
    },
    production: {
      monthlyKwh: productionMonthly.map((v) => round(v)),
      annualKwh: round(annualProduction),
      specificYieldKwhPerKw: round(annualProduction / kwDc),
      offsetPct: round(offsetPct, 2),
      weather: ctx.weatherLabel ?? null,
    },
    bills: billsReport(without, withYear1),
    price: { grossCents, perWattCents: c.price.perWattCents, adders: c.price.adders, discountCents: c.price.discountCents },
    incentives: money.incentives,
    cashflow: money.cashflow,
    thirdParty: money.thirdParty,
    battery: batteryBills?.report ?? null,
    summary: money.summaryOf({ kwDc, annualProduction, offsetPct, grossCents, year1SavingsCents: without.totalCents - withYear1.totalCents }),
    stringCheck,
    assumptions: { ...pickAssumptions(a), calendarYear, lcoe: "discounted LCOE (Short, Packey & Holt 1995, NREL/TP-462-5173)", degradation: "Jordan & Kurtz 2013 median, compounded yearly" },
    notes,
    caution: CAUTION,
  };
}
