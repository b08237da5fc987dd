// The company's price book and selling policies: one validated JSON document per company
// (table price_book). Shared by the admin's editor, the server and the pure pricing code
// (src/lib/pricing.ts). Incentive rules are the engine's own rule schema
// (src/engine/incentives.ts) with one extra field saying who pays.
import { z } from "zod";
import { plainText } from "@/lib/schemas/text";
import { incentiveRuleSchema, type IncentiveRuleInput } from "@/engine/incentives";
import { thirdPartyTermsSchema } from "@/engine/third-party";

/** The price book format this code reads and writes. */
export const PRICE_BOOK_VERSION = 1;

const idString = z
  .string()
  .trim()
  .min(1, "is required")
  .max(60)
  .regex(/^[a-z0-9][a-z0-9-]*$/, "use lower-case letters, digits and dashes");
const nameString = plainText().trim().min(1, "is required").max(120);
const cents = z.number().int("must be whole cents").min(0, "must not be negative").max(100_000_000);

/** Cents per watt DC with at most two decimals (e.g. 287.5 = $2.875/W). */
export const centsPerWattDcSchema = z
  .number()
  .finite()
  .min(0, "must not be negative")
  .max(10_000, "is above $100 per watt")
  .refine((v) => Math.abs(Math.round(v * 100) - v * 100) < 1e-6, "use at most two decimals (hundredths of a cent)");

/**
 * A system-size band: systems of at least `minWatts` and below `maxWatts` (DC) are priced at
 * `centsPerWattDc` for every watt. The last band has `maxWatts: null` (no upper limit).
 */
export const priceBandSchema = z.object({
  minWatts: z.number().int("must be whole watts").min(0, "must not be negative"),
  maxWatts: z.number().int("must be whole watts").positive("must be above 0").nullable(),
  centsPerWattDc: centsPerWattDcSchema,
});

export const ADDER_KINDS = ["per_watt", "per_module", "fixed"] as const;
export type AdderKind = (typeof ADDER_KINDS)[number];

/** An equipment or site adder, priced per watt DC, per module, or once per job. */
export const adderSchema = z.discriminatedUnion("kind", [
  z.object({ id: idString, name: nameString, kind: z.literal("per_watt"), centsPerWattDc: centsPerWattDcSchema }),
  z.object({ id: idString, name: nameString, kind: z.literal("per_module"), centsPerModule: cents }),
  z.object({ id: idString, name: nameString, kind: z.literal("fixed"), amountCents: cents }),
]);
export type Adder = z.output<typeof adderSchema>;

/** A fixed extra added to the offer as one line (e.g. a critter guard). */
export const lineItemSchema = z.object({ id: idString, name: nameString, amountCents: cents });

/**
 * How much discount a role may give without approval: at most `maxCents`, and at most
 * `maxPct` of the price before discount. When both are set the discount must stay within
 * both; when neither is set, every discount needs approval. Owners and admins have no limit.
 */
export const discountLimitSchema = z.object({
  maxCents: cents.nullable(),
  maxPct: z.number().finite().min(0, "must not be negative").max(100, "must be at most 100").nullable(),
});
export type DiscountLimit = z.output<typeof discountLimitSchema>;

/** Roles whose discounts are limited; owner and admin are unlimited, crew does not sell. */
export const LIMITED_ROLES = ["sales_rep", "office_manager"] as const;

export const INCENTIVE_SOURCES = ["federal", "state", "local", "utility", "manufacturer", "other"] as const;
export const INCENTIVE_SOURCE_LABELS: Record<(typeof INCENTIVE_SOURCES)[number], string> = {
  federal: "Federal",
  state: "State",
  local: "City or county",
  utility: "Utility",
  manufacturer: "Manufacturer",
  other: "Other",
};

/**
 * The engine's incentive rule plus who pays it (for the offer's wording) and, for a utility's
 * own rebate, which utility: offers to that utility's customers only (null: every customer).
 */
export const priceBookIncentiveSchema = incentiveRuleSchema.safeExtend({
  source: z.enum(INCENTIVE_SOURCES),
  utilityId: z.uuid("Pick the utility from the list").nullable().default(null),
});
export type PriceBookIncentive = z.output<typeof priceBookIncentiveSchema>;

/** A battery the company sells: one from its catalog (battery_model) at an installed price. */
export const batteryLineSchema = z.object({ id: idString, name: nameString, batteryModelId: z.uuid("Pick the battery from the catalog"), amountCents: cents });
export type BatteryLine = z.output<typeof batteryLineSchema>;

/**
 * A financing partner's rate sheet for a lease or PPA (the engine's terms, src/engine/third-party.ts),
 * in force from `effectiveDate`, for the listed states (none: every state) or one utility.
 */
export const rateSheetSchema = z.object({
  id: idString,
  effectiveDate: z.iso.date("must be a date as YYYY-MM-DD"),
  states: z.array(z.string().regex(/^[A-Z]{2}$/, "use two-letter state codes (e.g. NC)")).max(60).default([]),
  utilityId: z.uuid("Pick the utility from the list").nullable().default(null),
  terms: thirdPartyTermsSchema,
});
export type RateSheet = z.output<typeof rateSheetSchema>;

/** The deposit asked at signing: a fixed amount, or a percentage of the contract within a min and max. */
export const depositPolicySchema = z.discriminatedUnion("kind", [
  z.object({ kind: z.literal("fixed"), amountCents: cents }),
  z
    .object({
      kind: z.literal("percent"),
      pct: z.number().finite().min(0, "must not be negative").max(100, "must be at most 100"),
      minCents: cents,
      maxCents: cents,
    })
    .refine((d) => d.minCents <= d.maxCents, { path: ["maxCents"], message: "must not be below the minimum" }),
]);

function uniqueIds(items: { id: string }[], ctx: z.RefinementCtx, field: string) {
  const seen = new Set<string>();
  items.forEach((item, i) => {
    if (seen.has(item.id)) ctx.addIssue({ code: "custom", path: [field, i, "id"], message: `id "${item.id}" is used twice` });
    seen.add(item.id);
  });
}

export const priceBookSchema = z
  .object({
    version: z.literal(PRICE_BOOK_VERSION),
    bands: z.array(priceBandSchema).min(1, "add at least one size band").max(20),
    adders: z.array(adderSchema).max(100),
    lineItems: z.array(lineItemSchema).max(100),
    discountLimits: z.object({ sales_rep: discountLimitSchema, office_manager: discountLimitSchema }),
    incentives: z.array(priceBookIncentiveSchema).max(50),
    deposit: depositPolicySchema,
    batteries: z.array(batteryLineSchema).max(50).default([]),
    rateSheets: z.array(rateSheetSchema).max(100).default([]),
  })
  .superRefine((book, ctx) => {
    // Bands: contiguous from 0 W upward, each above the one before, the last open-ended.
    book.bands.forEach((band, i) => {
      const last = i === book.bands.length - 1;
      if (i === 0 && band.minWatts !== 0) ctx.addIssue({ code: "custom", path: ["bands", 0, "minWatts"], message: "the first band must start at 0 W" });
      if (i > 0) {
        const prevMax = book.bands[i - 1].maxWatts;
        if (prevMax !== null && band.minWatts < prevMax) {
          ctx.addIssue({ code: "custom", path: ["bands", i, "minWatts"], message: `overlaps the band before, which runs to ${prevMax} W` });
        } else if (prevMax !== null && band.minWatts > prevMax) {
          ctx.addIssue({ code: "custom", path: ["bands", i, "minWatts"], message: `leaves a gap: the band before ends at ${prevMax} W` });
        }
      }
      if (last && band.maxWatts !== null) ctx.addIssue({ code: "custom", path: ["bands", i, "maxWatts"], message: "the last band must have no upper limit" });
      if (!last && band.maxWatts === null) ctx.addIssue({ code: "custom", path: ["bands", i, "maxWatts"], message: "only the last band may be open-ended" });
      if (band.maxWatts !== null && band.maxWatts <= band.minWatts) {
        ctx.addIssue({ code: "custom", path: ["bands", i, "maxWatts"], message: "must be above the band's start" });
      }
    });
    uniqueIds(book.adders, ctx, "adders");
    uniqueIds(book.lineItems, ctx, "lineItems");
    uniqueIds(book.incentives, ctx, "incentives");
    uniqueIds(book.batteries, ctx, "batteries");
    uniqueIds(book.rateSheets, ctx, "rateSheets");
  });
export type PriceBook = z.output<typeof priceBookSchema>;
export type PriceBookInput = z.input<typeof priceBookSchema>;

/** The incentive rules as the engine takes them (evaluateIncentives, quote cases). */
export function incentiveRulesForEngine(book: PriceBook): IncentiveRuleInput[] {
  return book.incentives.map((rule) => ({
    id: rule.id,
    name: rule.name,
    amount: rule.amount,
    startDate: rule.startDate,
    endDate: rule.endDate,
    timing: rule.timing,
    countsOn: rule.countsOn,
    eligibility: rule.eligibility,
  }));
}

/** The book as one household sees it: rules and rate sheets of another utility than `utilityId` left out. */
export function bookForUtility(book: PriceBook, utilityId: string | null): PriceBook {
  const ours = (x: { utilityId: string | null }) => x.utilityId === null || x.utilityId === utilityId;
  return { ...book, incentives: book.incentives.filter(ours), rateSheets: book.rateSheets.filter(ours) };
}

/**
 * The rate sheets a rep may offer on `asOf` in `state` (two letters) for a household of
 * `utilityId`: among the sheets that cover the state and utility, the latest effective date
 * not after `asOf` for each partner and kind.
 */
export function rateSheetsInForce(book: PriceBook, where: { asOf: string; state: string | null; utilityId: string | null }): RateSheet[] {
  const covers = (s: RateSheet) =>
    s.effectiveDate <= where.asOf && (s.utilityId === null || s.utilityId === where.utilityId) && (s.states.length === 0 || (where.state !== null && s.states.includes(where.state)));
  const latest = new Map<string, RateSheet>();
  for (const sheet of book.rateSheets.filter(covers)) {
    const key = `${sheet.terms.kind}:${sheet.terms.partner}`;
    const held = latest.get(key);
    if (!held || held.effectiveDate < sheet.effectiveDate) latest.set(key, sheet);
  }
  return [...latest.values()];
}

/** A company that has not set up its price book yet starts from this (one band, nothing else). */
export function emptyPriceBook(): PriceBook {
  return {
    version: PRICE_BOOK_VERSION,
    bands: [{ minWatts: 0, maxWatts: null, centsPerWattDc: 300 }],
    adders: [],
    lineItems: [],
    discountLimits: { sales_rep: { maxCents: 0, maxPct: null }, office_manager: { maxCents: 0, maxPct: null } },
    incentives: [],
    deposit: { kind: "fixed", amountCents: 0 },
    batteries: [],
    rateSheets: [],
  };
}
