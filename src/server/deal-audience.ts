import "server-only";
import { and, eq, type SQL } from "drizzle-orm";
import { deal, household, user, type Stage } from "@/db/schema";
import { can } from "@/lib/permissions";
import type { Member } from "@/server/member";

/** Whose deals a person sees: the company's (office roles) or only the deals they own (reps). */
export const dealAudience = (member: Member): "company" | "own" => (can(member.role, "deals:read-all") ? "company" : "own");

/** The SQL of dealAudience, always scoped by company (every list of deals and the deal scope use it). */
export function visibleTo(member: Member): SQL {
  const company = eq(deal.companyId, member.companyId);
  if (dealAudience(member) === "company") return company;
  return and(company, eq(deal.ownerUserId, member.userId)) as SQL;
}

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

/** The columns of a DealRow, for a select from deal joined to household and the owner (user). */
export const dealColumns = {
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
