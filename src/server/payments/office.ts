import "server-only";
import { and, asc, desc, eq } from "drizzle-orm";
import { payment, proposal, refund, user } from "@/db/schema";
import { companyRowOrThrow, hiddenWithParent } from "@/server/records";
import { db } from "@/server/db";
import { openDeal, openDealOf } from "@/server/deal-scope";
import type { Member } from "@/server/session";
import type { PaymentRow, RefundRow } from "./common";

// ── Office: reading the ledger ──────────────────────────────────────────────────────────

/** A payment of the member's company (reps: of their own deals only); another company's is not found. */
export async function getPaymentOrThrow(member: Member, paymentId: string): Promise<PaymentRow> {
  const row = await companyRowOrThrow(payment, member.companyId, paymentId, "Payment");
  await openDealOf(member, row.dealId, "Payment");
  return row;
}

export async function getRefundOrThrow(member: Member, refundId: string): Promise<RefundRow> {
  const row = await companyRowOrThrow(refund, member.companyId, refundId, "Refund");
  await openDealOf(member, row.dealId, "Refund");
  return row;
}

export type LedgerRefund = RefundRow & { requestedByName: string | null };
export type LedgerPayment = PaymentRow & { proposalNumber: number; proposalVersion: number; refunds: LedgerRefund[] };

/** The deal's payments, newest first, each with its refunds (the Money tab). */
export async function listDealPayments(member: Member, dealId: string): Promise<LedgerPayment[]> {
  await openDeal(member, dealId);
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
