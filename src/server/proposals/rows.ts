import "server-only";
import { and, eq } from "drizzle-orm";
import { z } from "zod";
import { proposal, proposalEvent } from "@/db/schema";
import { proposalDisplayStatus, proposalLabel, proposalLinkState } from "@/lib/proposal-snapshot";
import type { ProposalSnapshot } from "@/lib/schemas/proposal";
import { db } from "@/server/db";
import { inDealOrThrow } from "@/server/deal-scope";
import type { Member } from "@/server/session";
import { hashToken } from "@/server/tokens";

// ── Rows ────────────────────────────────────────────────────────────────────────────────────

type StoredProposal = typeof proposal.$inferSelect;

/** A proposal as the server modules use it (never with the token or code hashes). */
export type ProposalRow = Omit<StoredProposal, "snapshot" | "tokenHash" | "codeHash"> & { snapshot: ProposalSnapshot };

export function toRow(row: StoredProposal): ProposalRow {
  const { tokenHash: _t, codeHash: _c, snapshot, ...rest } = row;
  return { ...rest, snapshot };
}

export const labelOf = (p: { number: number; version: number }) => proposalLabel(p.number, p.version);

/** A link token as newLinkToken makes it: 32 random bytes in base64url (43 characters). */
export const tokenSchema = z.string().regex(/^[A-Za-z0-9_-]{43}$/);

/**
 * The proposal a customer's link points at, or null (malformed or unknown token). Only the
 * token's SHA-256 is stored, so the lookup hashes it first.
 */
export async function findProposalByToken(token: string): Promise<ProposalRow | null> {
  if (!tokenSchema.safeParse(token).success) return null;
  const [row] = await db().select().from(proposal).where(eq(proposal.tokenHash, hashToken(token))).limit(1);
  return row ? toRow(row) : null;
}

/** A proposal by id for staff: company-scoped in the query, reps only on deals they own. */
export async function getProposalOrThrow(member: Member, proposalId: string): Promise<ProposalRow> {
  return toRow(await inDealOrThrow(member, "Proposal", await db().select().from(proposal).where(and(eq(proposal.id, proposalId), eq(proposal.companyId, member.companyId))).limit(1)));
}

/** A proposal's event by id, seen through its proposal's deal (reps: their own deals only). */
export async function getProposalEventOrThrow(member: Member, eventId: string) {
  const rows = await db()
    .select({ event: proposalEvent, dealId: proposal.dealId })
    .from(proposalEvent)
    .innerJoin(proposal, and(eq(proposal.id, proposalEvent.proposalId), eq(proposal.companyId, proposalEvent.companyId)))
    .where(and(eq(proposalEvent.id, eventId), eq(proposalEvent.companyId, member.companyId)))
    .limit(1);
  return (await inDealOrThrow(member, "Proposal event", rows)).event;
}

/** What the staff API answers for one proposal: no hashes, the label and the link state. */
export function publicView(p: ProposalRow) {
  return { ...p, label: labelOf(p), state: proposalLinkState(p), displayStatus: proposalDisplayStatus(p) };
}
