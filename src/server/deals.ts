import "server-only";
import { and, desc, eq, getTableColumns, like, or } from "drizzle-orm";
import type { z } from "zod";
import { deal, household, ratePlan, user, utility } from "@/db/schema";
import { zipMismatch } from "@/engine/zip-codes";
import type { householdSchema, leadSchema } from "@/lib/schemas/deal";
import { db, transaction } from "@/server/db";
import { dealColumns, visibleTo, type DealRow } from "@/server/deal-audience";
import { HttpError, notFound } from "@/server/errors";
import type { DealScope } from "@/server/deal-scope";
import type { Member } from "@/server/session";
import { recordEvent } from "@/server/timeline";
import { utilityForField } from "@/server/utilities";

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

/**
 * The deal's utility and plan as the form gave them: the utility one of the company's, the plan
 * one of that utility's (with no utility given, the plan's utility becomes the deal's). 422
 * naming the field otherwise.
 */
async function checkUtilityAndPlan(companyId: string, utilityId: string | null | undefined, ratePlanId: string | null | undefined): Promise<{ utilityId: string | null; ratePlanId: string | null }> {
  if (utilityId) await utilityForField(companyId, utilityId, "utilityId");
  if (!ratePlanId) return { utilityId: utilityId ?? null, ratePlanId: null };
  const [plan] = await db()
    .select({ id: ratePlan.id, utilityId: ratePlan.utilityId, utilityName: utility.name })
    .from(ratePlan)
    .innerJoin(utility, and(eq(utility.id, ratePlan.utilityId), eq(utility.companyId, ratePlan.companyId)))
    .where(and(eq(ratePlan.id, ratePlanId), eq(ratePlan.companyId, companyId)))
    .limit(1);
  if (!plan) throw fieldError("ratePlanId", "Pick a rate plan from the list");
  if (utilityId && plan.utilityId !== utilityId) throw fieldError("ratePlanId", `This plan belongs to ${plan.utilityName}: pick one of the household's utility's plans`);
  return { utilityId: plan.utilityId, ratePlanId: plan.id };
}

const fieldError = (field: string, message: string) => new HttpError(422, "validation_failed", `${field}: ${message}`, { [field]: [message] });

/**
 * Coordinates that contradict the ZIP code by more than MAX_ZIP_DISTANCE_KM (a dropped minus
 * sign, swapped numbers) are refused naming both, so no estimate is made for the wrong place.
 */
function checkPositionAgainstZip(site: { postalCode: string; latitude: number; longitude: number }): void {
  const far = zipMismatch(site.postalCode, site.latitude, site.longitude);
  if (!far) return;
  const message = `${site.latitude}, ${site.longitude} is ${Math.round(far.distanceKm).toLocaleString("en-US")} km from ZIP ${far.zip} (${far.city}, ${far.region}): check the coordinates or the ZIP`;
  throw new HttpError(422, "validation_failed", `latitude: ${message}`, { latitude: [message], longitude: [message] });
}

/** A new lead: the household and its deal, owned by the rep who created it. */
export async function createLead(member: Member, input: z.output<typeof leadSchema>): Promise<{ dealId: string; householdId: string }> {
  checkPositionAgainstZip(input);
  const { utilityId, ratePlanId } = await checkUtilityAndPlan(member.companyId, input.utilityId, input.ratePlanId);
  const householdId = crypto.randomUUID();
  const dealId = crypto.randomUUID();
  const { utilityId: _utility, ratePlanId: _plan, source, ...home } = input;
  await transaction(async (tx) => {
    await tx.insert(household).values({ id: householdId, companyId: member.companyId, ...home });
    await tx.insert(deal).values({
      id: dealId,
      companyId: member.companyId,
      householdId,
      ownerUserId: member.userId,
      stage: "lead",
      source,
      utilityId,
      ratePlanId,
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
  checkPositionAgainstZip(input);
  await transaction(async (tx) => {
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

/** Utilities and their active rate plans to pick from (the new-lead form, the Household tab). */
export async function listUtilityChoices(member: Member) {
  const [utilities, plans] = await Promise.all([
    db().select({ id: utility.id, name: utility.name }).from(utility).where(eq(utility.companyId, member.companyId)).orderBy(utility.name),
    db()
      .select({ id: ratePlan.id, name: ratePlan.name, utilityId: ratePlan.utilityId })
      .from(ratePlan)
      .where(and(eq(ratePlan.companyId, member.companyId), eq(ratePlan.active, true)))
      .orderBy(ratePlan.name),
  ]);
  return { utilities, plans };
}

/** Changes the deal's utility and rate plan (the plan must be one of that utility's). */
export async function updateDealUtility(scope: DealScope, input: { utilityId: string | null; ratePlanId: string | null }) {
  const { member, dealId } = scope;
  const choice = await checkUtilityAndPlan(member.companyId, input.utilityId, input.ratePlanId);
  await transaction(async (tx) => {
    await tx
      .update(deal)
      .set(choice)
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
