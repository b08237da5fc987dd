/**
 * Utility bills → 12 monthly kWh for a typical usage year.
 *
 * Day counting: a bill covers its start date through its end date, both days included, as a
 * person reads "1 January – 31 January" (31 days, a full January). Bills printed with meter-read
 * dates (read on 14 January, next read on 14 February, the next bill starting 14 February) are
 * recognised two ways, and then their end date is the next period's first day, not theirs: the
 * end date falls on the same day of the month as the start (14 January – 14 February, 1 March –
 * 1 April), or another bill starts on it (the boundary day counts once, in the later bill). Each bill's kWh is spread evenly over its days (kWh per day = kWh /
 * days) and each day's share is added to its calendar month.
 *
 * A calendar month is "measured" when bills cover more than half of its days
 * (MIN_MEASURED_COVERAGE); its kWh is then the average kWh per covered day × the days of that
 * month in the typical 365-day year (so a partly covered month is scaled up to a full month,
 * and a leap-year February is scaled to 28 days). A month covered half or less is "estimated":
 * it keeps the energy billed on its covered days, and the fill model supplies only its
 * uncovered share (estimate × uncovered fraction). When bills cover more than a year, the same
 * calendar month from different years is pooled (kWh per covered day).
 *
 * Fill models for estimated months:
 * - "seasonal": the measured months set the level, a monthly shape sets the pattern
 *   (estimate_m = shape_m · Σ_measured kWh / Σ_measured shape). Default shape: the reference
 *   residential load (NREL/ssc test input, see data/reference-load-8760.ts).
 * - "degree-day": a PRISM-style regression (Fels 1986, "PRISM: an introduction", Energy and
 *   Buildings 9: kWh/day = α + β_h·HDD(τ_h)/day + β_c·CDD(τ_c)/day, reference temperatures
 *   chosen by best fit) against the site's typical-year hourly air temperature. Needs at least
 *   6 measured months (MIN_MONTHS_FOR_DEGREE_DAY). The measured months are regressed on the
 *   typical year's degree-days, not on the weather of the billing year (that weather is not
 *   known here), so the fit describes a typical year.
 */
import { z } from "zod";
import { EngineInputError, parseOrThrow, type EngineIssue } from "./errors";
import { referenceMonthlyKwh } from "./load-shape";
import { DAYS_PER_YEAR, HOURS_PER_YEAR, MONTH_DAYS, MONTH_START_DAY } from "./year-calendar";

/** Longest billing period accepted, days (monthly bills run 28–35 days; bi-monthly ≈ 61). */
export const MAX_BILL_DAYS = 100;
/** A month counts as measured when bills cover more than this fraction of its days (our choice). */
export const MIN_MEASURED_COVERAGE = 0.5;
/** PRISM-style fitting needs at least this many measured months (3 parameters + 3 degrees of freedom). */
export const MIN_MONTHS_FOR_DEGREE_DAY = 6;
/**
 * A degree-day fit is used only when its adjusted R² reaches this (common practice for monthly
 * weather normalisation; PRISM users commonly require R² ≥ 0.7, from memory).
 */
export const MIN_DEGREE_DAY_ADJUSTED_R2 = 0.7;
/** Reference-temperature search grid, °C (PRISM searches τ by best fit, Fels 1986). */
export const HEATING_BASE_RANGE_C = { min: 10, max: 22, step: 0.5 } as const;
export const COOLING_BASE_RANGE_C = { min: 16, max: 28, step: 0.5 } as const;

const isoDate = z
  .string()
  .regex(/^\d{4}-\d{2}-\d{2}$/, "must be a date as YYYY-MM-DD")
  .refine((s) => isRealDate(s), "is not a real calendar date");

export const billSchema = z.object({
  id: z.string().min(1).optional(),
  startDate: isoDate,
  endDate: isoDate,
  kwh: z.number().finite(),
  costCents: z.number().int().min(0).optional(),
});
export type Bill = z.infer<typeof billSchema>;

export const fillMethodSchema = z.enum(["auto", "seasonal", "degree-day"]);

export const billsInputSchema = z.object({
  bills: z.array(billSchema).min(1, "at least one bill is needed"),
  /** "auto": degree-day when weather is given, ≥ 6 months are measured and the fit is good; else seasonal. */
  fill: fillMethodSchema.default("auto"),
  /** The site's typical-year hourly air temperature, °C, 8760 values (hour 0 = 1 Jan 00:00 local standard time). */
  hourlyTempC: z.array(z.number().finite().min(-70).max(65)).length(HOURS_PER_YEAR).optional(),
  /** Monthly shape for the seasonal fill (any scale, 12 non-negative values); default: the reference load. */
  seasonalShape: z.array(z.number().finite().min(0)).length(12).optional(),
});
export type BillsInput = z.input<typeof billsInputSchema>;

export type MonthUsage = {
  /** 1–12 */
  month: number;
  kwh: number;
  status: "measured" | "estimated";
  coveredDays: number;
  /** Covered days / days in the month (pooled over years, capped at 1). */
  coverage: number;
};

export type DegreeDayFit = {
  model: "heating+cooling" | "heating" | "cooling" | "constant";
  alphaKwhPerDay: number;
  betaHeatingKwhPerDegreeDay: number;
  betaCoolingKwhPerDegreeDay: number;
  heatingBaseC: number | null;
  coolingBaseC: number | null;
  r2: number;
  adjustedR2: number;
  months: number;
};

export type UsageYear = {
  monthlyKwh: number[];
  annualKwh: number;
  months: MonthUsage[];
  measuredMonths: number;
  fillMethod: "none" | "seasonal" | "degree-day";
  degreeDayFit: DegreeDayFit | null;
  /** Σ bill cost / Σ bill kWh, cents per kWh, when every bill has a cost. */
  averageCentsPerKwh: number | null;
  warnings: string[];
};

const MONTH_NAMES = ["January", "February", "March", "April", "May", "June", "July", "August", "September", "October", "November", "December"];

function isRealDate(s: string): boolean {
  const [y, m, d] = s.split("-").map(Number);
  const t = new Date(Date.UTC(y, m - 1, d));
  return t.getUTCFullYear() === y && t.getUTCMonth() === m - 1 && t.getUTCDate() === d;
}

/** Days since 1970-01-01 of an ISO date (UTC calendar arithmetic, no time zones involved). */
function dayNumber(iso: string): number {
  const [y, m, d] = iso.split("-").map(Number);
  return Math.round(Date.UTC(y, m - 1, d) / 86_400_000);
}

function billName(bill: Bill, index: number): string {
  return bill.id ? `bill ${index + 1} ("${bill.id}", ${bill.startDate} → ${bill.endDate})` : `bill ${index + 1} (${bill.startDate} → ${bill.endDate})`;
}

/**
 * The days each bill covers, [first, end) as day numbers: start through end date inclusive,
 * except for meter-read dates (same day of the month at both ends, or the end date is another
 * bill's start), whose end date is the next period's first day.
 */
function billSpans(bills: readonly Bill[]): { first: number; end: number }[] {
  const starts = new Set(bills.map((b) => b.startDate));
  return bills.map((b) => {
    const first = dayNumber(b.startDate);
    const last = dayNumber(b.endDate);
    const readDates = last > first && (starts.has(b.endDate) || b.endDate.slice(8) === b.startDate.slice(8));
    return { first, end: readDates ? last : last + 1 };
  });
}

/** Check periods and kWh; throws one EngineInputError naming every bad bill. */
function checkBills(bills: Bill[]): void {
  const issues: EngineIssue[] = [];
  const spans = billSpans(bills);
  bills.forEach((bill, i) => {
    const days = spans[i].end - spans[i].first;
    if (dayNumber(bill.endDate) <= dayNumber(bill.startDate)) {
      issues.push({ path: `bills.${i}.endDate`, message: `${billName(bill, i)}: the end date must be after the start date` });
    } else if (days > MAX_BILL_DAYS) {
      issues.push({ path: `bills.${i}.endDate`, message: `${billName(bill, i)}: a ${days}-day billing period is longer than ${MAX_BILL_DAYS} days` });
    }
    if (!(bill.kwh > 0)) {
      issues.push({ path: `bills.${i}.kwh`, message: `${billName(bill, i)}: kWh must be greater than 0` });
    }
  });
  const order = bills.map((_, i) => i).sort((a, b) => spans[a].first - spans[b].first);
  for (let k = 1; k < order.length; k++) {
    for (let j = 0; j < k; j++) {
      const a = order[j];
      const b = order[k];
      const overlapStart = Math.max(spans[a].first, spans[b].first);
      const overlapEnd = Math.min(spans[a].end, spans[b].end);
      if (overlapEnd > overlapStart) {
        issues.push({
          path: `bills.${b}.startDate`,
          message: `${billName(bills[b], b)} overlaps ${billName(bills[a], a)} by ${overlapEnd - overlapStart} day(s)`,
        });
      }
    }
  }
  if (issues.length > 0) throw new EngineInputError(issues, "bills");
}

/** Daily mean air temperature (365 values) from 8760 hourly values. */
export function dailyMeanTempC(hourlyTempC: readonly number[]): number[] {
  const out = new Array<number>(DAYS_PER_YEAR).fill(0);
  for (let h = 0; h < HOURS_PER_YEAR; h++) out[Math.floor(h / 24)] += hourlyTempC[h] / 24;
  return out;
}

/**
 * Monthly heating and cooling degree-days (°C·day) from daily mean temperatures, with bases
 * τ_h and τ_c: HDD = Σ max(0, τ_h − T_day), CDD = Σ max(0, T_day − τ_c) (Fels 1986).
 */
export function monthlyDegreeDays(dailyTempC: readonly number[], heatingBaseC: number, coolingBaseC: number): { hdd: number[]; cdd: number[] } {
  const hdd = new Array<number>(12).fill(0);
  const cdd = new Array<number>(12).fill(0);
  for (let m = 0; m < 12; m++) {
    for (let d = MONTH_START_DAY[m]; d < MONTH_START_DAY[m] + MONTH_DAYS[m]; d++) {
      const t = dailyTempC[d];
      if (t < heatingBaseC) hdd[m] += heatingBaseC - t;
      if (t > coolingBaseC) cdd[m] += t - coolingBaseC;
    }
  }
  return { hdd, cdd };
}

/** Ordinary least squares y = X·b via the normal equations (at most 3 unknowns); null if singular. */
function leastSquares(rows: number[][], y: number[]): number[] | null {
  const p = rows[0].length;
  const a = Array.from({ length: p }, () => new Array<number>(p + 1).fill(0));
  for (let i = 0; i < rows.length; i++) {
    for (let r = 0; r < p; r++) {
      for (let c = 0; c < p; c++) a[r][c] += rows[i][r] * rows[i][c];
      a[r][p] += rows[i][r] * y[i];
    }
  }
  // Gauss–Jordan elimination with partial pivoting.
  for (let col = 0; col < p; col++) {
    let pivot = col;
    for (let r = col + 1; r < p; r++) if (Math.abs(a[r][col]) > Math.abs(a[pivot][col])) pivot = r;
    if (Math.abs(a[pivot][col]) < 1e-10) return null;
    [a[col], a[pivot]] = [a[pivot], a[col]];
    for (let r = 0; r < p; r++) {
      if (r === col) continue;
      const f = a[r][col] / a[col][col];
      for (let c = col; c <= p; c++) a[r][c] -= f * a[col][c];
    }
  }
  return a.map((row, r) => row[p] / row[r]);
}

type MonthSample = { month: number; kwhPerDay: number };

/**
 * PRISM-style fit (Fels 1986) of measured kWh/day against the typical year's degree-days/day.
 * Tries heating+cooling, heating-only and cooling-only models over the base-temperature grid;
 * a fit with a negative α or β is rejected (physically meaningless). The best adjusted R² wins.
 */
export function fitDegreeDayModel(samples: MonthSample[], hourlyTempC: readonly number[]): DegreeDayFit | null {
  const daily = dailyMeanTempC(hourlyTempC);
  const n = samples.length;
  if (n < 3) return null;
  const y = samples.map((s) => s.kwhPerDay);
  const meanY = y.reduce((a, b) => a + b, 0) / n;
  const ssTot = y.reduce((a, v) => a + (v - meanY) ** 2, 0);
  let best: DegreeDayFit | null = null;

  const consider = (model: DegreeDayFit["model"], hBase: number | null, cBase: number | null, rows: number[][]) => {
    const coef = leastSquares(rows, y);
    if (!coef || coef.some((c) => !Number.isFinite(c) || c < -1e-9)) return;
    let ssRes = 0;
    rows.forEach((row, i) => {
      const fitted = row.reduce((acc, x, k) => acc + x * coef[k], 0);
      ssRes += (y[i] - fitted) ** 2;
    });
    const regressors = rows[0].length - 1;
    const r2 = ssTot > 0 ? 1 - ssRes / ssTot : 1;
    const adjustedR2 = n - regressors - 1 > 0 ? 1 - ((1 - r2) * (n - 1)) / (n - regressors - 1) : r2;
    // Ties (within rounding) go to the earlier, simpler candidate.
    if (!best || adjustedR2 > best.adjustedR2 + 1e-12) {
      const beta = (k: number) => Math.max(0, coef[k]);
      best = {
        model,
        alphaKwhPerDay: Math.max(0, coef[0]),
        betaHeatingKwhPerDegreeDay: model === "heating" || model === "heating+cooling" ? beta(1) : 0,
        betaCoolingKwhPerDegreeDay: model === "cooling" ? beta(1) : model === "heating+cooling" ? beta(2) : 0,
        heatingBaseC: hBase,
        coolingBaseC: cBase,
        r2,
        adjustedR2,
        months: n,
      };
    }
  };

  const grid = (range: { min: number; max: number; step: number }) => {
    const out: number[] = [];
    for (let v = range.min; v <= range.max + 1e-9; v += range.step) out.push(Math.round(v * 100) / 100);
    return out;
  };
  const heatingBases = grid(HEATING_BASE_RANGE_C);
  const coolingBases = grid(COOLING_BASE_RANGE_C);
  const perDay = (values: number[]) => samples.map((s) => values[s.month] / MONTH_DAYS[s.month]);

  consider("constant", null, null, samples.map(() => [1]));
  for (const h of heatingBases) {
    const hdd = perDay(monthlyDegreeDays(daily, h, Infinity).hdd);
    if (hdd.every((v) => v === 0)) continue;
    consider("heating", h, null, samples.map((_, i) => [1, hdd[i]]));
  }
  for (const c of coolingBases) {
    const cdd = perDay(monthlyDegreeDays(daily, -Infinity, c).cdd);
    if (cdd.every((v) => v === 0)) continue;
    consider("cooling", null, c, samples.map((_, i) => [1, cdd[i]]));
  }
  if (n >= 4) {
    for (const h of heatingBases) {
      for (const c of coolingBases) {
        if (c < h) continue;
        const dd = monthlyDegreeDays(daily, h, c);
        const hdd = perDay(dd.hdd);
        const cdd = perDay(dd.cdd);
        if (hdd.every((v) => v === 0) || cdd.every((v) => v === 0)) continue;
        consider("heating+cooling", h, c, samples.map((_, i) => [1, hdd[i], cdd[i]]));
      }
    }
  }
  return best;
}

/** Predicted kWh for each calendar month (typical year) from a degree-day fit. */
export function predictMonthlyKwh(fit: DegreeDayFit, hourlyTempC: readonly number[]): number[] {
  const daily = dailyMeanTempC(hourlyTempC);
  const dd = monthlyDegreeDays(daily, fit.heatingBaseC ?? -Infinity, fit.coolingBaseC ?? Infinity);
  return MONTH_DAYS.map(
    (days, m) => fit.alphaKwhPerDay * days + fit.betaHeatingKwhPerDegreeDay * dd.hdd[m] + fit.betaCoolingKwhPerDegreeDay * dd.cdd[m],
  );
}

/** Spreads each bill over its days (billSpans) and pools them by calendar month of year. */
function spreadOverMonths(bills: readonly Bill[]) {
  const kwhByMonth = new Array<number>(12).fill(0);
  const daysByMonth = new Array<number>(12).fill(0);
  const spans = billSpans(bills);
  bills.forEach((bill, i) => {
    const { first, end } = spans[i];
    const perDay = bill.kwh / (end - first);
    for (let d = first; d < end; d++) {
      const m = new Date(d * 86_400_000).getUTCMonth();
      kwhByMonth[m] += perDay;
      daysByMonth[m] += 1;
    }
  });
  return { kwhByMonth, daysByMonth, spans };
}

/** What the bills leave out: more than a year pooled, gaps between bills, months scaled up or estimated (named). */
function coverageWarnings(bills: readonly Bill[], spans: { first: number; end: number }[], months: MonthUsage[], measuredCount: number): string[] {
  const warnings: string[] = [];
  const coveredDays = spans.reduce((a, s) => a + (s.end - s.first), 0);
  if (coveredDays > 366) {
    warnings.push(`Bills cover ${coveredDays} days, more than a year: the same calendar month from different years was averaged per day.`);
  }
  const sorted = [...bills.keys()].sort((a, b) => spans[a].first - spans[b].first);
  for (let k = 1; k < sorted.length; k++) {
    const gap = spans[sorted[k]].first - spans[sorted[k - 1]].end;
    if (gap > 0) warnings.push(`No bill covers ${gap} day(s) between ${bills[sorted[k - 1]].endDate} and ${bills[sorted[k]].startDate}.`);
  }
  months.forEach((mu) => {
    if (mu.status === "measured" && mu.coverage < 1) {
      warnings.push(`${MONTH_NAMES[mu.month - 1]} is ${Math.round(mu.coverage * 100)} % covered by bills; its kWh is scaled up from the covered days.`);
    }
  });
  const estimatedNames = months.filter((mu) => mu.status === "estimated").map((mu) => MONTH_NAMES[mu.month - 1]);
  if (estimatedNames.length > 0) {
    warnings.push(`${measuredCount} month(s) measured; estimated: ${estimatedNames.join(", ")} (billed days kept, the rest filled in).`);
  }
  return warnings;
}

/**
 * Fills the estimated months (changed in place): each keeps its billed kWh and gets the fill's
 * estimate for its uncovered share, from a degree-day fit to the site's temperatures when asked
 * for and good enough, else from the seasonal shape scaled to the measured months. Says in
 * `warnings` why a fit was not used.
 */
function fillEstimatedMonths(
  parsed: z.output<typeof billsInputSchema>,
  months: MonthUsage[],
  measuredIdx: number[],
  warnings: string[],
): { fillMethod: UsageYear["fillMethod"]; degreeDayFit: DegreeDayFit | null } {
  let degreeDayFit: DegreeDayFit | null = null;
  const wantsDegreeDay = parsed.fill === "degree-day" || parsed.fill === "auto";
  if (wantsDegreeDay) {
    if (!parsed.hourlyTempC) {
      if (parsed.fill === "degree-day") warnings.push("Degree-day fill needs the site's hourly temperatures; used the seasonal shape instead.");
    } else if (measuredIdx.length < MIN_MONTHS_FOR_DEGREE_DAY) {
      warnings.push(`Degree-day fill needs at least ${MIN_MONTHS_FOR_DEGREE_DAY} measured months; used the seasonal shape instead.`);
    } else {
      const fit = fitDegreeDayModel(
        measuredIdx.map((m) => ({ month: m, kwhPerDay: months[m].kwh / MONTH_DAYS[m] })),
        parsed.hourlyTempC,
      );
      if (fit && fit.adjustedR2 >= MIN_DEGREE_DAY_ADJUSTED_R2) {
        degreeDayFit = fit;
      } else {
        warnings.push(
          `Degree-day fit too weak (adjusted R² ${fit ? fit.adjustedR2.toFixed(2) : "n/a"} < ${MIN_DEGREE_DAY_ADJUSTED_R2}); used the seasonal shape instead.`,
        );
      }
    }
  }
  if (degreeDayFit && parsed.hourlyTempC) {
    const predicted = predictMonthlyKwh(degreeDayFit, parsed.hourlyTempC);
    months.forEach((mu, m) => {
      if (mu.status === "estimated") mu.kwh += predicted[m] * (1 - mu.coverage);
    });
    return { fillMethod: "degree-day", degreeDayFit };
  }
  const shape = parsed.seasonalShape ?? referenceMonthlyKwh();
  const measuredShape = measuredIdx.reduce((a, m) => a + shape[m], 0);
  const measuredKwh = measuredIdx.reduce((a, m) => a + months[m].kwh, 0);
  if (measuredShape <= 0) {
    throw new EngineInputError([{ path: "seasonalShape", message: "the shape is zero in every measured month" }], "bills");
  }
  const scale = measuredKwh / measuredShape;
  months.forEach((mu, m) => {
    if (mu.status === "estimated") mu.kwh += shape[m] * scale * (1 - mu.coverage);
  });
  return { fillMethod: "seasonal", degreeDayFit: null };
}

/** Bills → the household's 12 monthly kWh (Jan–Dec of a typical year), each flagged measured or estimated. */
export function usageFromBills(input: BillsInput): UsageYear {
  const parsed = parseOrThrow(billsInputSchema, input, "bills");
  const bills = parsed.bills;
  checkBills(bills);
  const { kwhByMonth, daysByMonth, spans } = spreadOverMonths(bills);

  const months: MonthUsage[] = MONTH_DAYS.map((days, m) => {
    const coverage = Math.min(1, daysByMonth[m] / days);
    const measured = coverage > MIN_MEASURED_COVERAGE;
    return {
      month: m + 1,
      // An estimated month keeps its billed kWh; the fill adds its uncovered share.
      kwh: measured ? (kwhByMonth[m] / daysByMonth[m]) * days : kwhByMonth[m],
      status: measured ? "measured" : "estimated",
      coveredDays: daysByMonth[m],
      coverage,
    };
  });
  const measuredIdx = months.flatMap((mu, m) => (mu.status === "measured" ? [m] : []));
  if (measuredIdx.length === 0) {
    throw new EngineInputError(
      [{ path: "bills", message: `no calendar month is covered for more than ${MIN_MEASURED_COVERAGE * 100} % of its days` }],
      "bills",
    );
  }
  const warnings = coverageWarnings(bills, spans, months, measuredIdx.length);
  const { fillMethod, degreeDayFit } = measuredIdx.length < 12 ? fillEstimatedMonths(parsed, months, measuredIdx, warnings) : { fillMethod: "none" as const, degreeDayFit: null };

  const monthlyKwh = months.map((mu) => mu.kwh);
  const allCosted = bills.every((b) => b.costCents !== undefined);
  const billKwh = bills.reduce((a, b) => a + b.kwh, 0);
  const billCost = bills.reduce((a, b) => a + (b.costCents ?? 0), 0);
  return {
    monthlyKwh,
    annualKwh: monthlyKwh.reduce((a, b) => a + b, 0),
    months,
    measuredMonths: measuredIdx.length,
    fillMethod,
    degreeDayFit,
    averageCentsPerKwh: allCosted && billKwh > 0 ? billCost / billKwh : null,
    warnings,
  };
}
