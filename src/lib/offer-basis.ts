// What an offer's figures were computed from, and whether those inputs are still current.
// Shared by the server (saving offers, freezing them into a proposal) and the Offers tab.
import { z } from "zod";
import { priceBookSchema } from "@/lib/schemas/price-book";

const faceSchema = z.object({
  id: z.string(),
  name: z.string(),
  tiltDeg: z.number(),
  azimuthDeg: z.number(),
  solarAccessPct: z.union([z.number(), z.array(z.number())]),
  moduleCount: z.number(),
});

export const offerBasisSchema = z.object({
  usage: z.object({
    version: z.number().int(),
    monthlyKwh: z.array(z.number()).length(12),
    annualKwh: z.number(),
    source: z.enum(["bills", "interval", "none"]),
    /** How many of the 12 months were estimated rather than billed. */
    estimatedMonths: z.number().int(),
    fillMethod: z.string(),
  }),
  design: z.object({ revision: z.number().int(), lossesPct: z.number(), faces: z.array(faceSchema) }),
  ratePlan: z.object({ id: z.string(), version: z.number().int() }),
  priceBook: z.object({ version: z.number().int(), incentivesVersion: z.number().int(), document: priceBookSchema }),
  assumptionsVersion: z.number().int(),
  module: z.object({ manufacturer: z.string(), model: z.string(), stcWatts: z.number() }),
  inverter: z.object({ manufacturer: z.string(), model: z.string(), kind: z.enum(["string", "micro"]), acWatts: z.number() }),
  /** The install date credits counting at installation were judged on; absent when no rule counts at installation. */
  installDate: z.object({ date: z.string(), source: z.enum(["job", "lead_time"]) }).nullish(),
  /** The utility whose rebates applied: the household's, else (none picked yet) the plan's; absent on offers saved before utilities were records. */
  utilityId: z.string().nullish(),
});
export type OfferBasis = z.infer<typeof offerBasisSchema>;

/** The versions of a deal's inputs as stored now (0 where nothing is stored yet). */
export type CurrentInputs = {
  usageVersion: number;
  designRevision: number;
  /** The plan this offer would be priced with now (its own, else the deal's) and its version. */
  ratePlan: { id: string; version: number } | null;
  priceBookVersion: number;
  incentivesVersion: number;
  assumptionsVersion: number;
  /** The deal's job's planned install date, if any. */
  jobInstallDate: string | null;
  /** The utility whose rebates would apply now: the household's, else the plan's. */
  utilityId: string | null;
};

export const STALE_INPUTS = ["usage", "design", "rate_plan", "price_book", "incentives", "assumptions", "install_date", "utility"] as const;
export type StaleInput = (typeof STALE_INPUTS)[number];

export const STALE_INPUT_LABELS: Record<StaleInput, string> = { usage: "usage (bills or interval data)", design: "design", rate_plan: "rate plan", price_book: "price book", incentives: "incentive rules", assumptions: "savings assumptions", install_date: "planned install date", utility: "household's utility" };

/**
 * The inputs that changed since the offer was computed; empty when it is current. An offer
 * saved before its basis was recorded is stale on every input.
 */
export function staleInputs(basis: OfferBasis | null, now: CurrentInputs): StaleInput[] {
  if (!basis) return [...STALE_INPUTS];
  const out: StaleInput[] = [];
  if (basis.usage.version !== now.usageVersion) out.push("usage");
  if (basis.design.revision !== now.designRevision) out.push("design");
  if (!now.ratePlan || basis.ratePlan.id !== now.ratePlan.id || basis.ratePlan.version !== now.ratePlan.version) out.push("rate_plan");
  // The incentive rules live in the price book: a change of them is named as itself.
  if (basis.priceBook.incentivesVersion !== now.incentivesVersion) out.push("incentives");
  else if (basis.priceBook.version !== now.priceBookVersion) out.push("price_book");
  if (basis.assumptionsVersion !== now.assumptionsVersion) out.push("assumptions");
  if (basis.installDate) {
    // The date the credits would be judged on now: the job's, else the offer's own lead-time guess.
    const dateNow = now.jobInstallDate ?? (basis.installDate.source === "lead_time" ? basis.installDate.date : null);
    if (dateNow !== basis.installDate.date) out.push("install_date");
  }
  if (basis.utilityId !== undefined && basis.utilityId !== now.utilityId) out.push("utility");
  return out;
}

/** "usage (bills or interval data) and rate plan" */
export function describeStale(inputs: readonly StaleInput[]): string {
  const names = inputs.map((i) => STALE_INPUT_LABELS[i]);
  return names.length <= 1 ? (names[0] ?? "") : `${names.slice(0, -1).join(", ")} and ${names[names.length - 1]}`;
}
