import "server-only";
import { and, asc, count, eq, sql } from "drizzle-orm";
import type { z } from "zod";
import { deal, priceBook, ratePlan, utility } from "@/db/schema";
import { siteTimeZone } from "@/engine/site-time-zone";
import { can } from "@/lib/permissions";
import { COMPANY_TIME_ZONES } from "@/lib/schemas/company-settings";
import type { utilitySchema } from "@/lib/schemas/utility";
import { db, transaction } from "@/server/db";
import { getCompanySettings } from "@/server/company-settings";
import { fieldError, forbidden, HttpError, isDuplicateKey } from "@/server/errors";
import { companyRowOrThrow } from "@/server/records";
import type { Member } from "@/server/session";

type UtilityRow = typeof utility.$inferSelect;
type UtilityListRow = UtilityRow & { planCount: number; dealCount: number };
type UtilityFields = z.output<typeof utilitySchema>;

/** The company's utilities by name, each with how many rate plans and deals name it. */
export async function listUtilities(companyId: string): Promise<UtilityListRow[]> {
  const [rows, plans, deals] = await Promise.all([
    db().select().from(utility).where(eq(utility.companyId, companyId)).orderBy(asc(utility.name)),
    db().select({ id: ratePlan.utilityId, n: count() }).from(ratePlan).where(eq(ratePlan.companyId, companyId)).groupBy(ratePlan.utilityId),
    db().select({ id: deal.utilityId, n: count() }).from(deal).where(eq(deal.companyId, companyId)).groupBy(deal.utilityId),
  ]);
  const planCount = new Map(plans.map((p) => [p.id, p.n]));
  const dealCount = new Map(deals.map((d) => [d.id, d.n]));
  return rows.map((u) => ({ ...u, planCount: planCount.get(u.id) ?? 0, dealCount: dealCount.get(u.id) ?? 0 }));
}

export function getUtilityOrThrow(companyId: string, id: string): Promise<UtilityRow> {
  return companyRowOrThrow(utility, companyId, id, "Utility");
}

/** A utility a form names: one of the company's, else 422 on that field. */
export async function utilityForField(companyId: string, id: string, field: string): Promise<UtilityRow> {
  return getUtilityOrThrow(companyId, id).catch((err: unknown) => {
    throw err instanceof HttpError && err.status === 404 ? fieldError(field, "Pick the utility from the list") : err;
  });
}

const duplicateName = (name: string) =>
  new HttpError(409, "duplicate_utility", `The company already has a utility named "${name}".`, { name: [`"${name}" is already in the list`] });

/** A new utility; without a time zone it takes the company's (most utilities bill on their customers' clock). */
export async function createUtility(member: Member, input: Omit<UtilityFields, "timeZone"> & { timeZone?: string }): Promise<UtilityRow> {
  const id = crypto.randomUUID();
  const timeZone = input.timeZone ?? (await getCompanySettings(member.companyId)).timeZone;
  try {
    await db().insert(utility).values({ id, companyId: member.companyId, ...input, timeZone });
  } catch (err) {
    if (isDuplicateKey(err)) throw duplicateName(input.name);
    throw err;
  }
  return getUtilityOrThrow(member.companyId, id);
}

/**
 * Renames or re-describes a utility; plans and deals follow by id. A new time zone moves its
 * plans' time-of-use hours (they are the utility's wall clock), so each of its plans gets a new
 * version and the offers priced with them go stale.
 */
export async function updateUtility(member: Member, id: string, input: UtilityFields): Promise<UtilityRow> {
  const before = await getUtilityOrThrow(member.companyId, id);
  try {
    await transaction(async (tx) => {
      await tx.update(utility).set(input).where(and(eq(utility.id, id), eq(utility.companyId, member.companyId)));
      if (input.timeZone === before.timeZone) return;
      await tx
        .update(ratePlan)
        .set({ version: sql`${ratePlan.version} + 1` })
        .where(and(eq(ratePlan.companyId, member.companyId), eq(ratePlan.utilityId, id)));
    });
  } catch (err) {
    if (isDuplicateKey(err)) throw duplicateName(input.name);
    throw err;
  }
  return getUtilityOrThrow(member.companyId, id);
}

const counted = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`;

/**
 * Deletes a utility nothing uses. A utility named by a deal's household, a rate plan or a price
 * book incentive stays (409 naming what uses it and how many): deleting it would drop the rate
 * plans with it and leave households and rebates without their utility. Inside one transaction
 * with the utility's row locked, so a plan or household cannot take it up in between (their
 * foreign keys wait for the lock).
 */
export async function deleteUtility(member: Member, id: string): Promise<{ id: string }> {
  if (!can(member.role, "rates:manage")) throw forbidden("deleting utilities");
  const u = await getUtilityOrThrow(member.companyId, id);
  await transaction(async (tx) => {
    await tx.select({ id: utility.id }).from(utility).where(and(eq(utility.id, id), eq(utility.companyId, member.companyId))).for("update");
    const [[deals], [plans], books] = await Promise.all([
      tx.select({ n: count() }).from(deal).where(and(eq(deal.companyId, member.companyId), eq(deal.utilityId, id))),
      tx.select({ n: count() }).from(ratePlan).where(and(eq(ratePlan.companyId, member.companyId), eq(ratePlan.utilityId, id))),
      tx.select({ document: priceBook.document }).from(priceBook).where(eq(priceBook.companyId, member.companyId)).for("update"),
    ]);
    const incentives = books.flatMap((b) => b.document.incentives).filter((rule) => rule.utilityId === id).length;
    const uses = [
      deals.n ? counted(deals.n, "household", "households") : null,
      plans.n ? counted(plans.n, "rate plan", "rate plans") : null,
      incentives ? counted(incentives, "price book incentive", "price book incentives") : null,
    ].filter((x) => x !== null);
    if (uses.length) {
      const list = uses.length > 1 ? `${uses.slice(0, -1).join(", ")} and ${uses.at(-1)}` : uses[0];
      throw new HttpError(409, "utility_in_use", `${u.name} is used by ${list}, so it cannot be deleted. Give ${deals.n + plans.n + incentives === 1 ? "it" : "them"} another utility first.`);
    }
    await tx.delete(utility).where(and(eq(utility.id, id), eq(utility.companyId, member.companyId)));
  });
  return { id };
}

const zoneName = (id: string) => {
  const known = COMPANY_TIME_ZONES.find((z) => z.id === id);
  return known ? `${known.label} time (${id})` : id;
};

/**
 * When the household's utility keeps another clock than the house's zone (a house near a zone
 * line): a note saying time-of-use hours are the utility's clock. Null when they agree or the
 * deal has no utility yet.
 */
export async function utilityClockNote(scope: { companyId: string; deal: { utilityId: string | null }; household: { latitude: number; longitude: number } }): Promise<string | null> {
  if (!scope.deal.utilityId) return null;
  const u = await getUtilityOrThrow(scope.companyId, scope.deal.utilityId);
  const site = siteTimeZone(scope.household.latitude, scope.household.longitude);
  if (u.timeZone === site) return null;
  return `Time-of-use hours are read on ${u.name}'s clock, ${zoneName(u.timeZone)}, not the house's, ${zoneName(site)}: a plan's "4–9 pm" is ${u.name}'s 4–9 pm.`;
}
