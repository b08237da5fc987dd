/**
 * Rate plans and monthly utility bills before and after solar.
 *
 * A rate plan = energy prices (flat, monthly kWh tiers, or time-of-use periods by season,
 * weekday/weekend and hour) + a fixed monthly charge + a monthly minimum bill + how exported
 * energy is compensated:
 * - net metering: within a month, imports and exports are netted (per time-of-use period for
 *   TOU plans). A net-negative period earns a credit at that period's retail price (tiered
 *   plans: at the first tier's price — our assumption). Credits pay energy charges, never the
 *   fixed charge or the minimum bill, and carry forward month to month. At the annual true-up
 *   (end of `trueUpMonth`) the cycle's net surplus kWh (exports − imports over the 12 months,
 *   if positive) is paid at `surplusCentsPerKwh` and any unused credit lapses. This mirrors
 *   the common U.S. scheme (e.g. net surplus compensation at true-up), stated from memory.
 * - net billing: every hour's imports are bought at retail and every hour's net export is
 *   credited at `exportCentsPerKwh`; the credit pays energy charges and carries forward; unused
 *   credit lapses at the true-up month.
 * - no export: exported energy is worth 0.
 *
 * Hours are those of the typical year (see year-calendar.ts): 8760 values, hour 0 = 1 January
 * 00:00 local standard time. Time-of-use windows are clock hours: they are applied on the wall
 * clock of the site's time zone, daylight saving included, when one is given. Weekdays come from
 * `calendarYear` (default 2023, 1 January a Sunday), with 29 February skipped; public holidays are
 * treated as ordinary days. Each bill line is rounded to the cent.
 */
import { z } from "zod";
import { EngineInputError, parseOrThrow } from "./errors";
import { clockOfTypicalHours, HOURS_PER_YEAR, HOUR_MONTH, isTimeZone, type YearClock } from "./year-calendar";

const centsPerKwhSchema = z.number().finite().min(0).max(10_000);
const monthSchema = z.number().int().min(1).max(12);
const timeZoneSchema = z.string().refine(isTimeZone, { message: "is not a known time zone (IANA name, e.g. America/Denver)" });

export const flatEnergySchema = z.object({ kind: z.literal("flat"), centsPerKwh: centsPerKwhSchema });

export const tieredEnergySchema = z.object({
  kind: z.literal("tiered"),
  /** Monthly kWh tiers in ascending order; the last has `upToKwh: null` (no limit). */
  tiers: z
    .array(z.object({ upToKwh: z.number().finite().positive().nullable(), centsPerKwh: centsPerKwhSchema }))
    .min(1)
    .superRefine((tiers, ctx) => {
      tiers.forEach((tier, i) => {
        const last = i === tiers.length - 1;
        if (last && tier.upToKwh !== null) ctx.addIssue({ code: "custom", path: [i, "upToKwh"], message: "the last tier must have no limit (null)" });
        if (!last && tier.upToKwh === null) ctx.addIssue({ code: "custom", path: [i, "upToKwh"], message: "only the last tier may have no limit" });
        const prev = i > 0 ? tiers[i - 1].upToKwh : null;
        if (i > 0 && tier.upToKwh !== null && prev !== null && tier.upToKwh <= prev) {
          ctx.addIssue({ code: "custom", path: [i, "upToKwh"], message: "tier limits must increase" });
        }
      });
    }),
});

const hourRangeSchema = z
  .object({
    /** First hour (0–23) of the range, inclusive. */
    startHour: z.number().int().min(0).max(23),
    /** Hour (1–24) the range ends, exclusive; smaller than startHour to wrap past midnight. */
    endHour: z.number().int().min(1).max(24),
    periodId: z.string().min(1),
  })
  .refine((r) => r.startHour !== r.endHour % 24, { message: "an hour range must not be empty", path: ["endHour"] });

export const touEnergySchema = z
  .object({
    kind: z.literal("tou"),
    periods: z.array(z.object({ id: z.string().min(1), label: z.string().optional(), centsPerKwh: centsPerKwhSchema })).min(1),
    /** Each month belongs to exactly one season. Later ranges win where ranges overlap. */
    seasons: z
      .array(
        z.object({
          name: z.string().min(1),
          months: z.array(monthSchema).min(1),
          /** Period for hours no range names. */
          otherHoursPeriodId: z.string().min(1),
          weekday: z.array(hourRangeSchema).default([]),
          weekend: z.array(hourRangeSchema).default([]),
        }),
      )
      .min(1),
  })
  .superRefine((tou, ctx) => {
    const ids = new Set(tou.periods.map((p) => p.id));
    if (ids.size !== tou.periods.length) ctx.addIssue({ code: "custom", path: ["periods"], message: "period ids must be unique" });
    const seen = new Map<number, string>();
    tou.seasons.forEach((season, s) => {
      if (!ids.has(season.otherHoursPeriodId)) {
        ctx.addIssue({ code: "custom", path: ["seasons", s, "otherHoursPeriodId"], message: `unknown period "${season.otherHoursPeriodId}"` });
      }
      (["weekday", "weekend"] as const).forEach((dayType) =>
        season[dayType].forEach((range, r) => {
          if (!ids.has(range.periodId)) {
            ctx.addIssue({ code: "custom", path: ["seasons", s, dayType, r, "periodId"], message: `unknown period "${range.periodId}"` });
          }
        }),
      );
      season.months.forEach((month, i) => {
        const other = seen.get(month);
        if (other !== undefined) {
          ctx.addIssue({ code: "custom", path: ["seasons", s, "months", i], message: `month ${month} is already in season "${other}"` });
        }
        seen.set(month, season.name);
      });
    });
    for (let month = 1; month <= 12; month++) {
      if (!seen.has(month)) ctx.addIssue({ code: "custom", path: ["seasons"], message: `month ${month} is in no season` });
    }
  });

export const compensationSchema = z.discriminatedUnion("kind", [
  z.object({
    kind: z.literal("net-metering"),
    /** Month (1–12) at whose end the annual true-up happens. */
    trueUpMonth: monthSchema.default(12),
    /** Price paid for the cycle's net surplus kWh at true-up. */
    surplusCentsPerKwh: centsPerKwhSchema.default(0),
  }),
  z.object({
    kind: z.literal("net-billing"),
    exportCentsPerKwh: centsPerKwhSchema,
    /** Month (1–12) at whose end unused export credit lapses. */
    trueUpMonth: monthSchema.default(12),
  }),
  z.object({ kind: z.literal("no-export") }),
]);

export const ratePlanSchema = z.object({
  name: z.string().min(1),
  fixedMonthlyCents: z.number().int().min(0).default(0),
  /** The least a monthly bill can be (fixed charge included). */
  minimumBillCents: z.number().int().min(0).default(0),
  energy: z.discriminatedUnion("kind", [flatEnergySchema, tieredEnergySchema, touEnergySchema]),
  compensation: compensationSchema,
  /** Whether the plan lets a home battery charge from the grid (battery.ts; absent: no). */
  batteryGridChargingAllowed: z.boolean().optional(),
});
export type RatePlan = z.output<typeof ratePlanSchema>;
export type RatePlanInput = z.input<typeof ratePlanSchema>;

export const billInputSchema = z.object({
  plan: ratePlanSchema,
  usageHourlyKwh: z.array(z.number().finite().min(0)).length(HOURS_PER_YEAR),
  /** Omit (or null) for the bill without solar. */
  productionHourlyKwh: z.array(z.number().finite().min(0)).length(HOURS_PER_YEAR).nullable().optional(),
  calendarYear: z.number().int().min(1900).max(2200).default(2023),
  /** IANA zone whose wall clock the TOU hours are read on; null: local standard time. */
  timeZone: timeZoneSchema.nullable().default(null),
});
export type BillInput = z.input<typeof billInputSchema>;

export type BillLine = {
  kind: "fixed" | "energy" | "export-credit" | "credit-applied" | "minimum-bill" | "true-up" | "credit-lapsed";
  label: string;
  kwh?: number;
  centsPerKwh?: number;
  amountCents: number;
};

export type MonthlyBill = {
  /** 1–12 */
  month: number;
  importKwh: number;
  exportKwh: number;
  lines: BillLine[];
  totalCents: number;
  /** Unused credit carried into the next month (after any true-up). */
  creditCarriedCents: number;
};

export type AnnualBill = {
  months: MonthlyBill[];
  totalCents: number;
  importKwh: number;
  exportKwh: number;
};

export type BillComparison = {
  withoutSolar: AnnualBill;
  withSolar: AnnualBill;
  annualSavingsCents: number;
};

/**
 * Period index (into `periods`) of every hour of the typical year for a TOU plan. The plan's
 * hours, weekdays and seasons are read on the wall clock of `clock.timeZone` (utilities state
 * "4–9 pm" in the local clock time, daylight saving included) with weekdays of
 * `clock.calendarYear`; without a zone, in local standard time.
 */
export function touPeriodByHour(energy: z.output<typeof touEnergySchema>, clock: YearClock = { calendarYear: 2023, timeZone: null }): Uint8Array {
  const idIndex = new Map(energy.periods.map((p, i) => [p.id, i]));
  const seasonOfMonth = new Array<z.output<typeof touEnergySchema>["seasons"][number]>(12);
  for (const season of energy.seasons) for (const month of season.months) seasonOfMonth[month - 1] = season;
  // Hour → period for each month × day type (24-hour template), then paint the year.
  const templates = seasonOfMonth.map((season) =>
    (["weekday", "weekend"] as const).map((dayType) => {
      const day = new Uint8Array(24).fill(idIndex.get(season.otherHoursPeriodId) ?? 0);
      for (const range of season[dayType]) {
        const p = idIndex.get(range.periodId) ?? 0;
        for (let k = 0; k < 24; k++) {
          const hour = (range.startHour + k) % 24;
          if (k > 0 && hour === range.endHour % 24) break;
          day[hour] = p;
        }
      }
      return day;
    }),
  );
  const wall = clockOfTypicalHours(clock);
  const out = new Uint8Array(HOURS_PER_YEAR);
  for (let h = 0; h < HOURS_PER_YEAR; h++) {
    const weekday = wall.weekday[h];
    out[h] = templates[wall.month[h]][weekday === 0 || weekday === 6 ? 1 : 0][wall.hour[h]];
  }
  return out;
}

type PeriodInfo = { labels: string[]; prices: number[]; byHour: Uint8Array | null };

function periodsOf(plan: RatePlan, clock: YearClock): PeriodInfo {
  const e = plan.energy;
  if (e.kind === "tou") {
    return { labels: e.periods.map((p) => p.label ?? p.id), prices: e.periods.map((p) => p.centsPerKwh), byHour: touPeriodByHour(e, clock) };
  }
  // Flat and tiered: one period; for a net-metering credit a tiered kWh is valued at the first tier's price.
  return { labels: ["all hours"], prices: [e.kind === "flat" ? e.centsPerKwh : e.tiers[0].centsPerKwh], byHour: null };
}

/** Energy-charge lines for the month's chargeable kWh by period. */
function energyLines(plan: RatePlan, info: PeriodInfo, chargeableKwh: number[]): BillLine[] {
  const e = plan.energy;
  if (e.kind === "flat") {
    return [{ kind: "energy", label: "energy", kwh: chargeableKwh[0], centsPerKwh: e.centsPerKwh, amountCents: Math.round(chargeableKwh[0] * e.centsPerKwh) }];
  }
  if (e.kind === "tiered") {
    const lines: BillLine[] = [];
    let remaining = chargeableKwh[0];
    let floor = 0;
    e.tiers.forEach((tier, i) => {
      const width = tier.upToKwh === null ? Infinity : tier.upToKwh - floor;
      const kwh = Math.max(0, Math.min(remaining, width));
      if (kwh > 0 || i === 0) {
        lines.push({ kind: "energy", label: `tier ${i + 1}`, kwh, centsPerKwh: tier.centsPerKwh, amountCents: Math.round(kwh * tier.centsPerKwh) });
      }
      remaining -= kwh;
      floor = tier.upToKwh ?? floor;
    });
    return lines;
  }
  return info.prices.map((price, p) => ({
    kind: "energy" as const,
    label: info.labels[p],
    kwh: chargeableKwh[p],
    centsPerKwh: price,
    amountCents: Math.round(chargeableKwh[p] * price),
  }));
}

/** Twelve monthly bills (January first) for one year of hourly usage and, optionally, production. */
export function billYear(input: BillInput): AnnualBill {
  const parsed = parseOrThrow(billInputSchema, input, "bill");
  return billYearParsed(parsed.plan, parsed.usageHourlyKwh, parsed.productionHourlyKwh ?? null, periodsOf(parsed.plan, parsed));
}

/** Bills without and with solar under one plan. */
export function compareBills(input: BillInput & { productionHourlyKwh: number[] }): BillComparison {
  const parsed = parseOrThrow(billInputSchema, input, "bill");
  if (!parsed.productionHourlyKwh) throw new EngineInputError([{ path: "productionHourlyKwh", message: "is required" }], "bill");
  const info = periodsOf(parsed.plan, parsed);
  const withoutSolar = billYearParsed(parsed.plan, parsed.usageHourlyKwh, null, info);
  const withSolar = billYearParsed(parsed.plan, parsed.usageHourlyKwh, parsed.productionHourlyKwh, info);
  return { withoutSolar, withSolar, annualSavingsCents: withoutSolar.totalCents - withSolar.totalCents };
}

/**
 * A reusable bill calculator for one plan: validates the plan once and precomputes the TOU
 * calendar, for callers that bill many production series (e.g. each year of degradation).
 */
export function makeBillCalculator(plan: RatePlanInput, clock: YearClock = { calendarYear: 2023, timeZone: null }): (usageHourlyKwh: ArrayLike<number>, productionHourlyKwh: ArrayLike<number> | null) => AnnualBill {
  const parsedPlan = parseOrThrow(ratePlanSchema, plan, "rate plan");
  if (clock.timeZone !== null && !isTimeZone(clock.timeZone)) throw new EngineInputError([{ path: "timeZone", message: `"${clock.timeZone}" is not a known time zone` }], "bill");
  if (clock.rowsTimeZone && !isTimeZone(clock.rowsTimeZone)) throw new EngineInputError([{ path: "rowsTimeZone", message: `"${clock.rowsTimeZone}" is not a known time zone` }], "bill");
  const info = periodsOf(parsedPlan, clock);
  return (usage, production) => {
    const lengthIssues = [
      ...(usage.length !== HOURS_PER_YEAR ? [{ path: "usageHourlyKwh", message: `must have ${HOURS_PER_YEAR} values, got ${usage.length}` }] : []),
      ...(production && production.length !== HOURS_PER_YEAR ? [{ path: "productionHourlyKwh", message: `must have ${HOURS_PER_YEAR} values, got ${production.length}` }] : []),
    ];
    if (lengthIssues.length > 0) throw new EngineInputError(lengthIssues, "bill");
    for (let h = 0; h < HOURS_PER_YEAR; h++) {
      if (!(usage[h] >= 0 && Number.isFinite(usage[h]))) throw new EngineInputError([{ path: `usageHourlyKwh.${h}`, message: "must be a finite number ≥ 0" }], "bill");
      if (production && !(production[h] >= 0 && Number.isFinite(production[h]))) {
        throw new EngineInputError([{ path: `productionHourlyKwh.${h}`, message: "must be a finite number ≥ 0" }], "bill");
      }
    }
    return billYearParsed(parsedPlan, usage, production, info);
  };
}

/**
 * One month's fixed charge, energy lines and the credit its exports earn (banked; applied to
 * energy charges by the caller): net metering nets each period's imports and exports at its
 * retail price; net billing buys every import and credits exports at the export rate.
 */
function monthLines(plan: RatePlan, info: PeriodInfo, imp: Float64Array, exp: Float64Array, exportKwh: number): { lines: BillLine[]; creditEarned: number } {
  const comp = plan.compensation;
  const nPeriods = info.prices.length;
  const chargeable = new Array<number>(nPeriods);
  let creditEarned = 0;
  const lines: BillLine[] = [];
  if (plan.fixedMonthlyCents > 0) lines.push({ kind: "fixed", label: "fixed monthly charge", amountCents: plan.fixedMonthlyCents });

  if (comp.kind === "net-metering") {
    let excessKwh = 0;
    let excessValue = 0;
    for (let p = 0; p < nPeriods; p++) {
      const net = imp[p] - exp[p];
      chargeable[p] = Math.max(0, net);
      if (net < 0) {
        excessKwh -= net;
        excessValue -= net * info.prices[p];
      }
    }
    lines.push(...energyLines(plan, info, chargeable));
    creditEarned = Math.round(excessValue);
    if (creditEarned > 0) {
      lines.push({ kind: "export-credit", label: "net excess credit earned (banked)", kwh: excessKwh, amountCents: 0 });
    }
    return { lines, creditEarned };
  }
  for (let p = 0; p < nPeriods; p++) chargeable[p] = imp[p];
  lines.push(...energyLines(plan, info, chargeable));
  if (comp.kind === "net-billing") {
    creditEarned = Math.round(exportKwh * comp.exportCentsPerKwh);
    if (exportKwh > 0) {
      lines.push({ kind: "export-credit", label: "export credit earned (banked)", kwh: exportKwh, centsPerKwh: comp.exportCentsPerKwh, amountCents: 0 });
    }
  }
  return { lines, creditEarned };
}

function billYearParsed(plan: RatePlan, usage: ArrayLike<number>, production: ArrayLike<number> | null, info: PeriodInfo): AnnualBill {
  const nPeriods = info.prices.length;
  const imports = Array.from({ length: 12 }, () => new Float64Array(nPeriods));
  const exports = Array.from({ length: 12 }, () => new Float64Array(nPeriods));
  for (let h = 0; h < HOURS_PER_YEAR; h++) {
    const net = usage[h] - (production ? production[h] : 0);
    const m = HOUR_MONTH[h];
    const p = info.byHour ? info.byHour[h] : 0;
    if (net >= 0) imports[m][p] += net;
    else exports[m][p] -= net;
  }

  const comp = plan.compensation;
  const trueUpIndex = comp.kind === "no-export" ? 11 : comp.trueUpMonth - 1;
  const months = new Array<MonthlyBill>(12);
  let carried = 0;
  let cycleImport = 0;
  let cycleExport = 0;
  // Walk the billing cycle from the month after the true-up to the true-up month.
  for (let k = 1; k <= 12; k++) {
    const m = (trueUpIndex + k) % 12;
    const imp = imports[m];
    const exp = exports[m];
    const importKwh = imp.reduce((a, b) => a + b, 0);
    const exportKwh = exp.reduce((a, b) => a + b, 0);
    cycleImport += importKwh;
    cycleExport += exportKwh;

    const { lines, creditEarned } = monthLines(plan, info, imp, exp, exportKwh);

    const energyCents = lines.filter((l) => l.kind === "energy").reduce((a, l) => a + l.amountCents, 0);
    const available = carried + creditEarned;
    const applied = Math.min(available, energyCents);
    carried = available - applied;
    if (applied > 0) lines.push({ kind: "credit-applied", label: "credit applied to energy charges", amountCents: -applied });

    const subtotal = lines.reduce((a, l) => a + l.amountCents, 0);
    if (subtotal < plan.minimumBillCents) {
      lines.push({ kind: "minimum-bill", label: "minimum bill top-up", amountCents: plan.minimumBillCents - subtotal });
    }

    if (m === trueUpIndex && comp.kind !== "no-export") {
      if (comp.kind === "net-metering") {
        const surplusKwh = Math.max(0, cycleExport - cycleImport);
        const payment = Math.round(surplusKwh * comp.surplusCentsPerKwh);
        if (surplusKwh > 0) {
          lines.push({ kind: "true-up", label: "annual true-up: net surplus paid", kwh: surplusKwh, centsPerKwh: comp.surplusCentsPerKwh, amountCents: -payment });
        }
      }
      if (carried > 0) {
        lines.push({ kind: "credit-lapsed", label: `unused credit lapses at true-up ($${(carried / 100).toFixed(2)})`, amountCents: 0 });
        carried = 0;
      }
    }

    months[m] = {
      month: m + 1,
      importKwh,
      exportKwh,
      lines,
      totalCents: lines.reduce((a, l) => a + l.amountCents, 0),
      creditCarriedCents: carried,
    };
  }
  return {
    months,
    totalCents: months.reduce((a, b) => a + b.totalCents, 0),
    importKwh: cycleImport,
    exportKwh: cycleExport,
  };
}
