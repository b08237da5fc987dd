import "server-only";
import { and, asc, eq, inArray } from "drizzle-orm";
import { proposalEvent, user } from "@/db/schema";
import { db, type Tx } from "@/server/db";
import type { ClientMeta } from "@/server/client-address";

// ── Events ──────────────────────────────────────────────────────────────────────────────────

export type ProposalEventKind =
  | "sent"
  | "resent"
  | "send_failed"
  | "opened"
  | "viewed"
  | "code_sent"
  | "code_wrong"
  | "code_verified"
  | "consented"
  | "signed"
  | "question"
  | "revoked"
  | "cancelled";

export async function insertProposalEvent(
  tx: Tx,
  e: { companyId: string; proposalId: string; kind: ProposalEventKind; body?: string | null; client?: ClientMeta | null; actorUserId?: string | null; at?: Date },
): Promise<string> {
  const id = crypto.randomUUID();
  await tx.insert(proposalEvent).values({
    id,
    companyId: e.companyId,
    proposalId: e.proposalId,
    kind: e.kind,
    body: e.body ?? null,
    ip: e.client?.ip ?? null,
    userAgent: e.client?.userAgent ?? null,
    actorUserId: e.actorUserId ?? null,
    createdAt: e.at ?? new Date(),
  });
  return id;
}

export type ProposalEventView = { id: string; kind: string; body: string | null; ip: string | null; userAgent: string | null; actorName: string | null; createdAt: Date };

export async function eventsOf(companyId: string, proposalIds: string[]): Promise<(ProposalEventView & { proposalId: string })[]> {
  if (proposalIds.length === 0) return [];
  return db()
    .select({
      id: proposalEvent.id,
      proposalId: proposalEvent.proposalId,
      kind: proposalEvent.kind,
      body: proposalEvent.body,
      ip: proposalEvent.ip,
      userAgent: proposalEvent.userAgent,
      actorName: user.name,
      createdAt: proposalEvent.createdAt,
    })
    .from(proposalEvent)
    .leftJoin(user, eq(user.id, proposalEvent.actorUserId))
    .where(and(eq(proposalEvent.companyId, companyId), inArray(proposalEvent.proposalId, proposalIds)))
    .orderBy(asc(proposalEvent.createdAt));
}
