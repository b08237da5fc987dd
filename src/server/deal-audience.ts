import "server-only";
import { and, eq, type SQL } from "drizzle-orm";
import { deal } from "@/db/schema";
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
