// Company settings (Settings → Company): the name and contractor licence number printed on
// proposals, the company's time zone for "today", the stall limits per stage that the Board
// and Today flag deals by, and the savings assumptions every new offer is figured with. The tunable parts live in company.settings (JSON); the name
// and licence number in their own columns. Shared by the form (zodResolver) and the server.
import { z } from "zod";
import { plainText } from "@/lib/schemas/text";
import type { Stage } from "@/lib/enums";
import { DEFAULT_DEGRADATION_PCT, DEFAULT_DISCOUNT_RATE_PCT, DEFAULT_UTILITY_ESCALATION_PCT, DEFAULT_YEARS } from "@/engine/cashflow";
import { DEFAULT_STALL_DAYS, PIPELINE } from "@/lib/stage-rules";

/** Stages a company may set a stall limit for: the main line up to Inspected, and On hold. */
export const STALL_STAGES = [...PIPELINE.filter((s) => s !== "live"), "on_hold"] as const satisfies readonly Stage[];
export type StallStage = (typeof STALL_STAGES)[number];

export const STALL_DAYS_MIN = 1;
export const STALL_DAYS_MAX = 365;

/**
 * Time zones offered for the company's working day (U.S. installers; IANA names). "Today"
 * and "this week" on a crew's queue are days in this zone.
 */
export const COMPANY_TIME_ZONES = [
  { id: "America/New_York", label: "Eastern" },
  { id: "America/Chicago", label: "Central" },
  { id: "America/Denver", label: "Mountain" },
  { id: "America/Phoenix", label: "Mountain, no daylight saving (Arizona)" },
  { id: "America/Los_Angeles", label: "Pacific" },
  { id: "America/Anchorage", label: "Alaska" },
  { id: "Pacific/Honolulu", label: "Hawaii" },
] as const;
export type CompanyTimeZone = (typeof COMPANY_TIME_ZONES)[number]["id"];
const TIME_ZONE_IDS = COMPANY_TIME_ZONES.map((z) => z.id) as [CompanyTimeZone, ...CompanyTimeZone[]];
/** Until a company picks its zone: the demo company's, and the most common one for U.S. installers' customers. */
export const DEFAULT_TIME_ZONE: CompanyTimeZone = "America/New_York";

/** Stall limit per stage: whole days, or null for "never flag". */
export type StallDays = Record<StallStage, number | null>;

/** The defaults of src/lib/stage-rules.ts, in the settings' shape. */
export const DEFAULT_STALL_SETTINGS: StallDays = Object.fromEntries(STALL_STAGES.map((s) => [s, DEFAULT_STALL_DAYS[s] ?? null])) as StallDays;

const stallDayValue = z.number().int().min(STALL_DAYS_MIN).max(STALL_DAYS_MAX).nullable();

/**
 * The savings assumptions of every new offer (offer-figures.ts OfferAssumptions): how many
 * years the savings run, how fast the modules' output falls and the utility's prices rise, and
 * the discount rate of the NPV and LCOE. Assumptions, not forecasts: the customer's page and
 * the proposal PDF state them. Saved proposals keep the figures they were made with.
 */
export type FinanceAssumptions = { years: number; degradationPctPerYear: number; utilityEscalationPctPerYear: number; discountRatePct: number };

/** The engine's defaults (src/engine/cashflow.ts names their sources). */
export const DEFAULT_FINANCE: FinanceAssumptions = {
  years: DEFAULT_YEARS,
  degradationPctPerYear: DEFAULT_DEGRADATION_PCT,
  utilityEscalationPctPerYear: DEFAULT_UTILITY_ESCALATION_PCT,
  discountRatePct: DEFAULT_DISCOUNT_RATE_PCT,
};

/**
 * What a company may set (our ranges: wide enough for any residential market, narrow enough
 * to catch a slip such as 25 for 2.5). Degradation: Jordan & Kurtz (2013) report module
 * medians near 0.5 %/yr, and few warranties allow more than 1 %/yr.
 */
export const FINANCE_LIMITS = {
  years: { min: 10, max: 40, integer: true, unit: "years" },
  degradationPctPerYear: { min: 0, max: 2, integer: false, unit: "%/yr" },
  utilityEscalationPctPerYear: { min: -2, max: 8, integer: false, unit: "%/yr" },
  discountRatePct: { min: 0, max: 15, integer: false, unit: "%" },
} as const satisfies Record<keyof FinanceAssumptions, { min: number; max: number; integer: boolean; unit: string }>;
export const FINANCE_KEYS = Object.keys(FINANCE_LIMITS) as (keyof FinanceAssumptions)[];

/** One assumption within its range; the message names the range and unit (the form shows it). */
const financeValue = (k: keyof FinanceAssumptions) => {
  const l = FINANCE_LIMITS[k];
  const message = l.integer ? `Whole ${l.unit} from ${l.min} to ${l.max}` : `A number from ${l.min} to ${l.max} (${l.unit})`;
  const n = z.number({ error: message }).min(l.min, message).max(l.max, message);
  return l.integer ? n.int(message) : n;
};

const objectOrEmpty = (v: unknown) => (v && typeof v === "object" && !Array.isArray(v) ? v : {});

/**
 * company.settings as stored, read forgivingly: a missing or damaged entry falls back to its
 * default, one stage (one assumption) at a time, so a bad value never hides the rest. Keys other
 * areas keep there pass through untouched.
 */
export const storedCompanySettingsSchema = z.preprocess(
  objectOrEmpty,
  z.looseObject({
    stallDays: z.preprocess(objectOrEmpty, z.object(Object.fromEntries(STALL_STAGES.map((s) => [s, stallDayValue.catch(DEFAULT_STALL_SETTINGS[s])])) as Record<StallStage, z.ZodCatch<typeof stallDayValue>>)),
    timeZone: z.enum(TIME_ZONE_IDS).catch(DEFAULT_TIME_ZONE),
    finance: z.preprocess(objectOrEmpty, z.object(Object.fromEntries(FINANCE_KEYS.map((k) => [k, financeValue(k).catch(DEFAULT_FINANCE[k])])) as Record<keyof FinanceAssumptions, z.ZodCatch<z.ZodNumber>>)),
  }),
);

/** The limits as the Board and Today use them: stages without a limit are never flagged. */
export function stallLimits(stallDays: StallDays): Partial<Record<Stage, number>> {
  const out: Partial<Record<Stage, number>> = {};
  for (const stage of STALL_STAGES) {
    const days = stallDays[stage];
    if (days != null) out[stage] = days;
  }
  return out;
}

const stallDayField = z
  .union([z.string(), z.number(), z.null()])
  .transform((v, ctx) => {
    if (v === null) return null;
    const text = typeof v === "number" ? String(v) : v.trim();
    if (text === "") return null;
    const n = Number(text);
    if (!Number.isInteger(n) || n < STALL_DAYS_MIN || n > STALL_DAYS_MAX) {
      ctx.addIssue({ code: "custom", message: `Whole days from ${STALL_DAYS_MIN} to ${STALL_DAYS_MAX}, or leave empty for never` });
      return z.NEVER;
    }
    return n;
  });

/** A typed assumption (the form sends text, "3 %" allowed): read as a number, then checked like a stored one. */
const financeField = (k: keyof FinanceAssumptions) =>
  z
    .union([z.string(), z.number()])
    .transform((v) => {
      const text = typeof v === "number" ? String(v) : v.trim().replace(/%$/, "").trim();
      return text === "" ? Number.NaN : Number(text);
    })
    .pipe(financeValue(k));

export const financeSchema = z.object({
  years: financeField("years"),
  degradationPctPerYear: financeField("degradationPctPerYear"),
  utilityEscalationPctPerYear: financeField("utilityEscalationPctPerYear"),
  discountRatePct: financeField("discountRatePct"),
});

/** Settings → Company form. */
export const companySettingsSchema = z.object({
  name: plainText().trim().min(1, "Enter the company's name").max(200, "Keep the name under 200 characters"),
  licenseNumber: z
    .union([z.string(), z.null()])
    .transform((v) => (v ?? "").trim())
    .pipe(plainText().max(100, "Keep the licence number under 100 characters"))
    .transform((v) => (v === "" ? null : v)),
  timeZone: z.enum(TIME_ZONE_IDS, "Pick a time zone from the list"),
  stallDays: z.object(Object.fromEntries(STALL_STAGES.map((s) => [s, stallDayField])) as Record<StallStage, typeof stallDayField>),
  /** Left out, the stored assumptions stay as they are. */
  finance: financeSchema.optional(),
});
export type CompanySettingsInput = z.input<typeof companySettingsSchema>;
export type CompanySettingsValues = z.output<typeof companySettingsSchema>;
