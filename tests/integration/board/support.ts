// Shared set-up of the Board area's integration tests: deals written straight to MariaDB.
import { and, asc, eq } from "drizzle-orm";
import { deal, household, timelineEvent, type Stage } from "@/db/schema";
import { db } from "@/server/db";
import type { Member } from "@/server/session";

/** A household and its deal, owned by `owner`, in `stage`, moved there `daysAgo` days ago. */
export async function newDeal(
  by: Member,
  stage: Stage,
  opts: { name?: string; owner?: Member | null; daysAgo?: number; source?: string; contractCents?: number } = {},
): Promise<string> {
  const householdId = crypto.randomUUID();
  const dealId = crypto.randomUUID();
  await db()
    .insert(household)
    .values({
      id: householdId,
      companyId: by.companyId,
      name: opts.name ?? "Testwood household",
      street: "1 Test Lane",
      city: "Testville",
      region: "NC",
      postalCode: "27000",
      latitude: 36,
      longitude: -80,
    });
  const owner = opts.owner === undefined ? by : opts.owner;
  await db()
    .insert(deal)
    .values({
      id: dealId,
      companyId: by.companyId,
      householdId,
      ownerUserId: owner?.userId ?? null,
      stage,
      source: opts.source ?? "Referral",
      contractCents: opts.contractCents ?? null,
      stageChangedAt: new Date(Date.now() - (opts.daysAgo ?? 0) * 86_400_000),
    });
  return dealId;
}

export async function dealRow(dealId: string) {
  const [row] = await db().select().from(deal).where(eq(deal.id, dealId));
  return row;
}

export async function eventsOf(dealId: string, kind: string) {
  return db()
    .select()
    .from(timelineEvent)
    .where(and(eq(timelineEvent.dealId, dealId), eq(timelineEvent.kind, kind)))
    .orderBy(asc(timelineEvent.createdAt));
}

export { rejects } from "../support/fixtures";
