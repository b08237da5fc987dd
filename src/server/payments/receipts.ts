import "server-only";
import { createElement } from "react";
import { and, eq } from "drizzle-orm";
import { company, deal, household, payment, proposal } from "@/db/schema";
import { formatCalendarDate, formatCentsExact, formatDate } from "@/lib/format";
import { getCompanySettings } from "@/server/company-settings";
import DepositReceiptEmail from "@emails/deposit-receipt";
import { db, transaction, type Db, type Tx } from "@/server/db";
import { HttpError, notFound } from "@/server/errors";
import { MailSendError, sendEmail } from "@/server/mail";
import type { Member } from "@/server/session";
import { recordEvent } from "@/server/timeline";
import { BOOKED_STATUSES, chosenOffer, proposalLabelOf } from "./common";
import { getPaymentOrThrow } from "./office";

// ── Office: receipts ─────────────────────────────────────────────────────────────────────

export async function receiptContext(q: Db | Tx, paymentId: string) {
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
  const snapshot = row.prop.snapshot;
  return { ...row, snapshot, to: row.prop.signerEmail ?? row.prop.sentToEmail, name: row.prop.signerName ?? row.customerName ?? row.householdName };
}

/** The receipt of a paid deposit to the customer (read with `q`: the booking's own transaction, or the pool). */
export async function depositReceiptMail(q: Db | Tx, paymentId: string) {
  const c = await receiptContext(q, paymentId);
  if (!BOOKED_STATUSES.includes(c.p.status) || c.p.status === "flagged" || c.p.paidCents == null) {
    throw new HttpError(409, "not_paid", "Only a booked deposit has a receipt.");
  }
  const offer = chosenOffer(c.prop);
  const { timeZone } = await getCompanySettings(c.p.companyId);
  return {
    companyId: c.p.companyId,
    to: c.to,
    subject: `Deposit received: ${formatCentsExact(c.p.paidCents, c.p.currency)} — ${c.companyName}`,
    react: createElement(DepositReceiptEmail, {
      customerName: c.name,
      companyName: c.companyName,
      amount: formatCentsExact(c.p.paidCents, c.p.currency),
      paidOn: formatDate(c.p.paidAt ?? new Date(), timeZone),
      proposalLabel: proposalLabelOf(c.prop),
      offerName: offer?.name ?? "your chosen offer",
      contractPrice: formatCentsExact(offer?.figures?.summary?.contractCents ?? null),
      reference: c.p.chargeId ?? c.p.paymentIntentId ?? c.p.checkoutSessionId,
      cancelUntil: c.prop.inHomeSale && c.prop.cancelDeadline && !c.prop.cancelledAt ? formatCalendarDate(c.prop.cancelDeadline) : null,
      repName: c.prop.snapshot.rep.name,
      repEmail: c.prop.snapshot.rep.email,
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
  await transaction(async (tx) => {
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
