import "server-only";
import { createElement } from "react";
import { and, eq } from "drizzle-orm";
import { deal, job, proposal, STAGES, type Stage } from "@/db/schema";
import { formatDateTime } from "@/lib/format";
import { dateInZone } from "@/lib/zoned-time";
import { canStillCancel, cancelWindowClosesAt, formatIsoDateLong } from "@/lib/proposal-snapshot";
import ProposalCancelledEmail from "@emails/proposal-cancelled";
import { getCompanySettings } from "@/server/company-settings";
import { transaction, type Tx } from "@/server/db";
import { HttpError, notFound } from "@/server/errors";
import type { ClientMeta } from "@/server/client-address";
import { queueMail, sendQueuedNow } from "@/server/outbound-mail";
import { cancelJobOfDeal } from "@/server/jobs";
import { autoMoveStage } from "@/server/stages";
import { refundOnCancellation } from "@/server/payments";
import { recordEvent } from "@/server/timeline";
import { insertProposalEvent } from "./events";
import { labelOf, type ProposalRow } from "./rows";
import { dealProposalUrl } from "./send";

// ── Right to cancel ─────────────────────────────────────────────────────────────────────────

/** Stages where the system is on the roof: no cancellation can stop the work any more. */
const WORK_DONE_STAGES: readonly Stage[] = ["installed", "inspected", "live"];

/**
 * Stages a cancellation moves a deal from: any before the work is done, side stages included (a
 * signed deal put On hold or Lost is still the buyer's to cancel, and its job must stop too).
 */
const CANCELLABLE_STAGES: readonly Stage[] = STAGES.filter((s) => !WORK_DONE_STAGES.includes(s) && s !== "cancelled");

export type CancelOutcome = { proposalId: string; companyId: string; dealId: string; cancelledAt: Date };

/**
 * The buyer cancels a signed in-home sale inside the 3-business-day window (16 CFR 429.1):
 * the proposal becomes cancelled and the deal moves to Cancelled, in one transaction. After
 * the window: 409 naming the deadline.
 */
export async function cancelSignedProposal(p: ProposalRow, client: ClientMeta, now = new Date()): Promise<CancelOutcome> {
  const { timeZone } = await getCompanySettings(p.companyId);
  const outcome = await transaction(async (tx) => {
    const [row] = await tx
      .select({ status: proposal.status, inHomeSale: proposal.inHomeSale, cancelDeadline: proposal.cancelDeadline })
      .from(proposal)
      .where(and(eq(proposal.id, p.id), eq(proposal.companyId, p.companyId)))
      .for("update");
    if (!row) throw notFound("Proposal");
    if (row.status === "cancelled") throw new HttpError(409, "already_cancelled", "This agreement is already cancelled.");
    if (row.status !== "signed") throw new HttpError(409, "not_signed", "Only a signed agreement can be cancelled.");
    if (!row.inHomeSale || !row.cancelDeadline) throw new HttpError(409, "no_right_to_cancel", "This agreement was not made in your home, so the 3-day right to cancel does not apply. Contact your installer.");
    if (!canStillCancel(row, timeZone, now)) {
      throw new HttpError(409, "cancel_window_closed", `The time to cancel ended with ${formatIsoDateLong(row.cancelDeadline)}. Contact your installer.`);
    }
    await refuseWhenWorkDone(tx, p);
    await tx.update(proposal).set({ status: "cancelled", cancelledAt: now }).where(and(eq(proposal.id, p.id), eq(proposal.companyId, p.companyId)));
    await insertProposalEvent(tx, { companyId: p.companyId, proposalId: p.id, kind: "cancelled", body: "The buyer cancelled inside the right-to-cancel window.", client, at: now });
    await recordEvent(tx, {
      companyId: p.companyId,
      dealId: p.dealId,
      kind: "proposal.cancelled",
      summary: `The buyer cancelled the signed agreement ${labelOf(p)} (right to cancel until ${formatIsoDateLong(row.cancelDeadline)})`,
      actorUserId: null,
      data: { proposalId: p.id, ip: client.ip },
    });
    await autoMoveStage(tx, {
      companyId: p.companyId,
      dealId: p.dealId,
      from: CANCELLABLE_STAGES,
      to: "cancelled",
      summary: `Moved to Cancelled: the buyer cancelled ${labelOf(p)} inside the 3-business-day window`,
      data: { proposalId: p.id },
    });
    await cancelJobOfDeal(tx, { companyId: p.companyId, dealId: p.dealId, reason: `the buyer cancelled ${labelOf(p)} on ${formatIsoDateLong(dateInZone(now, timeZone))}, inside the right-to-cancel window`, at: now });
    const mailId = await queueMail(tx, {
      companyId: p.companyId,
      kind: "proposal-cancelled",
      to: p.snapshot.rep.email,
      subject: `Cancelled: the ${p.snapshot.household.name} (${labelOf(p)})`,
      react: createElement(ProposalCancelledEmail, {
        householdName: p.snapshot.household.name,
        label: labelOf(p),
        cancelledAt: formatDateTime(now, timeZone),
        dealUrl: dealProposalUrl(p.dealId),
      }),
      idempotencyKey: `proposal-cancelled-${p.id}`,
    });
    return { proposalId: p.id, companyId: p.companyId, dealId: p.dealId, cancelledAt: now, mailId };
  });
  // After the commit: refund any paid deposit through the provider. The cancellation stands even
  // if the provider cannot be reached now; the office sees the refund due on Today and retries.
  try {
    await refundOnCancellation(outcome.companyId, outcome.dealId, `Buyer cancelled ${labelOf(p)} inside the right-to-cancel window`);
  } catch (err) {
    console.error(`[proposals] refund after the cancellation of ${labelOf(p)} failed:`, err);
  }
  await sendQueuedNow([outcome.mailId]);
  const { mailId: _sent, ...cancelled } = outcome;
  return cancelled;
}

/**
 * Installs wait for the buyer's window to end (updateJob, markJobInstalled), so this cannot
 * happen through Kilowright; a deal moved by hand past the install, or a job marked installed,
 * is refused anyway rather than left Installed with a cancelled agreement and a refund.
 */
async function refuseWhenWorkDone(tx: Tx, p: ProposalRow): Promise<void> {
  const [d] = await tx
    .select({ stage: deal.stage, installedAt: job.installedAt })
    .from(deal)
    .leftJoin(job, and(eq(job.dealId, deal.id), eq(job.companyId, deal.companyId)))
    .where(and(eq(deal.id, p.dealId), eq(deal.companyId, p.companyId)))
    .for("update");
  if (d && (WORK_DONE_STAGES.includes(d.stage) || d.installedAt)) {
    throw new HttpError(409, "work_done", "The system is already installed, so this agreement can no longer be cancelled here. Contact your installer.");
  }
}

/** When the buyer's window closes, for the page (null when the sale carries no right to cancel). */
export async function cancelWindowOf(p: ProposalRow, now = new Date()): Promise<{ deadline: string; closesAt: Date; timeZone: string; open: boolean } | null> {
  if (!p.inHomeSale || !p.cancelDeadline) return null;
  const { timeZone } = await getCompanySettings(p.companyId);
  const closesAt = cancelWindowClosesAt(p.cancelDeadline, timeZone);
  return { deadline: p.cancelDeadline, closesAt, timeZone, open: canStillCancel(p, timeZone, now) };
}
