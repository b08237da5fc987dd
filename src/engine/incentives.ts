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
        payment: z.array(z.enum(["cash", "loan"])).min(1).optional(),
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
  payment: z.enum(["cash", "loan"]),
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
  skipped: { id: string; name: string; reason: string }[];
  upfrontCents: number;
  totalCents: number;
  /** Incentive cents by year, index 0 = upfront. */
  byYear: number[];
};

const dollars = (cents: number) => `$${(cents / 100).toLocaleString("en-US", { minimumFractionDigits: 2, maximumFractionDigits: 2 })}`;

/** Evaluate the incentive rules for one offer at a date. */
export function evaluateIncentives(input: IncentiveContext): IncentiveResult {
  const ctx = parseOrThrow(incentiveContextSchema, input, "incentives");
  const applied: AppliedIncentive[] = [];
  const skipped: IncentiveResult["skipped"] = [];
  let appliedSoFar = 0;

  for (const rule of ctx.rules) {
    const skip = (reason: string) => skipped.push({ id: rule.id, name: rule.name, reason });
    // ISO dates compare correctly as strings.
    const on = rule.countsOn === "installation" ? (ctx.installDate ?? ctx.asOf) : ctx.asOf;
    const onWhat = rule.countsOn === "installation" ? `installation on ${on}` : `the offer on ${on}`;
    if (on < rule.startDate) {
      skip(`starts ${rule.startDate}, after ${onWhat}`);
      continue;
    }
    if (on > rule.endDate) {
      skip(`ended ${rule.endDate}, before ${onWhat}`);
      continue;
    }
    const el = rule.eligibility;
    if (el.minKwDc !== undefined && ctx.systemKwDc < el.minKwDc) {
      skip(`system ${ctx.systemKwDc} kW DC is below the ${el.minKwDc} kW minimum`);
      continue;
    }
    if (el.maxKwDc !== undefined && ctx.systemKwDc > el.maxKwDc) {
      skip(`system ${ctx.systemKwDc} kW DC is above the ${el.maxKwDc} kW maximum`);
      continue;
    }
    if (el.payment && !el.payment.includes(ctx.payment)) {
      skip(`not available for ${ctx.payment} payment`);
      continue;
    }

    let raw: number;
    let detail: string;
    const a = rule.amount;
    if (a.kind === "per-watt") {
      raw = ctx.systemKwDc * 1000 * a.centsPerWattDc;
      detail = `${Math.round(ctx.systemKwDc * 1000)} W × ${a.centsPerWattDc} ¢/W`;
      if (a.capCents !== undefined && raw > a.capCents) {
        raw = a.capCents;
        detail += `, capped at ${dollars(a.capCents)}`;
      }
    } else if (a.kind === "percent") {
      const cost = ctx.grossPriceCents + ctx.dealerFeeCents;
      const basis = a.basis === "gross-price" ? cost : cost - appliedSoFar;
      raw = (basis * a.pct) / 100;
      const parts = [
        ...(ctx.dealerFeeCents > 0 ? [`incl. the ${dollars(ctx.dealerFeeCents)} dealer fee in the loan`] : []),
        ...(a.basis === "net-of-earlier" ? ["net of earlier incentives"] : []),
      ];
      detail = `${a.pct} % of ${dollars(basis)}${parts.length ? ` (system cost ${parts.join(", ")})` : ""}`;
      if (a.capCents !== undefined && raw > a.capCents) {
        raw = a.capCents;
        detail += `, capped at ${dollars(a.capCents)}`;
      }
    } else {
      raw = a.amountCents;
      detail = "fixed amount";
    }
    if (rule.countsOn === "installation") detail += `; counts at ${onWhat}`;
    let amountCents = Math.round(raw);
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
