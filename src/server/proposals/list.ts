import "server-only";
import { and, desc, eq } from "drizzle-orm";
import { proposal, user } from "@/db/schema";
import { proposalDisplayStatus, proposalLinkState, type ProposalLinkState } from "@/lib/proposal-snapshot";
import { db } from "@/server/db";
import type { DealScope } from "@/server/deal-scope";
import { eventsOf, type ProposalEventView } from "./events";
import { labelOf, toRow } from "./rows";

// ── The Proposal tab's list ─────────────────────────────────────────────────────────────────

export type ProposalListItem = {
  id: string;
  label: string;
  number: number;
  version: number;
  status: ReturnType<typeof proposalDisplayStatus>;
  state: ProposalLinkState;
  sentAt: Date;
  sentToEmail: string;
  sentByName: string | null;
  expiresAt: Date;
  inHomeSale: boolean;
  offers: { position: number; name: string; contractCents: number }[];
  chosenPosition: number | null;
  signedAt: Date | null;
  signerName: string | null;
  signedSha256: string | null;
  cancelDeadline: string | null;
  cancelledAt: Date | null;
  revokedAt: Date | null;
  replacedByLabel: string | null;
  events: ProposalEventView[];
};

/** Every version of the deal's proposal, newest first, with its events. */
export async function listProposalsForDeal(scope: DealScope): Promise<ProposalListItem[]> {
  const { member, dealId } = scope;
  const rows = await db()
    .select({ p: proposal, sentByName: user.name })
    .from(proposal)
    .leftJoin(user, eq(user.id, proposal.sentByUserId))
    .where(and(eq(proposal.companyId, member.companyId), eq(proposal.dealId, dealId)))
    .orderBy(desc(proposal.number), desc(proposal.version));
  const events = await eventsOf(
    member.companyId,
    rows.map((r) => r.p.id),
  );
  const labels = new Map(rows.map((r) => [r.p.id, labelOf(r.p)]));
  return rows.map(({ p: stored, sentByName }) => {
    const p = toRow(stored);
    return {
      id: p.id,
      label: labelOf(p),
      number: p.number,
      version: p.version,
      status: proposalDisplayStatus(p),
      state: proposalLinkState(p),
      sentAt: p.createdAt,
      sentToEmail: p.sentToEmail,
      sentByName,
      expiresAt: p.expiresAt,
      inHomeSale: p.inHomeSale,
      offers: p.snapshot.offers.map((o) => ({ position: o.position, name: o.name, contractCents: o.figures.summary.contractCents })),
      chosenPosition: p.chosenPosition,
      signedAt: p.signedAt,
      signerName: p.signerName,
      signedSha256: p.signedSha256,
      cancelDeadline: p.cancelDeadline,
      cancelledAt: p.cancelledAt,
      revokedAt: p.revokedAt,
      replacedByLabel: p.replacedByProposalId ? (labels.get(p.replacedByProposalId) ?? null) : null,
      events: events.filter((e) => e.proposalId === p.id).map(({ proposalId: _p, ...e }) => e),
    };
  });
}
