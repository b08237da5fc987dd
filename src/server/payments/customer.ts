import "server-only";
import { and, asc, desc, eq } from "drizzle-orm";
import { payment, proposal, type PaymentStatus } from "@/db/schema";
import { env } from "@/env";
import { formatCentsExact, formatDate } from "@/lib/format";
import { db, transaction, type Tx } from "@/server/db";
import { HttpError, notFound } from "@/server/errors";
import { refusal } from "@/server/homeowner-refusals";
import { stripe } from "@/server/stripe";
import { recordEvent } from "@/server/timeline";
import { getCompanySettings } from "@/server/company-settings";
import { hashToken } from "@/server/tokens";
import { BOOKED_STATUSES, DEPOSIT_CURRENCY, depositCentsOf, derivedUuid, HOUR_MS, proposalLabelOf, type ProposalRow, providerError, SESSION_LIFETIME_MS, UNSETTLED_STATUSES } from "./common";

// ── Customer side ──────────────────────────────────────────────────────────────────────────

async function lockProposalByToken(tx: Tx, token: string): Promise<ProposalRow | null> {
  const [row] = await tx.select().from(proposal).where(eq(proposal.tokenHash, hashToken(token))).limit(1).for("update");
  return row ?? null;
}

function payable(p: ProposalRow): void {
  if (p.status === "cancelled" || p.cancelledAt) throw refusal(p.locale, 409, "proposal_cancelled", "depositCancelled");
  if (p.status !== "signed") throw refusal(p.locale, 409, "not_signed", "depositNotSigned");
}

/**
 * The customer's Pay button: a Checkout Session for the deposit of a signed proposal. Reuses
 * the session still open (one per proposal at a time: the proposal row is locked while we
 * decide, the session is created with an idempotency key per proposal version and attempt,
 * and checkout_session_id is unique), so pressing Pay twice opens one session.
 */
export async function startDepositCheckout(token: string): Promise<{ url: string; paymentId: string; reused: boolean }> {
  const { APP_URL } = env();
  return transaction(async (tx) => {
    const p = await lockProposalByToken(tx, token);
    if (!p) throw notFound("Proposal");
    payable(p);
    const amountCents = depositCentsOf(p);
    if (!amountCents) throw refusal(p.locale, 409, "no_deposit", "depositNone");

    const rows = await tx
      .select()
      .from(payment)
      .where(and(eq(payment.companyId, p.companyId), eq(payment.proposalId, p.id)))
      .orderBy(asc(payment.createdAt));
    if (rows.some((r) => BOOKED_STATUSES.includes(r.status))) throw refusal(p.locale, 409, "already_paid", "depositPaid");

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
  p: Pick<ProposalRow, "id" | "companyId" | "status" | "chosenPosition" | "locale"> & { snapshot: ProposalRow["snapshot"] },
): Promise<CustomerDeposit | null> {
  if (p.status !== "signed" && p.status !== "cancelled") return null;
  const amountCents = depositCentsOf(p);
  if (!amountCents) return null;
  const [rows, { timeZone }] = await Promise.all([
    db().select().from(payment).where(and(eq(payment.companyId, p.companyId), eq(payment.proposalId, p.id))).orderBy(desc(payment.createdAt)),
    getCompanySettings(p.companyId),
  ]);
  const row = rows.find((r) => BOOKED_STATUSES.includes(r.status)) ?? rows[0] ?? null;
  const cancelled = p.status === "cancelled";
  if (cancelled && (!row || !BOOKED_STATUSES.includes(row.status))) return null;
  const locale = p.locale; // the homeowner's language for this proposal: money and the day paid as they read them
  return {
    status: row ? row.status : "due",
    amountCents,
    amountText: formatCentsExact(amountCents, "usd", locale),
    paidCents: row?.paidCents ?? null,
    paidText: row?.paidCents != null ? formatCentsExact(row.paidCents, row.currency, locale) : null,
    paidAt: row?.paidAt?.toISOString() ?? null,
    paidOnText: row?.paidAt ? formatDate(row.paidAt, timeZone, locale) : null,
    refundedCents: row?.refundedCents ?? 0,
    refundedText: formatCentsExact(row?.refundedCents ?? 0, "usd", locale),
    failureMessage: row?.status === "failed" ? (row.failureMessage ?? "The payment did not go through.") : null,
    canPay: !cancelled && (!row || !BOOKED_STATUSES.includes(row.status)),
  };
}
