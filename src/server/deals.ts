import "server-only";
import { and, desc, eq, type SQL } from "drizzle-orm";
import { deal, household, STAGES, user, type Stage } from "@/db/schema";
import { can } from "@/lib/permissions";
import { db } from "@/server/db";
import { notFound } from "@/server/errors";
import type { Member } from "@/server/session";

export type DealRow = {
  id: string;
  stage: Stage;
  stageChangedAt: Date;
  source: string | null;
  contractCents: number | null;
  systemDcWatts: number | null;
  householdId: string;
  householdName: string;
  city: string;
  ownerName: string | null;
  createdAt: Date;
};

/** Reps see the deals they own; office roles see the company's. Always scoped by company. */
function visibleTo(member: Member): SQL {
  const company = eq(deal.companyId, member.companyId);
  if (can(member.role, "deals:read-all")) return company;
  return and(company, eq(deal.ownerUserId, member.userId)) as SQL;
}

const dealColumns = {
  id: deal.id,
  stage: deal.stage,
  stageChangedAt: deal.stageChangedAt,
  source: deal.source,
  contractCents: deal.contractCents,
  systemDcWatts: deal.systemDcWatts,
  householdId: household.id,
  householdName: household.name,
  city: household.city,
  ownerName: user.name,
  createdAt: deal.createdAt,
};

export async function listDeals(member: Member): Promise<DealRow[]> {
  return db()
    .select(dealColumns)
    .from(deal)
    .innerJoin(household, and(eq(household.id, deal.householdId), eq(household.companyId, deal.companyId)))
    .leftJoin(user, eq(user.id, deal.ownerUserId))
    .where(visibleTo(member))
    .orderBy(desc(deal.stageChangedAt));
}

export async function getDealOrThrow(member: Member, dealId: string): Promise<DealRow> {
  const [row] = await db()
    .select(dealColumns)
    .from(deal)
    .innerJoin(household, and(eq(household.id, deal.householdId), eq(household.companyId, deal.companyId)))
    .leftJoin(user, eq(user.id, deal.ownerUserId))
    .where(and(eq(deal.id, dealId), visibleTo(member)))
    .limit(1);
  if (!row) throw notFound("Deal");
  return row;
}

export async function countDealsByStage(member: Member): Promise<Record<Stage, number>> {
  const counts = Object.fromEntries(STAGES.map((s) => [s, 0])) as Record<Stage, number>;
  for (const row of await listDeals(member)) counts[row.stage] += 1;
  return counts;
}

export async function getHouseholdOrThrow(member: Member, householdId: string) {
  const [row] = await db()
    .select()
    .from(household)
    .where(and(eq(household.id, householdId), eq(household.companyId, member.companyId)))
    .limit(1);
  if (!row) throw notFound("Household");
  if (!can(member.role, "deals:read-all")) {
    // A rep sees a household only through a deal they own.
    const [owned] = await db()
      .select({ id: deal.id })
      .from(deal)
      .where(and(eq(deal.householdId, householdId), eq(deal.companyId, member.companyId), eq(deal.ownerUserId, member.userId)))
      .limit(1);
    if (!owned) throw notFound("Household");
  }
  return row;
}
