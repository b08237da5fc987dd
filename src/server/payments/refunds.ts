import "server-only";
import { createElement } from "react";
import { and, eq, inArray } from "drizzle-orm";
import Stripe from "stripe";
import { payment, refund, type PaymentStatus } from "@/db/schema";
import { formatCentsExact } from "@/lib/format";
import { can } from "@/lib/permissions";
import RefundIssuedEmail from "@emails/refund-issued";
import { db, transaction, type Tx } from "@/server/db";
import { forbidden, HttpError, notFound } from "@/server/errors";
import { queueMail, sendQueuedNow } from "@/server/outbound-mail";
import type { Member } from "@/server/session";
import { stripe } from "@/server/stripe";
import { recordEvent } from "@/server/timeline";
import { BOOKED_STATUSES, COUNTED_REFUND_STATES, DEMO_SESSION_PREFIX, type PaymentRow, proposalLabelOf, providerError, REFUNDABLE_STATUSES, type RefundRow, UNSETTLED_STATUSES } from "./common";
import { getPaymentOrThrow } from "./office";
import { receiptContext } from "./receipts";

// ── Office: refunds ──────────────────────────────────────────────────────────────────────

/** Sets refundedCents and the status from the refund rows (called with the payment row locked). */
export async function recomputeRefunded(tx: Tx, paymentId: string, companyId: string): Promise<void> {
  const [row] = await tx.select().from(payment).where(and(eq(payment.id, paymentId), eq(payment.companyId, companyId))).limit(1);
  if (!row || !BOOKED_STATUSES.includes(row.status)) return;
  const refunds = await tx.select().from(refund).where(and(eq(refund.paymentId, paymentId), eq(refund.companyId, companyId)));
  const refundedCents = refunds.filter((r) => COUNTED_REFUND_STATES.includes(r.status)).reduce((sum, r) => sum + r.amountCents, 0);
  const paid = row.paidCents ?? 0;
  let status: PaymentStatus = row.status;
  if (refundedCents > 0 && refundedCents >= paid) status = "refunded";
  else if (row.status === "flagged") status = "flagged";
  else status = refundedCents > 0 ? "partially_refunded" : "paid";
  await tx.update(payment).set({ refundedCents, status }).where(and(eq(payment.id, paymentId), eq(payment.companyId, companyId)));
}

/** How much of a payment can still be returned. */
export function refundableCents(p: Pick<PaymentRow, "status" | "paidCents" | "refundedCents" | "paymentIntentId">): number {
  if (!REFUNDABLE_STATUSES.includes(p.status) || !p.paymentIntentId) return 0;
  return Math.max(0, (p.paidCents ?? 0) - p.refundedCents);
}

/**
 * Returns money through the SDK, then records the refund. No database lock is held while the
 * provider answers; the idempotency key names the ledger state and amount, so a double submit
 * returns the same refund, which the unique stripe_refund_id then records once.
 */
export async function issueRefund(
  row: PaymentRow,
  amountCents: number,
  reason: string,
  actor: { userId: string; name: string } | null,
): Promise<RefundRow> {
  const remaining = refundableCents(row);
  if (remaining === 0) throw new HttpError(409, "not_refundable", "Only a paid deposit with money left on it can be refunded.");
  if (amountCents > remaining) {
    const message = `At most ${formatCentsExact(remaining, row.currency)} can be refunded on this payment.`;
    throw new HttpError(422, "validation_failed", message, { amountCents: [message] });
  }
  if (row.checkoutSessionId.startsWith(DEMO_SESSION_PREFIX)) {
    throw new HttpError(
      422,
      "refund_refused",
      "This deposit is demo history written straight into the ledger; the payment provider has never seen it. Pay a deposit from a customer's page to try a refund.",
    );
  }
  let r: Stripe.Refund;
  try {
    r = await stripe().refunds.create(
      { payment_intent: row.paymentIntentId ?? undefined, amount: amountCents, metadata: { reason, paymentId: row.id } },
      { idempotencyKey: `refund-${row.id}-from-${row.refundedCents}-${amountCents}` },
    );
  } catch (err) {
    if (err instanceof Stripe.errors.StripeIdempotencyError) {
      throw new HttpError(409, "refund_in_progress", "Another refund of this payment was just made. Reload to see it before refunding again.");
    }
    if (err instanceof Stripe.errors.StripeInvalidRequestError || err instanceof Stripe.errors.StripeCardError) {
      throw new HttpError(422, "refund_refused", `The payment provider refused the refund: ${err.message}`);
    }
    throw providerError(err);
  }

  const saved = await transaction(async (tx) => {
    const [locked] = await tx
      .select()
      .from(payment)
      .where(and(eq(payment.id, row.id), eq(payment.companyId, row.companyId)))
      .limit(1)
      .for("update");
    if (!locked) throw notFound("Payment");
    const inserted = await tx.insert(refund).ignore().values({
      id: crypto.randomUUID(),
      companyId: row.companyId,
      paymentId: row.id,
      dealId: row.dealId,
      stripeRefundId: r.id,
      amountCents: r.amount,
      status: r.status ?? "pending",
      reason,
      requestedByUserId: actor?.userId ?? null,
    });
    if (inserted[0].affectedRows === 1) {
      await recordEvent(tx, {
        companyId: row.companyId,
        dealId: row.dealId,
        kind: "deposit.refunded",
        summary: `${actor ? actor.name : "Kilowright"} refunded ${formatCentsExact(r.amount, row.currency)} of the deposit: ${reason}`.slice(0, 500),
        actorUserId: actor?.userId ?? null,
        data: { paymentId: row.id, stripeRefundId: r.id, amountCents: r.amount },
      });
    } else if (actor) {
      // The webhook recorded it first; keep who asked for it.
      await tx
        .update(refund)
        .set({ requestedByUserId: actor.userId })
        .where(and(eq(refund.stripeRefundId, r.id), eq(refund.companyId, row.companyId)));
    }
    await recomputeRefunded(tx, row.id, row.companyId);
    const [rec] = await tx.select().from(refund).where(and(eq(refund.stripeRefundId, r.id), eq(refund.companyId, row.companyId))).limit(1);
    // Queued whoever recorded the refund first (this request or the provider's webhook); the key keeps it to one message.
    const mailId = await queueMail(tx, { ...(await refundNoticeMail(tx, rec)), kind: "refund-notice", idempotencyKey: `refund-notice-${rec.stripeRefundId}` });
    return { rec, mailId };
  });
  await sendQueuedNow([saved.mailId]);
  return saved.rec;
}

/** An office member refunds all or part of a payment, with a reason the customer sees. */
export async function refundPayment(member: Member, paymentId: string, input: { amountCents: number; reason: string }): Promise<RefundRow> {
  if (!can(member.role, "payments:refund")) throw forbidden("refunding deposits");
  const row = await getPaymentOrThrow(member, paymentId);
  return issueRefund(row, input.amountCents, input.reason, { userId: member.userId, name: member.name });
}

/**
 * A cancelled agreement (right to cancel): refunds what is left of every paid deposit of the
 * deal through the SDK. Tries every payment, then throws one error naming those that failed.
 */
export async function refundOnCancellation(companyId: string, dealId: string, reason: string): Promise<void> {
  const failures: string[] = [];
  // First close any checkout still open, so nothing new can be paid on this deal.
  const open = await db()
    .select()
    .from(payment)
    .where(and(eq(payment.companyId, companyId), eq(payment.dealId, dealId), inArray(payment.status, [...UNSETTLED_STATUSES])));
  for (const row of open) {
    try {
      const s = await stripe().checkout.sessions.retrieve(row.checkoutSessionId);
      if (s.status === "open") await stripe().checkout.sessions.expire(row.checkoutSessionId);
    } catch (err) {
      // A session paid meanwhile is refunded when its payment is booked (bookPayment sees the cancellation).
      if (!(err instanceof Stripe.errors.StripeInvalidRequestError)) failures.push(`${row.id}: ${err instanceof Error ? err.message : String(err)}`);
    }
  }
  const rows = await db()
    .select()
    .from(payment)
    .where(and(eq(payment.companyId, companyId), eq(payment.dealId, dealId), inArray(payment.status, [...REFUNDABLE_STATUSES])));
  for (const row of rows) {
    const remaining = refundableCents(row);
    if (remaining === 0) continue;
    try {
      await issueRefund(row, remaining, reason.slice(0, 500), null);
    } catch (err) {
      failures.push(`${row.id}: ${err instanceof Error ? err.message : String(err)}`);
    }
  }
  if (failures.length) throw new Error(`Deposit refund on cancellation failed for ${failures.length} payment(s): ${failures.join("; ")}`);
}

async function refundNoticeMail(tx: Tx, r: RefundRow) {
  const c = await receiptContext(tx, r.paymentId);
  const paid = c.p.paidCents ?? 0;
  return {
    companyId: c.p.companyId,
    to: c.to,
    subject: `Refund of ${formatCentsExact(r.amountCents, c.p.currency)} — ${c.companyName}`,
    react: createElement(RefundIssuedEmail, {
      customerName: c.name,
      companyName: c.companyName,
      amount: formatCentsExact(r.amountCents, c.p.currency),
      paid: formatCentsExact(paid, c.p.currency),
      remaining: formatCentsExact(Math.max(0, paid - c.p.refundedCents), c.p.currency),
      reason: r.reason,
      proposalLabel: proposalLabelOf(c.prop),
      reference: r.stripeRefundId,
      repName: c.snapshot.rep.name,
      repEmail: c.snapshot.rep.email,
    }),
  };
}
