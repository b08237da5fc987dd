import "server-only";
import { and, eq } from "drizzle-orm";
import { cache } from "react";
import { deal, household, user, utility } from "@/db/schema";
import { can } from "@/lib/permissions";
import { getCompanySettings, type CompanySettings } from "@/server/company-settings";
import { db } from "@/server/db";
import { dealColumns, visibleTo, type DealRow } from "@/server/deal-audience";
import { HttpError, notFound } from "@/server/errors";
import type { Member } from "@/server/member";

export type DealRecord = DealRow & { utilityId: string | null; utilityName: string | null; ratePlanId: string | null; ownerUserId: string | null; ownerEmail: string | null };

export type HouseholdRecord = typeof household.$inferSelect;

/** What the member may do in this deal room, from the permissions table (src/lib/permissions.ts). */
export type DealRights = {
  /** Change the household, bills, design and offers. */
  edit: boolean;
  /** Open the Design tab: the catalog and the weather stations. */
  design: boolean;
  /** Open the Offers tab: the price book and the catalog. */
  price: boolean;
  /** Freeze offers into a proposal and send it. */
  send: boolean;
  /** Decide discounts beyond a rep's limit. */
  approveDiscounts: boolean;
  /** The deposits and refunds of the Money tab. */
  seeMoney: boolean;
  refund: boolean;
};

/**
 * One deal as a request sees it: the deal, its household, the company settings the deal room
 * needs and the member's rights. Every deal-room read and action takes it instead of looking
 * the deal up again.
 */
export type DealScope = {
  member: Member;
  companyId: string;
  dealId: string;
  deal: DealRecord;
  household: HouseholdRecord;
  settings: CompanySettings;
  rights: DealRights;
};

export function dealRights(member: Member): DealRights {
  return {
    edit: can(member.role, "deals:write"),
    design: can(member.role, "catalog:read") && can(member.role, "weather:read"),
    price: can(member.role, "pricebook:read") && can(member.role, "catalog:read"),
    send: can(member.role, "proposals:send"),
    approveDiscounts: can(member.role, "discounts:approve"),
    seeMoney: can(member.role, "payments:read"),
    refund: can(member.role, "payments:refund"),
  };
}

async function loadDeal(member: Member, dealId: string): Promise<DealScope> {
  const [[row], settings] = await Promise.all([
    db()
      .select({ deal: { ...dealColumns, utilityId: deal.utilityId, utilityName: utility.name, ratePlanId: deal.ratePlanId, ownerUserId: deal.ownerUserId, ownerEmail: user.email }, household })
      .from(deal)
      .innerJoin(household, and(eq(household.id, deal.householdId), eq(household.companyId, deal.companyId)))
      .leftJoin(utility, and(eq(utility.id, deal.utilityId), eq(utility.companyId, deal.companyId)))
      .leftJoin(user, eq(user.id, deal.ownerUserId))
      // Tenancy and the rep's own-deals rule in the query itself: anything else is not found.
      .where(and(eq(deal.id, dealId), visibleTo(member)))
      .limit(1),
    getCompanySettings(member.companyId),
  ]);
  if (!row) throw notFound("Deal");
  return {
    member,
    companyId: member.companyId,
    dealId,
    deal: row.deal,
    household: row.household,
    settings,
    rights: dealRights(member),
  };
}

/**
 * The deal scope, read once per request: React's cache() keeps it for the render of a page
 * (layout, tab and their loaders share it; `getMember` is cached too, so the member is the same
 * object). Route handlers call it once and pass the scope on.
 */
export const openDeal = cache(loadDeal);

/**
 * For records found by their own id (an offer, a bill, a proposal): the scope of their deal,
 * with "not found" naming the record, so a rep never learns that another rep's record exists.
 */
export async function openDealOf(member: Member, dealId: string, what: string): Promise<DealScope> {
  return openDeal(member, dealId).catch((err: unknown) => {
    throw err instanceof HttpError && err.status === 404 ? notFound(what) : err;
  });
}

/** A record found by its own id, in its deal's scope: not found (naming the record) when missing or out of sight. */
export async function inDealOrThrow<T extends { dealId: string }>(member: Member, what: string, rows: T[]): Promise<T> {
  const [row] = rows;
  if (!row) throw notFound(what);
  await openDealOf(member, row.dealId, what);
  return row;
}
