import "server-only";
import { and, eq } from "drizzle-orm";
import { payment, proposal, refund } from "@/db/schema";
import { formatCentsExact } from "@/lib/format";
import { db, type Tx } from "@/server/db";
import { createJobForDeal } from "@/server/jobs";
import { queueMail, sendQueuedNow } from "@/server/outbound-mail";
import { autoMoveStage } from "@/server/stages";
import { stripe } from "@/server/stripe";
import { recordEvent } from "@/server/timeline";
import { BOOKED_STATUSES, CANCELLED_BEFORE_PAYMENT_REASON, idOf, type PaymentRow, UNSETTLED_STATUSES } from "./common";
import { depositReceiptMail } from "./receipts";
import { issueRefund, recomputeRefunded, refundableCents } from "./refunds";

// ── Ledger changes from the provider's events (called by src/server/webhooks.ts) ────────────

/** Work to do after the ledger transaction committed (e-mail); failures are logged, never undo the commit. */
export type AfterCommit = () => Promise<void>;

/** Where an event says a payment belongs; any of these may be missing. */
export type PaymentRef = {
  metadata?: Record<string, string> | null;
  sessionId?: string | null;
  paymentIntentId?: string | null;
  chargeId?: string | null;
};

/** Finds and locks the ledger row an event is about: our metadata first, then the provider's ids. */
export async function lockPaymentFor(tx: Tx, ref: PaymentRef): Promise<PaymentRow | null> {
  const paymentId = ref.metadata?.paymentId;
  const companyId = ref.metadata?.companyId;
  const tries = [
    paymentId && companyId ? and(eq(payment.id, paymentId), eq(payment.companyId, companyId)) : null,
    ref.sessionId ? eq(payment.checkoutSessionId, ref.sessionId) : null,
    ref.paymentIntentId ? eq(payment.paymentIntentId, ref.paymentIntentId) : null,
    ref.chargeId ? eq(payment.chargeId, ref.chargeId) : null,
  ];
  for (const where of tries) {
    if (!where) continue;
    const [row] = await tx.select().from(payment).where(where).limit(1).for("update");
    if (row) return row;
  }
  return null;
}

export type Reported = { amountCents: number | null; currency: string | null; paymentIntentId: string | null; chargeId: string | null; at: Date };
export type LedgerOutcome = { outcome: "booked" | "flagged" | "already_booked" | "updated" | "ignored" | "failed" | "expired" | "refunded"; note?: string };

/**
 * The provider reports the money arrived: book it (status paid, deal to Deposit paid, job
 * created, receipt after commit) when amount and currency are what we asked; otherwise flag
 * it for the office and book nothing. A payment already booked only gains missing ids.
 */
export async function bookPayment(tx: Tx, row: PaymentRow, reported: Reported, receiptKey: string, after: AfterCommit[]): Promise<LedgerOutcome> {
  const where = and(eq(payment.id, row.id), eq(payment.companyId, row.companyId));
  if (BOOKED_STATUSES.includes(row.status)) {
    const fill: Partial<PaymentRow> = {};
    if (!row.paymentIntentId && reported.paymentIntentId) fill.paymentIntentId = reported.paymentIntentId;
    if (!row.chargeId && reported.chargeId) fill.chargeId = reported.chargeId;
    if (Object.keys(fill).length === 0) return { outcome: "already_booked" };
    await tx.update(payment).set(fill).where(where);
    return { outcome: "updated", note: `filled ${Object.keys(fill).join(", ")}` };
  }

  const currency = reported.currency?.toLowerCase() ?? null;
  const ids = { paymentIntentId: reported.paymentIntentId ?? row.paymentIntentId, chargeId: reported.chargeId ?? row.chargeId };
  const mismatch: string[] = [];
  if (reported.amountCents !== row.amountCents) mismatch.push(`paid ${formatCentsExact(reported.amountCents, currency ?? row.currency)} but the deposit is ${formatCentsExact(row.amountCents, row.currency)}`);
  if (currency !== row.currency) mismatch.push(`currency ${currency?.toUpperCase() ?? "missing"} instead of ${row.currency.toUpperCase()}`);

  if (mismatch.length > 0) {
    const flagReason = `The provider reports ${mismatch.join("; ")}. Not booked: check it with the customer, then refund or settle the difference.`;
    await tx
      .update(payment)
      .set({ status: "flagged", flagReason: flagReason.slice(0, 500), paidCents: reported.amountCents, paidAt: reported.at, failureMessage: null, ...ids })
      .where(where);
    await recordEvent(tx, {
      companyId: row.companyId,
      dealId: row.dealId,
      kind: "deposit.flagged",
      summary: `Deposit flagged for the office: ${mismatch.join("; ")}`,
      actorUserId: null,
      data: { paymentId: row.id, reportedCents: reported.amountCents, reportedCurrency: currency, expectedCents: row.amountCents },
    });
    return { outcome: "flagged", note: mismatch.join("; ").slice(0, 500) };
  }

  await tx.update(payment).set({ status: "paid", paidCents: reported.amountCents, paidAt: reported.at, failureMessage: null, flagReason: null, ...ids }).where(where);
  const [agreement] = await tx
    .select({ status: proposal.status })
    .from(proposal)
    .where(and(eq(proposal.id, row.proposalId), eq(proposal.companyId, row.companyId)))
    .limit(1);
  if (agreement?.status === "cancelled") {
    // Paid on a checkout still open when the customer cancelled: no job, and the money goes back.
    await recordEvent(tx, {
      companyId: row.companyId,
      dealId: row.dealId,
      kind: "deposit.paid",
      summary: `Deposit of ${formatCentsExact(row.amountCents, row.currency)} paid after the agreement was cancelled; it is refunded in full`,
      actorUserId: null,
      data: { paymentId: row.id, ...ids, afterCancellation: true },
    });
    after.push(async () => {
      const [fresh] = await db().select().from(payment).where(where).limit(1);
      if (fresh && refundableCents(fresh) > 0) await issueRefund(fresh, refundableCents(fresh), CANCELLED_BEFORE_PAYMENT_REASON, null);
    });
    return { outcome: "booked", note: "paid after cancellation; refund queued" };
  }
  await recordEvent(tx, {
    companyId: row.companyId,
    dealId: row.dealId,
    kind: "deposit.paid",
    summary: `Deposit of ${formatCentsExact(row.amountCents, row.currency)} paid by card (${ids.paymentIntentId ?? row.checkoutSessionId})`,
    actorUserId: null,
    data: { paymentId: row.id, ...ids },
  });
  await autoMoveStage(tx, {
    companyId: row.companyId,
    dealId: row.dealId,
    from: ["signed"],
    to: "deposit_paid",
    summary: `Deposit of ${formatCentsExact(row.amountCents, row.currency)} received: moved to Deposit paid`,
    data: { paymentId: row.id },
  });
  await createJobForDeal(tx, { companyId: row.companyId, dealId: row.dealId, proposalId: row.proposalId });
  // The receipt is written with the booking (transactional outbox) and sent right after the commit.
  const mailId = await queueMail(tx, { ...(await depositReceiptMail(tx, row.id)), kind: "deposit-receipt", idempotencyKey: `deposit-receipt-${receiptKey}` });
  after.push(() => sendQueuedNow([mailId]));
  return { outcome: "booked" };
}

/** A card attempt failed; the session may still be paid with another card, so only an unpaid row changes. */
export async function markPaymentFailed(tx: Tx, row: PaymentRow, paymentIntentId: string | null, message: string): Promise<LedgerOutcome> {
  if (!UNSETTLED_STATUSES.includes(row.status) && row.status !== "expired") return { outcome: "ignored", note: `payment is ${row.status}` };
  await tx
    .update(payment)
    .set({ status: "failed", failureMessage: message.slice(0, 500), paymentIntentId: paymentIntentId ?? row.paymentIntentId })
    .where(and(eq(payment.id, row.id), eq(payment.companyId, row.companyId)));
  await recordEvent(tx, {
    companyId: row.companyId,
    dealId: row.dealId,
    kind: "deposit.failed",
    summary: `Deposit payment did not go through: ${message}`.slice(0, 500),
    actorUserId: null,
    data: { paymentId: row.id, paymentIntentId },
  });
  return { outcome: "failed", note: message.slice(0, 500) };
}

export async function markPaymentExpired(tx: Tx, row: PaymentRow): Promise<LedgerOutcome> {
  if (!UNSETTLED_STATUSES.includes(row.status)) return { outcome: "ignored", note: `payment is ${row.status}` };
  await tx.update(payment).set({ status: "expired" }).where(and(eq(payment.id, row.id), eq(payment.companyId, row.companyId)));
  await recordEvent(tx, {
    companyId: row.companyId,
    dealId: row.dealId,
    kind: "deposit.expired",
    summary: "The deposit checkout expired unpaid; the customer can start a new one from their page",
    actorUserId: null,
    data: { paymentId: row.id },
  });
  return { outcome: "expired" };
}

/** Re-reads the payment's refunds from the provider and brings the ledger in line (each refund once, by its id). */
async function syncRefundsFromProvider(tx: Tx, row: PaymentRow): Promise<number> {
  if (!row.paymentIntentId) return 0;
  let added = 0;
  for await (const r of stripe().refunds.list({ payment_intent: row.paymentIntentId, limit: 100 })) {
    const status = r.status ?? "pending";
    const reason = (r.metadata?.reason || "Refunded at the payment provider").slice(0, 500);
    const inserted = await tx
      .insert(refund)
      .ignore()
      .values({ id: crypto.randomUUID(), companyId: row.companyId, paymentId: row.id, dealId: row.dealId, stripeRefundId: r.id, amountCents: r.amount, status, reason });
    if (inserted[0].affectedRows === 1) {
      added += 1;
      await recordEvent(tx, {
        companyId: row.companyId,
        dealId: row.dealId,
        kind: "deposit.refunded",
        summary: `Refund of ${formatCentsExact(r.amount, r.currency)} recorded from the payment provider: ${reason}`.slice(0, 500),
        actorUserId: null,
        data: { paymentId: row.id, stripeRefundId: r.id },
      });
    } else {
      await tx.update(refund).set({ status }).where(and(eq(refund.stripeRefundId, r.id), eq(refund.companyId, row.companyId)));
    }
  }
  return added;
}

/**
 * The provider says a charge was refunded (by us or elsewhere). When the payment itself has not
 * been booked yet (events out of order), the payment is first booked from the provider's own
 * PaymentIntent, then the refunds are read from the provider: the end state is the same in
 * either order.
 */
export async function applyChargeRefunded(
  tx: Tx,
  row: PaymentRow,
  charge: { paymentIntentId: string | null; chargeId: string | null },
  eventId: string,
  after: AfterCommit[],
): Promise<LedgerOutcome> {
  let current = row;
  const piId = row.paymentIntentId ?? charge.paymentIntentId;
  if (!piId) return { outcome: "ignored", note: "refund without a payment intent" };
  if (!BOOKED_STATUSES.includes(row.status)) {
    const pi = await stripe().paymentIntents.retrieve(piId);
    if (pi.status !== "succeeded") return { outcome: "ignored", note: `payment intent is ${pi.status}` };
    await bookPayment(
      tx,
      row,
      { amountCents: pi.amount_received, currency: pi.currency, paymentIntentId: pi.id, chargeId: idOf(pi.latest_charge) ?? charge.chargeId, at: new Date(pi.created * 1000) },
      eventId,
      after,
    );
    [current] = await tx.select().from(payment).where(and(eq(payment.id, row.id), eq(payment.companyId, row.companyId))).limit(1);
  } else if (!row.paymentIntentId || (!row.chargeId && charge.chargeId)) {
    await tx
      .update(payment)
      .set({ paymentIntentId: piId, chargeId: row.chargeId ?? charge.chargeId })
      .where(and(eq(payment.id, row.id), eq(payment.companyId, row.companyId)));
    current = { ...row, paymentIntentId: piId, chargeId: row.chargeId ?? charge.chargeId };
  }
  const added = await syncRefundsFromProvider(tx, current);
  await recomputeRefunded(tx, current.id, current.companyId);
  return { outcome: "refunded", note: `${added} new refund(s)` };
}
