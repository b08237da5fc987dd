/**
 * Incentives as data: every credit, rebate or grant is a rule with an amount formula, a start
 * and end date and optional eligibility. Nothing is hard-coded here; a company keeps its own
 * list (e.g. a federal tax credit of 30 % of the system cost, a utility rebate per watt).
 *
 * Each rule says which date it counts on (`countsOn`): the offer date (a rebate reserved when
 * the contract is signed) or the installation date (a credit that counts when the system is
 * installed, e.g. the U.S. federal residential clean energy credit, 26 U.S.C. §25D, whose
 * expenditures count when installation is complete, §25D(e)(8)). A rule applies when its date
 * lies within [startDate, endDate], both inclusive, and the system meets its eligibility. An
 * ended or not-yet-started rule never appears among the applied incentives; it is listed as
 * skipped with the reason.
 *
 * Percent rules take a percentage of a basis: the system cost (the price, plus a lender's dealer
 * fee the homeowner pays inside the loan: what the homeowner pays for the system), or that cost
 * net of the incentives applied before them in list order (e.g. a tax credit whose basis
 * excludes a utility rebate). Each amount is capped (optional cap) and never exceeds what is
 * left of the price, so incentives never sum above the price.
 */
import { z } from "zod";
import { parseOrThrow } from "./errors";

const isoDate = z
  .string()
  .regex(/^\d{4}-\d{2}-\d{2}$/, "must be a date as YYYY-MM-DD")
  .refine((s) => {
    const [y, m, d] = s.split("-").map(Number);
    const t = new Date(Date.UTC(y, m - 1, d));
    return t.getUTCFullYear() === y && t.getUTCMonth() === m - 1 && t.getUTCDate() === d;
  }, "is not a real calendar date");

const amountSchema = z.discriminatedUnion("kind", [
  z.object({ kind: z.literal("per-watt"), centsPerWattDc: z.number().finite().min(0).max(1000), capCents: z.number().int().min(0).optional() }),
  z.object({
    kind: z.literal("percent"),
    pct: z.number().finite().min(0).max(100),
    basis: z.enum(["gross-price", "net-of-earlier"]).default("gross-price"),
    capCents: z.number().int().min(0).optional(),
  }),
  z.object({ kind: z.literal("fixed"), amountCents: z.number().int().min(0) }),
]);

export const incentiveRuleSchema = z
  .object({
    id: z.string().min(1),
    name: z.string().min(1),
    amount: amountSchema,
    startDate: isoDate,
    endDate: isoDate,
    /**
     * When the homeowner gets the money: "upfront" (reduces the price at signing, e.g. a rebate
     * assigned to the installer) or in year N of ownership (e.g. a tax credit claimed with the
     * first tax return: year 1).
     */
    timing: z.union([z.literal("upfront"), z.object({ year: z.number().int().min(1).max(50) })]).default("upfront"),
    /** Which date must fall within [startDate, endDate]: the offer's or the (expected) installation's. */
    countsOn: z.enum(["offer", "installation"]).default("offer"),
    eligibility: z
      .object({
        minKwDc: z.number().finite().min(0).optional(),
        maxKwDc: z.number().finite().positive().optional(),
        /** Payments the homeowner gets the rule with; a lease or PPA gets only rules naming it (third-party.ts). */
        payment: z.array(z.enum(["cash", "loan", "lease", "ppa"])).min(1).optional(),
      })
      .default({}),
  })
  .refine((r) => r.startDate <= r.endDate, { path: ["endDate"], message: "must not be before startDate" });
export type IncentiveRuleInput = z.input<typeof incentiveRuleSchema>;

export const incentiveContextSchema = z.object({
  rules: z.array(incentiveRuleSchema),
  /** The date the rules are evaluated at (offer date), YYYY-MM-DD. */
  asOf: isoDate,
  /** Expected (or actual) installation date, for rules that count on it; default: asOf. */
  installDate: isoDate.optional(),
  grossPriceCents: z.number().int().min(0),
  /** A lender's dealer fee the homeowner pays inside the loan: part of the system cost a percent rule takes. */
  dealerFeeCents: z.number().int().min(0).default(0),
  systemKwDc: z.number().finite().min(0),
  payment: z.enum(["cash", "loan", "lease", "ppa"]),
});
export type IncentiveContext = z.input<typeof incentiveContextSchema>;

export type AppliedIncentive = {
  id: string;
  name: string;
  amountCents: number;
  /** 0 = upfront (at signing); N = paid in year N of ownership. */
  year: number;
  detail: string;
};

export type IncentiveResult = {
  applied: AppliedIncentive[];
  /** `why` is absent on figures computed before it was recorded. */
  skipped: { id: string; name: string; reason: string; why?: SkipWhy }[];
  upfrontCents: number;
  totalCents: number;
  /** Incentive cents by year, index 0 = upfront. */
  byYear: number[];
};

const dollars = (cents: number) => `$${(cents / 100).toLocaleString("en-US", { minimumFractionDigits: 2, maximumFractionDigits: 2 })}`;

type Context = z.output<typeof incentiveContextSchema>;
type Rule = Context["rules"][number];

/** The date a rule is judged on, as words for the reasons ("installation on 2026-01-15"). */
function ruleDate(rule: Rule, ctx: Context): { on: string; onWhat: string } {
  const on = rule.countsOn === "installation" ? (ctx.installDate ?? ctx.asOf) : ctx.asOf;
  return { on, onWhat: rule.countsOn === "installation" ? `installation on ${on}` : `the offer on ${on}` };
}

/** Why a rule does not apply, as data (so a reader's language can word it). */
export type SkipWhy =
  | { kind: "starts" | "ended"; date: string; on: string; onWhat: "installation" | "offer" }
  | { kind: "belowMin" | "aboveMax"; kw: number; limit: number }
  | { kind: "payment"; payment: "cash" | "loan" | "lease" | "ppa" };

/** Why a rule does not apply (dates, size, payment), or null when it does. */
function skipWhy(rule: Rule, ctx: Context): SkipWhy | null {
  const { on } = ruleDate(rule, ctx);
  const onWhat = rule.countsOn === "installation" ? "installation" : "offer";
  // ISO dates compare correctly as strings.
  if (on < rule.startDate) return { kind: "starts", date: rule.startDate, on, onWhat };
  if (on > rule.endDate) return { kind: "ended", date: rule.endDate, on, onWhat };
  const el = rule.eligibility;
  if (el.minKwDc !== undefined && ctx.systemKwDc < el.minKwDc) return { kind: "belowMin", kw: ctx.systemKwDc, limit: el.minKwDc };
  if (el.maxKwDc !== undefined && ctx.systemKwDc > el.maxKwDc) return { kind: "aboveMax", kw: ctx.systemKwDc, limit: el.maxKwDc };
  if (el.payment && !el.payment.includes(ctx.payment)) return { kind: "payment", payment: ctx.payment };
  return null;
}

/** The reason in the office's words ("starts 2027-01-01, after the offer on 2026-12-05"). */
function skipReason(why: SkipWhy): string {
  switch (why.kind) {
    case "starts":
    case "ended": {
      const onWhat = why.onWhat === "installation" ? `installation on ${why.on}` : `the offer on ${why.on}`;
      return why.kind === "starts" ? `starts ${why.date}, after ${onWhat}` : `ended ${why.date}, before ${onWhat}`;
    }
    case "belowMin":
      return `system ${why.kw} kW DC is below the ${why.limit} kW minimum`;
    case "aboveMax":
      return `system ${why.kw} kW DC is above the ${why.limit} kW maximum`;
    case "payment":
      return `not available for ${why.payment} payment`;
  }
}

/** A rule's amount before the remaining-price limit, with how it was worked out. */
function ruleAmount(rule: Rule, ctx: Context, appliedSoFar: number): { raw: number; detail: string } {
  const a = rule.amount;
  const capped = (raw: number, detail: string, capCents: number | undefined) =>
    capCents !== undefined && raw > capCents ? { raw: capCents, detail: `${detail}, capped at ${dollars(capCents)}` } : { raw, detail };
  if (a.kind === "per-watt") {
    return capped(ctx.systemKwDc * 1000 * a.centsPerWattDc, `${Math.round(ctx.systemKwDc * 1000)} W × ${a.centsPerWattDc} ¢/W`, a.capCents);
  }
  if (a.kind === "percent") {
    const cost = ctx.grossPriceCents + ctx.dealerFeeCents;
    const basis = a.basis === "gross-price" ? cost : cost - appliedSoFar;
    const parts = [
      ...(ctx.dealerFeeCents > 0 ? [`incl. the ${dollars(ctx.dealerFeeCents)} dealer fee in the loan`] : []),
      ...(a.basis === "net-of-earlier" ? ["net of earlier incentives"] : []),
    ];
    return capped((basis * a.pct) / 100, `${a.pct} % of ${dollars(basis)}${parts.length ? ` (system cost ${parts.join(", ")})` : ""}`, a.capCents);
  }
  return { raw: a.amountCents, detail: "fixed amount" };
}

/** Evaluate the incentive rules for one offer at a date. */
export function evaluateIncentives(input: IncentiveContext): IncentiveResult {
  const ctx = parseOrThrow(incentiveContextSchema, input, "incentives");
  const applied: AppliedIncentive[] = [];
  const skipped: IncentiveResult["skipped"] = [];
  let appliedSoFar = 0;

  for (const rule of ctx.rules) {
    const why = skipWhy(rule, ctx);
    if (why) {
      skipped.push({ id: rule.id, name: rule.name, reason: skipReason(why), why });
      continue;
    }
    const amount = ruleAmount(rule, ctx, appliedSoFar);
    let detail = rule.countsOn === "installation" ? `${amount.detail}; counts at ${ruleDate(rule, ctx).onWhat}` : amount.detail;
    let amountCents = Math.round(amount.raw);
    const room = ctx.grossPriceCents - appliedSoFar;
    if (amountCents > room) {
      amountCents = Math.max(0, room);
      detail += ", limited to the remaining price";
    }
    appliedSoFar += amountCents;
    applied.push({ id: rule.id, name: rule.name, amountCents, year: rule.timing === "upfront" ? 0 : rule.timing.year, detail });
  }

  const maxYear = applied.reduce((m, a) => Math.max(m, a.year), 0);
  const byYear = new Array<number>(maxYear + 1).fill(0);
  for (const a of applied) byYear[a.year] += a.amountCents;
  return {
    applied,
    skipped,
    upfrontCents: byYear[0],
    totalCents: appliedSoFar,
    byYear,
  };
}
