import "server-only";
import { and, asc, count, eq } from "drizzle-orm";
import type { z } from "zod";
import { deal, ratePlan, utility } from "@/db/schema";
import type { utilitySchema } from "@/lib/schemas/utility";
import { db } from "@/server/db";
import { fieldError, HttpError, isDuplicateKey } from "@/server/errors";
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

export async function createUtility(member: Member, input: UtilityFields): Promise<UtilityRow> {
  const id = crypto.randomUUID();
  try {
    await db().insert(utility).values({ id, companyId: member.companyId, ...input });
  } catch (err) {
    if (isDuplicateKey(err)) throw duplicateName(input.name);
    throw err;
  }
  return getUtilityOrThrow(member.companyId, id);
}

/** Renames or re-describes a utility; plans and deals follow by id. */
export async function updateUtility(member: Member, id: string, input: UtilityFields): Promise<UtilityRow> {
  await getUtilityOrThrow(member.companyId, id);
  try {
    await db().update(utility).set(input).where(and(eq(utility.id, id), eq(utility.companyId, member.companyId)));
  } catch (err) {
    if (isDuplicateKey(err)) throw duplicateName(input.name);
    throw err;
  }
  return getUtilityOrThrow(member.companyId, id);
}
