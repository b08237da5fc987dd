import type { Metadata } from "next";
import { NoAccess } from "@/components/no-access";
import { formatCentsExact, formatDateTime } from "@/lib/format";
import { can } from "@/lib/permissions";
import { proposalLabel } from "@/lib/proposal-snapshot";
import { getCompanySettings } from "@/server/company-settings";
import { listDealPayments, refundableCents } from "@/server/payments";
import { getMember } from "@/server/session";
import { MoneyClient, type PaymentView } from "./money-client";

export const metadata: Metadata = { title: "Money" };

export default async function MoneyTab({ params }: { params: Promise<{ id: string }> }) {
  const { id } = await params;
  const member = await getMember();
  if (!member) return null;
  if (!can(member.role, "payments:read")) return <NoAccess section="Money" />;
  const [payments, { timeZone }] = await Promise.all([listDealPayments(member, id), getCompanySettings(member.companyId)]);
  const views: PaymentView[] = payments.map((p) => ({
    id: p.id,
    status: p.status,
    proposalLabel: proposalLabel(p.proposalNumber, p.proposalVersion),
    amountText: formatCentsExact(p.amountCents, p.currency),
    paidText: p.paidCents == null ? null : formatCentsExact(p.paidCents, p.currency),
    refundedText: formatCentsExact(p.refundedCents, p.currency),
    refundableCents: refundableCents(p),
    refundableText: formatCentsExact(refundableCents(p), p.currency),
    paidAtText: p.paidAt ? formatDateTime(p.paidAt, timeZone) : null,
    createdAtText: formatDateTime(p.createdAt, timeZone),
    checkoutSessionId: p.checkoutSessionId,
    paymentIntentId: p.paymentIntentId,
    chargeId: p.chargeId,
    flagReason: p.flagReason,
    failureMessage: p.failureMessage,
    refunds: p.refunds.map((r) => ({
      id: r.id,
      amountText: formatCentsExact(r.amountCents, p.currency),
      reason: r.reason,
      status: r.status,
      stripeRefundId: r.stripeRefundId,
      byName: r.requestedByName,
      createdAtText: formatDateTime(r.createdAt, timeZone),
    })),
  }));
  return <MoneyClient payments={views} canRefund={can(member.role, "payments:refund")} canReconcile={can(member.role, "payments:reconcile")} />;
}
