import "server-only";
// Deposits: the ledger of Checkout Sessions, payments and refunds (tables payment, refund).
// Money moves only through the Stripe SDK (src/server/stripe.ts); the ledger changes only in
// transactions, from the customer's Pay button, the signed webhooks (src/server/webhooks.ts)
// and the office's refunds. Amounts are integer cents.
import { createHash } from "node:crypto";
import { createElement } from "react";
import { and, asc, desc, eq, inArray } from "drizzle-orm";
import Stripe from "stripe";
import { company, deal, household, payment, paymentAlert, proposal, refund, user, type PaymentStatus } from "@/db/schema";
import { env } from "@/env";
import { formatCentsExact, formatDate } from "@/lib/format";
import { proposalLabel as shortProposalLabel } from "@/lib/proposal-snapshot";
import { can } from "@/lib/permissions";
import type { ProposalSnapshot } from "@/lib/schemas/proposal";
import DepositReceiptEmail from "@emails/deposit-receipt";
import RefundIssuedEmail from "@emails/refund-issued";
import { db, type Db, type Tx } from "@/server/db";
import { jsonValue } from "@/server/designs";
import { getDealOrThrow } from "@/server/deals";
import { forbidden, HttpError, notFound } from "@/server/errors";
import { createJobForDeal } from "@/server/jobs";
import { MailSendError, sendEmail } from "@/server/mail";
import { queueMail, sendQueuedNow } from "@/server/outbound-mail";
import type { Member } from "@/server/session";
import { autoMoveStage } from "@/server/stages";
import { stripe } from "@/server/stripe";
import { recordEvent } from "@/server/timeline";
import { hashToken } from "@/server/tokens";

export type PaymentRow = typeof payment.$inferSelect;
export type PaymentAlertRow = typeof paymentAlert.$inferSelect;
export type RefundRow = typeof refund.$inferSelect;
type ProposalRow = typeof proposal.$inferSelect;

/** The currency deposits are asked in (Stripe's lower-case ISO code). */
export const DEPOSIT_CURRENCY = "usd";
/** Statuses of a payment whose money reached the provider (booked or flagged). */
export const BOOKED_STATUSES: readonly PaymentStatus[] = ["paid", "partially_refunded", "refunded", "flagged"];
/** Statuses from which part of the money can still be returned. */
const REFUNDABLE_STATUSES: readonly PaymentStatus[] = ["paid", "partially_refunded", "flagged"];
/** Statuses of a session the customer may still pay. */
const UNSETTLED_STATUSES: readonly PaymentStatus[] = ["open", "failed"];
/** Provider refund states that count as money returned (or on its way). */
const COUNTED_REFUND_STATES = ["succeeded", "pending"];
const CANCELLED_BEFORE_PAYMENT_REASON = "The agreement was cancelled before this payment arrived";
/** Ledger rows the demo seed writes without a provider record (scripts/lib/seed/payments.ts). */
export const DEMO_SESSION_PREFIX = "cs_test_demo";

const HOUR_MS = 3_600_000;
/**
 * A Checkout Session may live 30 minutes to 24 hours (Stripe's `expires_at` limits). Ours ends
 * 23 hours after the start of the current hour, so a retried create within the same hour sends
 * the same body and the idempotency key returns the same session.
 */
const SESSION_LIFETIME_MS = 23 * HOUR_MS;


export const proposalLabelOf = (p: { number: number; version: number }): string => shortProposalLabel(p.number, p.version);

function snapshotOf(p: { snapshot: unknown }): ProposalSnapshot {
  return jsonValue(p.snapshot) as ProposalSnapshot;
}

function chosenOffer(p: { snapshot: unknown; chosenPosition: number | null }) {
  if (p.chosenPosition == null) return null;
  const offers = snapshotOf(p).offers;
  return Array.isArray(offers) ? (offers.find((o) => o.position === p.chosenPosition) ?? null) : null;
}

/** The deposit of a signed proposal: the chosen offer's `depositCents` in the snapshot (company policy at sending). */
export function depositCentsOf(p: { snapshot: unknown; chosenPosition: number | null }): number | null {
  const cents = chosenOffer(p)?.depositCents;
  return typeof cents === "number" && Number.isInteger(cents) && cents > 0 ? cents : null;
}

/** A UUID derived from a text, so a retried checkout writes the same payment id (and sends the same metadata). */
function derivedUuid(text: string): string {
  const h = createHash("sha256").update(text).digest("hex");
  const variant = ((parseInt(h[16], 16) & 0x3) | 0x8).toString(16);
  return `${h.slice(0, 8)}-${h.slice(8, 12)}-5${h.slice(13, 16)}-${variant}${h.slice(17, 20)}-${h.slice(20, 32)}`;
}

/** Stripe's errors as the person should read them; anything else is rethrown as it is. */
function providerError(err: unknown): unknown {
  if (err instanceof Stripe.errors.StripeConnectionError || err instanceof Stripe.errors.StripeAPIError || err instanceof Stripe.errors.StripeRateLimitError) {
    return new HttpError(503, "payments_unavailable", "The payment service cannot be reached right now. Nothing was charged; try again in a minute.");
  }
  return err;
}

const idOf = (v: string | { id: string } | null | undefined): string | null => (v == null ? null : typeof v === "string" ? v : v.id);

// ── Customer side ──────────────────────────────────────────────────────────────────────────

async function lockProposalByToken(tx: Tx, token: string): Promise<ProposalRow | null> {
  const [row] = await tx.select().from(proposal).where(eq(proposal.tokenHash, hashToken(token))).limit(1).for("update");
  return row ?? null;
}

function payable(p: ProposalRow): void {
  if (p.status === "cancelled" || p.cancelledAt) throw new HttpError(409, "proposal_cancelled", "This agreement was cancelled, so no deposit is due.");
  if (p.status !== "signed") throw new HttpError(409, "not_signed", "The deposit can be paid once the proposal is signed.");
}

/**
 * The customer's Pay button: a Checkout Session for the deposit of a signed proposal. Reuses
 * the session still open (one per proposal at a time: the proposal row is locked while we
 * decide, the session is created with an idempotency key per proposal version and attempt,
 * and checkout_session_id is unique), so pressing Pay twice opens one session.
 */
export async function startDepositCheckout(token: string): Promise<{ url: string; paymentId: string; reused: boolean }> {
  const { APP_URL } = env();
  return db().transaction(async (tx) => {
    const p = await lockProposalByToken(tx, token);
    if (!p) throw notFound("Proposal");
    payable(p);
    const amountCents = depositCentsOf(p);
    if (!amountCents) throw new HttpError(409, "no_deposit", "This proposal asks for no deposit.");

    const rows = await tx
      .select()
      .from(payment)
      .where(and(eq(payment.companyId, p.companyId), eq(payment.proposalId, p.id)))
      .orderBy(asc(payment.createdAt));
    if (rows.some((r) => BOOKED_STATUSES.includes(r.status))) throw new HttpError(409, "already_paid", "The deposit for this proposal is already paid.");

    for (const r of [...rows].reverse().filter((x) => UNSETTLED_STATUSES.includes(x.status))) {
      const s = await stripe().checkout.sessions.retrieve(r.checkoutSessionId);
      if (s.status === "open" && s.url) return { url: s.url, paymentId: r.id, reused: true };
      if (s.status === "complete") {
        throw new HttpError(409, "payment_confirming", "Your payment went through; we are confirming it. This page updates by itself.");
      }
      if (s.status === "expired") await tx.update(payment).set({ status: "expired" }).where(and(eq(payment.id, r.id), eq(payment.companyId, p.companyId)));
    }

    const attempt = rows.length + 1;
    const paymentId = derivedUuid(`deposit:${p.id}:v${p.version}:${attempt}`);
    const metadata = { dealId: p.dealId, proposalId: p.id, companyId: p.companyId, paymentId };
    const pageUrl = `${APP_URL}/p/${encodeURIComponent(token)}`;
    const expiresAt = Math.floor(Date.now() / HOUR_MS) * HOUR_MS + SESSION_LIFETIME_MS;
    const session = await stripe().checkout.sessions.create(
      {
        mode: "payment",
        line_items: [
          {
            quantity: 1,
            price_data: { currency: DEPOSIT_CURRENCY, unit_amount: amountCents, product_data: { name: `Deposit — proposal ${proposalLabelOf(p)}` } },
          },
        ],
        customer_email: p.signerEmail ?? p.sentToEmail,
        metadata,
        payment_intent_data: { metadata },
        success_url: `${pageUrl}?deposit=returned`,
        cancel_url: `${pageUrl}?deposit=cancelled`,
        expires_at: Math.floor(expiresAt / 1000),
      },
      // The first session of a version keeps the plain key; later ones (after expiry) add the attempt.
      { idempotencyKey: attempt === 1 ? `deposit-${p.id}-v${p.version}` : `deposit-${p.id}-v${p.version}-a${attempt}` },
    );
    if (!session.url) throw new Error(`Checkout Session ${session.id} came back without a url`);
    await tx.insert(payment).ignore().values({
      id: paymentId,
      companyId: p.companyId,
      dealId: p.dealId,
      proposalId: p.id,
      checkoutSessionId: session.id,
      amountCents,
      currency: DEPOSIT_CURRENCY,
      status: "open",
    });
    await recordEvent(tx, {
      companyId: p.companyId,
      dealId: p.dealId,
      kind: "deposit.checkout",
      summary: `Customer opened the deposit checkout (${formatCentsExact(amountCents)}, proposal ${proposalLabelOf(p)})`,
      actorUserId: null,
      data: { paymentId, checkoutSessionId: session.id, attempt },
    });
    return { url: session.url, paymentId, reused: false };
  }).catch((err: unknown) => {
    throw providerError(err);
  });
}

export type CustomerDepositStatus = "due" | PaymentStatus;
export type CustomerDeposit = {
  status: CustomerDepositStatus;
  amountCents: number;
  amountText: string;
  paidCents: number | null;
  paidText: string | null;
  paidAt: string | null;
  paidOnText: string | null;
  refundedCents: number;
  refundedText: string;
  failureMessage: string | null;
  /** False once the agreement is cancelled (only the money's state is then shown). */
  canPay: boolean;
};

/** The deposit as the customer's page shows it, or null when the proposal asks for none (or is not signed). */
export async function getDepositForCustomer(token: string): Promise<CustomerDeposit | null> {
  const [p] = await db().select().from(proposal).where(eq(proposal.tokenHash, hashToken(token))).limit(1);
  return p ? depositForProposal(p) : null;
}

/** The same for a proposal already looked up by its token (the customer's page). */
export async function depositForProposal(
  p: Pick<ProposalRow, "id" | "companyId" | "status" | "chosenPosition"> & { snapshot: unknown },
): Promise<CustomerDeposit | null> {
  if (p.status !== "signed" && p.status !== "cancelled") return null;
  const amountCents = depositCentsOf(p);
  if (!amountCents) return null;
  const rows = await db()
    .select()
    .from(payment)
    .where(and(eq(payment.companyId, p.companyId), eq(payment.proposalId, p.id)))
    .orderBy(desc(payment.createdAt));
  const row = rows.find((r) => BOOKED_STATUSES.includes(r.status)) ?? rows[0] ?? null;
  const cancelled = p.status === "cancelled";
  if (cancelled && (!row || !BOOKED_STATUSES.includes(row.status))) return null;
  return {
    status: row ? row.status : "due",
    amountCents,
    amountText: formatCentsExact(amountCents),
    paidCents: row?.paidCents ?? null,
    paidText: row?.paidCents != null ? formatCentsExact(row.paidCents, row.currency) : null,
    paidAt: row?.paidAt?.toISOString() ?? null,
    paidOnText: row?.paidAt ? formatDate(row.paidAt) : null,
    refundedCents: row?.refundedCents ?? 0,
    refundedText: formatCentsExact(row?.refundedCents ?? 0),
    failureMessage: row?.status === "failed" ? (row.failureMessage ?? "The payment did not go through.") : null,
    canPay: !cancelled && (!row || !BOOKED_STATUSES.includes(row.status)),
  };
}

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

/** Sets refundedCents and the status from the refund rows (called with the payment row locked). */
async function recomputeRefunded(tx: Tx, paymentId: string, companyId: string): Promise<void> {
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

// ── Office: reading the ledger, refunds, receipts ──────────────────────────────────────────

/** A payment of the member's company (reps: of their own deals only); another company's is not found. */
export async function getPaymentOrThrow(member: Member, paymentId: string): Promise<PaymentRow> {
  const [row] = await db()
    .select()
    .from(payment)
    .where(and(eq(payment.id, paymentId), eq(payment.companyId, member.companyId)))
    .limit(1);
  if (!row) throw notFound("Payment");
  await getDealOrThrow(member, row.dealId).catch((err: unknown) => {
    throw err instanceof HttpError && err.status === 404 ? notFound("Payment") : err;
  });
  return row;
}

export async function getRefundOrThrow(member: Member, refundId: string): Promise<RefundRow> {
  const [row] = await db()
    .select()
    .from(refund)
    .where(and(eq(refund.id, refundId), eq(refund.companyId, member.companyId)))
    .limit(1);
  if (!row) throw notFound("Refund");
  await getDealOrThrow(member, row.dealId).catch((err: unknown) => {
    throw err instanceof HttpError && err.status === 404 ? notFound("Refund") : err;
  });
  return row;
}

export type LedgerRefund = RefundRow & { requestedByName: string | null };
export type LedgerPayment = PaymentRow & { proposalNumber: number; proposalVersion: number; refunds: LedgerRefund[] };

/** The deal's payments, newest first, each with its refunds (the Money tab). */
export async function listDealPayments(member: Member, dealId: string): Promise<LedgerPayment[]> {
  await getDealOrThrow(member, dealId);
  const rows = await db()
    .select({ p: payment, number: proposal.number, version: proposal.version })
    .from(payment)
    .innerJoin(proposal, and(eq(proposal.id, payment.proposalId), eq(proposal.companyId, payment.companyId)))
    .where(and(eq(payment.companyId, member.companyId), eq(payment.dealId, dealId)))
    .orderBy(desc(payment.createdAt));
  const refunds = rows.length
    ? await db()
        .select({ r: refund, requestedByName: user.name })
        .from(refund)
        .leftJoin(user, eq(user.id, refund.requestedByUserId))
        .where(and(eq(refund.companyId, member.companyId), eq(refund.dealId, dealId)))
        .orderBy(asc(refund.createdAt))
    : [];
  return rows.map(({ p, number, version }) => ({
    ...p,
    proposalNumber: number,
    proposalVersion: version,
    refunds: refunds.filter(({ r }) => r.paymentId === p.id).map(({ r, requestedByName }) => ({ ...r, requestedByName })),
  }));
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
async function issueRefund(
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

  const saved = await db().transaction(async (tx) => {
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

async function receiptContext(q: Db | Tx, paymentId: string) {
  const [row] = await q
    .select({ p: payment, prop: proposal, companyName: company.name, customerName: household.contactName, householdName: household.name })
    .from(payment)
    .innerJoin(proposal, and(eq(proposal.id, payment.proposalId), eq(proposal.companyId, payment.companyId)))
    .innerJoin(company, eq(company.id, payment.companyId))
    .innerJoin(deal, and(eq(deal.id, payment.dealId), eq(deal.companyId, payment.companyId)))
    .innerJoin(household, and(eq(household.id, deal.householdId), eq(household.companyId, payment.companyId)))
    .where(eq(payment.id, paymentId))
    .limit(1);
  if (!row) throw notFound("Payment");
  const snapshot = snapshotOf(row.prop);
  return { ...row, snapshot, to: row.prop.signerEmail ?? row.prop.sentToEmail, name: row.prop.signerName ?? row.customerName ?? row.householdName };
}

/** The receipt of a paid deposit to the customer (read with `q`: the booking's own transaction, or the pool). */
async function depositReceiptMail(q: Db | Tx, paymentId: string) {
  const c = await receiptContext(q, paymentId);
  if (!BOOKED_STATUSES.includes(c.p.status) || c.p.status === "flagged" || c.p.paidCents == null) {
    throw new HttpError(409, "not_paid", "Only a booked deposit has a receipt.");
  }
  const offer = chosenOffer(c.prop);
  return {
    companyId: c.p.companyId,
    to: c.to,
    subject: `Deposit received: ${formatCentsExact(c.p.paidCents, c.p.currency)} — ${c.companyName}`,
    react: createElement(DepositReceiptEmail, {
      customerName: c.name,
      companyName: c.companyName,
      amount: formatCentsExact(c.p.paidCents, c.p.currency),
      paidOn: c.p.paidAt ? formatDate(c.p.paidAt) : formatDate(new Date()),
      proposalLabel: proposalLabelOf(c.prop),
      offerName: offer?.name ?? "your chosen offer",
      contractPrice: formatCentsExact(offer?.figures?.summary?.contractCents ?? null),
      reference: c.p.chargeId ?? c.p.paymentIntentId ?? c.p.checkoutSessionId,
      cancelUntil: c.prop.inHomeSale && c.prop.cancelDeadline && !c.prop.cancelledAt ? formatDate(new Date(`${c.prop.cancelDeadline}T12:00:00Z`)) : null,
      repName: snapshotOf(c.prop).rep.name,
      repEmail: snapshotOf(c.prop).rep.email,
    }),
  };
}

/** The office's re-send: sent at once, so the office sees a failure (the booking's own receipt goes through the outbox). */
export async function sendDepositReceipt(paymentId: string, idempotencyKey: string): Promise<{ to: string }> {
  const mail = await depositReceiptMail(db(), paymentId);
  await sendEmail({ ...mail, idempotencyKey });
  return { to: mail.to };
}

/** The office's "Re-send receipt": a new send each time (its own idempotency key), logged on the Timeline. */
export async function resendDepositReceipt(member: Member, paymentId: string): Promise<{ to: string }> {
  const row = await getPaymentOrThrow(member, paymentId);
  let sent: { to: string };
  try {
    sent = await sendDepositReceipt(row.id, `deposit-receipt-resend-${row.id}-${Date.now()}`);
  } catch (err) {
    if (err instanceof MailSendError) throw new HttpError(502, "mail_failed", `The receipt could not be sent: ${err.message}`);
    throw err;
  }
  await db().transaction(async (tx) => {
    await recordEvent(tx, {
      companyId: row.companyId,
      dealId: row.dealId,
      kind: "deposit.receipt_resent",
      summary: `${member.name} re-sent the deposit receipt to ${sent.to}`,
      actorUserId: member.userId,
      data: { paymentId: row.id },
    });
  });
  return sent;
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

// ── Reconciliation: the ledger against the provider's own lists ─────────────────────────────

/** Money the provider reported that the ledger could not place (newest first), for the office. */
export async function listPaymentAlerts(member: Member): Promise<PaymentAlertRow[]> {
  if (!can(member.role, "payments:reconcile")) throw forbidden("reading payment alerts");
  return db().select().from(paymentAlert).where(eq(paymentAlert.companyId, member.companyId)).orderBy(desc(paymentAlert.createdAt)).limit(200);
}

/** One alert of the member's company; another company's is not found. */
export async function getPaymentAlertOrThrow(member: Member, id: string): Promise<PaymentAlertRow> {
  if (!can(member.role, "payments:reconcile")) throw forbidden("reading payment alerts");
  const [row] = await db()
    .select()
    .from(paymentAlert)
    .where(and(eq(paymentAlert.id, id), eq(paymentAlert.companyId, member.companyId)))
    .limit(1);
  if (!row) throw notFound("Payment alert");
  return row;
}

export type ReconciliationDifference = {
  kind: "missing_in_ledger" | "missing_at_provider" | "amount" | "state";
  object: "payment" | "refund";
  /** Our payment or refund id, when the ledger has the row. */
  ledgerId: string | null;
  /** The provider's id (cs_…, re_…). */
  providerId: string;
  dealId: string | null;
  detail: string;
};

export type Reconciliation = {
  checkedAt: Date;
  counts: { ledgerPayments: number; providerSessions: number; ledgerRefunds: number; providerRefunds: number };
  differences: ReconciliationDifference[];
  /** Demo ledger rows written by the seed with no provider record (not compared). */
  demoRowsSkipped: number;
};

/** What a session's state means for the ledger: money taken, or not (yet). */
function providerPaymentState(s: Stripe.Checkout.Session): "paid" | "open" | "expired" | "complete_unpaid" {
  if (s.status === "complete") return s.payment_status === "paid" ? "paid" : "complete_unpaid";
  return s.status === "expired" ? "expired" : "open";
}

/**
 * Compares the company's ledger with the provider's Checkout Sessions and refunds (every page
 * of both lists, through the SDK's auto-pagination). A session belongs to the company by the
 * metadata we set on it; a refund by its PaymentIntent's session.
 */
export async function reconcileLedger(member: Member): Promise<Reconciliation> {
  if (!can(member.role, "payments:reconcile")) throw forbidden("reconciling payments");
  const companyId = member.companyId;
  const [ledgerPayments, ledgerRefunds] = await Promise.all([
    db().select().from(payment).where(eq(payment.companyId, companyId)),
    db().select().from(refund).where(eq(refund.companyId, companyId)),
  ]);
  const demoPaymentIds = new Set(ledgerPayments.filter((p) => p.checkoutSessionId.startsWith(DEMO_SESSION_PREFIX)).map((p) => p.id));
  const payments = ledgerPayments.filter((p) => !demoPaymentIds.has(p.id));
  const refunds = ledgerRefunds.filter((r) => !demoPaymentIds.has(r.paymentId));

  const sessions: Stripe.Checkout.Session[] = [];
  try {
    for await (const s of stripe().checkout.sessions.list({ limit: 100 })) if (s.metadata?.companyId === companyId) sessions.push(s);
  } catch (err) {
    throw providerError(err);
  }
  const sessionByPi = new Map<string, Stripe.Checkout.Session>();
  for (const s of sessions) {
    const pi = idOf(s.payment_intent);
    if (pi) sessionByPi.set(pi, s);
  }
  const providerRefunds: Stripe.Refund[] = [];
  try {
    for await (const r of stripe().refunds.list({ limit: 100 })) {
      const pi = idOf(r.payment_intent);
      if (pi && sessionByPi.has(pi)) providerRefunds.push(r);
    }
  } catch (err) {
    throw providerError(err);
  }

  const differences: ReconciliationDifference[] = [];
  const paymentBySession = new Map(payments.map((p) => [p.checkoutSessionId, p]));
  const refundedAtProvider = new Map<string, number>();
  for (const r of providerRefunds) {
    if (!COUNTED_REFUND_STATES.includes(r.status ?? "")) continue;
    const pi = idOf(r.payment_intent) as string;
    refundedAtProvider.set(pi, (refundedAtProvider.get(pi) ?? 0) + r.amount);
  }

  for (const s of sessions) {
    const row = paymentBySession.get(s.id);
    const state = providerPaymentState(s);
    if (!row) {
      differences.push({
        kind: "missing_in_ledger",
        object: "payment",
        ledgerId: null,
        providerId: s.id,
        dealId: s.metadata?.dealId ?? null,
        detail: `Checkout Session for ${formatCentsExact(s.amount_total, s.currency ?? DEPOSIT_CURRENCY)} (${state.replace("_", " ")}) has no ledger row.`,
      });
      continue;
    }
    const base = { object: "payment" as const, ledgerId: row.id, providerId: s.id, dealId: row.dealId };
    if (s.amount_total !== row.amountCents || (s.currency ?? "") !== row.currency) {
      differences.push({
        ...base,
        kind: "amount",
        detail: `Asked ${formatCentsExact(s.amount_total, s.currency ?? row.currency)} at the provider, ${formatCentsExact(row.amountCents, row.currency)} in the ledger.`,
      });
    }
    const booked = BOOKED_STATUSES.includes(row.status);
    if (state === "paid" && !booked) {
      differences.push({ ...base, kind: "state", detail: `Paid at the provider, ${row.status} in the ledger (a webhook has not landed yet or was missed).` });
    } else if (state !== "paid" && booked) {
      differences.push({ ...base, kind: "state", detail: `${row.status} in the ledger, ${state.replace("_", " ")} at the provider.` });
    } else if (state === "expired" && row.status !== "expired") {
      differences.push({ ...base, kind: "state", detail: `Expired at the provider, ${row.status} in the ledger.` });
    } else if (state === "open" && row.status === "expired") {
      differences.push({ ...base, kind: "state", detail: "Still open at the provider, expired in the ledger." });
    }
    const pi = idOf(s.payment_intent);
    if (booked && pi) {
      const providerRefunded = refundedAtProvider.get(pi) ?? 0;
      if (providerRefunded !== row.refundedCents) {
        differences.push({
          ...base,
          kind: "amount",
          detail: `Refunded ${formatCentsExact(providerRefunded, row.currency)} at the provider, ${formatCentsExact(row.refundedCents, row.currency)} in the ledger.`,
        });
      }
    }
  }
  const sessionIds = new Set(sessions.map((s) => s.id));
  for (const row of payments) {
    if (sessionIds.has(row.checkoutSessionId)) continue;
    differences.push({
      kind: "missing_at_provider",
      object: "payment",
      ledgerId: row.id,
      providerId: row.checkoutSessionId,
      dealId: row.dealId,
      detail: `Ledger payment of ${formatCentsExact(row.amountCents, row.currency)} (${row.status}) has no Checkout Session at the provider.`,
    });
  }

  const refundByStripeId = new Map(refunds.map((r) => [r.stripeRefundId, r]));
  const paymentById = new Map(payments.map((p) => [p.id, p]));
  for (const r of providerRefunds) {
    const row = refundByStripeId.get(r.id);
    const s = sessionByPi.get(idOf(r.payment_intent) as string);
    if (!row) {
      differences.push({
        kind: "missing_in_ledger",
        object: "refund",
        ledgerId: null,
        providerId: r.id,
        dealId: s?.metadata?.dealId ?? null,
        detail: `Refund of ${formatCentsExact(r.amount, r.currency)} (${r.status}) is not in the ledger.`,
      });
      continue;
    }
    const base = { object: "refund" as const, ledgerId: row.id, providerId: r.id, dealId: row.dealId };
    if (r.amount !== row.amountCents) {
      differences.push({ ...base, kind: "amount", detail: `Refunded ${formatCentsExact(r.amount, r.currency)} at the provider, ${formatCentsExact(row.amountCents)} in the ledger.` });
    }
    if ((r.status ?? "") !== row.status) differences.push({ ...base, kind: "state", detail: `${r.status} at the provider, ${row.status} in the ledger.` });
  }
  const providerRefundIds = new Set(providerRefunds.map((r) => r.id));
  for (const row of refunds) {
    if (providerRefundIds.has(row.stripeRefundId)) continue;
    const p = paymentById.get(row.paymentId);
    differences.push({
      kind: "missing_at_provider",
      object: "refund",
      ledgerId: row.id,
      providerId: row.stripeRefundId,
      dealId: row.dealId,
      detail: `Ledger refund of ${formatCentsExact(row.amountCents, p?.currency)} is not at the provider.`,
    });
  }

  return {
    checkedAt: new Date(),
    counts: { ledgerPayments: payments.length, providerSessions: sessions.length, ledgerRefunds: refunds.length, providerRefunds: providerRefunds.length },
    differences,
    demoRowsSkipped: ledgerPayments.length - payments.length + (ledgerRefunds.length - refunds.length),
  };
}
