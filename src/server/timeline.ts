import "server-only";
import { and, asc, eq } from "drizzle-orm";
import { timelineEvent, user } from "@/db/schema";
import { companyRowOrThrow } from "@/server/records";
import { db, type Tx } from "@/server/db";

import type { Member } from "@/server/session";

export type TimelineEntry = {
  id: string;
  kind: string;
  summary: string;
  data: unknown;
  actorName: string | null;
  createdAt: Date;
};

/** Writes one event; call it inside the transaction of the change it describes. */
export async function recordEvent(
  tx: Tx,
  event: { companyId: string; dealId: string; kind: string; summary: string; actorUserId: string | null; data?: Record<string, unknown> },
): Promise<void> {
  await tx.insert(timelineEvent).values({ id: crypto.randomUUID(), ...event, data: event.data ?? null });
}

export async function listTimeline(member: Member, dealId: string): Promise<TimelineEntry[]> {
  return db()
    .select({
      id: timelineEvent.id,
      kind: timelineEvent.kind,
      summary: timelineEvent.summary,
      data: timelineEvent.data,
      actorName: user.name,
      createdAt: timelineEvent.createdAt,
    })
    .from(timelineEvent)
    .leftJoin(user, eq(user.id, timelineEvent.actorUserId))
    .where(and(eq(timelineEvent.companyId, member.companyId), eq(timelineEvent.dealId, dealId)))
    .orderBy(asc(timelineEvent.createdAt));
}

export async function getTimelineEventOrThrow(member: Member, eventId: string) {
  return companyRowOrThrow(timelineEvent, member.companyId, eventId, "Timeline event");
}
