import "server-only";
import { and, desc, eq, getTableColumns, like, or } from "drizzle-orm";
import type { z } from "zod";
import { deal, household, ratePlan, user } from "@/db/schema";
import type { householdSchema, leadSchema } from "@/lib/schemas/deal";
import { db } from "@/server/db";
import { dealColumns, visibleTo, type DealRow } from "@/server/deal-audience";
import { HttpError, notFound } from "@/server/errors";
import type { DealScope } from "@/server/deal-scope";
import type { Member } from "@/server/session";
import { recordEvent } from "@/server/timeline";

export { dealAudience, visibleTo, type DealRow } from "@/server/deal-audience";

/** The deals a person may see, optionally matching a search on household, contact, street or city. */
export async function listDeals(member: Member, query?: string): Promise<DealRow[]> {
  const q = query?.trim();
  const pattern = q ? `%${q.replace(/[\\%_]/g, (c) => `\\${c}`)}%` : null;
  const search = pattern
    ? or(like(household.name, pattern), like(household.contactName, pattern), like(household.street, pattern), like(household.city, pattern))
    : undefined;
  return db()
    .select(dealColumns)
    .from(deal)
    .innerJoin(household, and(eq(household.id, deal.householdId), eq(household.companyId, deal.companyId)))
    .leftJoin(user, eq(user.id, deal.ownerUserId))
    .where(search ? and(visibleTo(member), search) : visibleTo(member))
    .orderBy(desc(deal.stageChangedAt));
}

/** A household by id; reps only through a deal they own (households are made with their deal). */
export async function getHouseholdOrThrow(member: Member, householdId: string) {
  const [row] = await db()
    .select({ household })
    .from(household)
    .innerJoin(deal, and(eq(deal.householdId, household.id), visibleTo(member)))
    .where(and(eq(household.id, householdId), eq(household.companyId, member.companyId)))
    .limit(1);
  if (!row) throw notFound("Household");
  return row.household;
}

/** A rate plan the deal may use: one of the company's (422 naming the field otherwise). */
async function checkRatePlan(companyId: string, ratePlanId: string | null | undefined): Promise<void> {
  if (!ratePlanId) return;
  const [plan] = await db()
    .select({ id: ratePlan.id })
    .from(ratePlan)
    .where(and(eq(ratePlan.id, ratePlanId), eq(ratePlan.companyId, companyId)))
    .limit(1);
  if (!plan) throw new HttpError(422, "validation_failed", "ratePlanId: Pick a rate plan from the list", { ratePlanId: ["Pick a rate plan from the list"] });
}

/** A new lead: the household and its deal, owned by the rep who created it. */
export async function createLead(member: Member, input: z.output<typeof leadSchema>): Promise<{ dealId: string; householdId: string }> {
  await checkRatePlan(member.companyId, input.ratePlanId);
  const householdId = crypto.randomUUID();
  const dealId = crypto.randomUUID();
  const { utilityName, ratePlanId, source, ...home } = input;
  await db().transaction(async (tx) => {
    await tx.insert(household).values({ id: householdId, companyId: member.companyId, ...home });
    await tx.insert(deal).values({
      id: dealId,
      companyId: member.companyId,
      householdId,
      ownerUserId: member.userId,
      stage: "lead",
      source,
      utilityName: utilityName ?? null,
      ratePlanId: ratePlanId ?? null,
    });
    await recordEvent(tx, {
      companyId: member.companyId,
      dealId,
      kind: "deal.created",
      summary: `Lead created by ${member.name} (source: ${source})`,
      actorUserId: member.userId,
    });
  });
  return { dealId, householdId };
}

export async function updateHousehold(scope: DealScope, input: z.output<typeof householdSchema>) {
  const { member, dealId } = scope;
  await db().transaction(async (tx) => {
    await tx.update(household).set(input).where(and(eq(household.id, scope.deal.householdId), eq(household.companyId, member.companyId)));
    await recordEvent(tx, {
      companyId: member.companyId,
      dealId,
      kind: "household.updated",
      summary: `Household details updated by ${member.name}`,
      actorUserId: member.userId,
    });
  });
}

/** Recently used sites of the company, to pick coordinates from (no map service is reachable). */
export async function recentSites(member: Member, limit = 12) {
  const { name, street, city, region, postalCode, latitude, longitude } = getTableColumns(household);
  return db()
    .select({ name, street, city, region, postalCode, latitude, longitude })
    .from(household)
    .where(eq(household.companyId, member.companyId))
    .orderBy(desc(household.createdAt))
    .limit(limit);
}

/** Rate plans to pick from on the new-lead form. */
export async function listRatePlanOptions(member: Member) {
  return db()
    .select({ id: ratePlan.id, name: ratePlan.name, utilityName: ratePlan.utilityName })
    .from(ratePlan)
    .where(and(eq(ratePlan.companyId, member.companyId), eq(ratePlan.active, true)))
    .orderBy(ratePlan.utilityName, ratePlan.name);
}

/** Changes the deal's utility and rate plan (the plan must be one of the company's). */
export async function updateDealUtility(scope: DealScope, input: { utilityName: string | null; ratePlanId: string | null }) {
  const { member, dealId } = scope;
  await checkRatePlan(member.companyId, input.ratePlanId);
  await db().transaction(async (tx) => {
    await tx
      .update(deal)
      .set({ utilityName: input.utilityName, ratePlanId: input.ratePlanId })
      .where(and(eq(deal.id, dealId), eq(deal.companyId, member.companyId)));
    await recordEvent(tx, {
      companyId: member.companyId,
      dealId,
      kind: "deal.utility_changed",
      summary: `${member.name} set the utility and rate plan`,
      actorUserId: member.userId,
    });
  });
}
