import "server-only";
import { and, eq } from "drizzle-orm";
import { proposal } from "@/db/schema";
import { can } from "@/lib/permissions";
import { proposalLinkState, type ProposalLinkState } from "@/lib/proposal-snapshot";
import { transaction } from "@/server/db";
import { forbidden, HttpError } from "@/server/errors";
import type { Member } from "@/server/session";
import { recordEvent } from "@/server/timeline";
import { getCompanySettings } from "@/server/company-settings";
import { newLinkToken } from "@/server/tokens";
import { insertProposalEvent } from "./events";
import { getProposalOrThrow, labelOf, type ProposalRow } from "./rows";
import { mailProposalLink, type SentProposal } from "./send";

// ── Revoke and re-send ──────────────────────────────────────────────────────────────────────

export const STATE_REFUSALS: Record<Exclude<ProposalLinkState, "live">, string> = {
  expired: "This version's link has expired.",
  revoked: "This version's link was revoked.",
  replaced: "A newer version replaced this one.",
  signed: "This version is signed.",
  cancelled: "The buyer cancelled this agreement.",
};

/** Stops the link working (reps on their own deals, the office on all). Only a live, unsigned version can be revoked. */
export async function revokeProposal(member: Member, proposalId: string): Promise<ProposalRow> {
  if (!can(member.role, "proposals:send")) throw forbidden("revoking proposals");
  const p = await getProposalOrThrow(member, proposalId);
  const now = new Date();
  await transaction(async (tx) => {
    const [row] = await tx
      .select({ status: proposal.status })
      .from(proposal)
      .where(and(eq(proposal.id, p.id), eq(proposal.companyId, member.companyId)))
      .for("update");
    if (!row || row.status !== "sent") {
      const state = proposalLinkState({ status: row?.status ?? "revoked", expiresAt: p.expiresAt });
      throw new HttpError(409, "not_revocable", `${labelOf(p)} cannot be revoked. ${state === "live" ? "" : STATE_REFUSALS[state]}`.trim());
    }
    await tx.update(proposal).set({ status: "revoked", revokedAt: now }).where(and(eq(proposal.id, p.id), eq(proposal.companyId, member.companyId)));
    await insertProposalEvent(tx, { companyId: member.companyId, proposalId: p.id, kind: "revoked", actorUserId: member.userId, at: now });
    await recordEvent(tx, {
      companyId: member.companyId,
      dealId: p.dealId,
      kind: "proposal.revoked",
      summary: `${member.name} revoked the link of proposal ${labelOf(p)}`,
      actorUserId: member.userId,
      data: { proposalId: p.id },
    });
  });
  return getProposalOrThrow(member, p.id);
}

/**
 * A new link for the same version (the customer lost the e-mail, or it went to a wrong
 * address): a new token replaces the old one, which stops working at once. Live, signed and
 * cancelled versions can be re-sent (a signed customer keeps access to their copy); an expired,
 * revoked or replaced one cannot — send a new version instead.
 */
export async function resendProposal(member: Member, proposalId: string): Promise<SentProposal> {
  if (!can(member.role, "proposals:send")) throw forbidden("re-sending proposals");
  const p = await getProposalOrThrow(member, proposalId);
  const state = proposalLinkState(p);
  if (state === "expired" || state === "revoked" || state === "replaced") {
    throw new HttpError(409, "not_resendable", `${STATE_REFUSALS[state]} Send a new version from the Proposal tab instead.`);
  }
  const { token, hash } = newLinkToken();
  const eventId = await transaction(async (tx) => {
    await tx.update(proposal).set({ tokenHash: hash, codeHash: null, codeExpiresAt: null, codeAttempts: 0, codeVerifiedAt: null }).where(and(eq(proposal.id, p.id), eq(proposal.companyId, member.companyId)));
    const eid = await insertProposalEvent(tx, { companyId: member.companyId, proposalId: p.id, kind: "resent", body: `to ${p.sentToEmail}`, actorUserId: member.userId });
    await recordEvent(tx, {
      companyId: member.companyId,
      dealId: p.dealId,
      kind: "proposal.resent",
      summary: `${member.name} sent a new link for proposal ${labelOf(p)} to ${p.sentToEmail}; the earlier link no longer opens`,
      actorUserId: member.userId,
      data: { proposalId: p.id },
    });
    return eid;
  });
  const mail = await mailProposalLink({
    companyId: member.companyId,
    proposalId: p.id,
    dealId: p.dealId,
    token,
    snapshot: p.snapshot,
    label: labelOf(p),
    expiresAt: p.expiresAt,
    timeZone: (await getCompanySettings(member.companyId)).timeZone,
    to: p.sentToEmail,
    message: "",
    idempotencyKey: `proposal-resent-${eventId}`,
    resent: true,
  });
  return { id: p.id, label: labelOf(p), number: p.number, version: p.version, expiresAt: p.expiresAt, ...mail };
}
