import "server-only";
import { and, desc, eq } from "drizzle-orm";
import Stripe from "stripe";
import { payment, paymentAlert, refund } from "@/db/schema";
import { formatCentsExact } from "@/lib/format";
import { can } from "@/lib/permissions";
import { db } from "@/server/db";
import { forbidden, notFound } from "@/server/errors";
import type { Member } from "@/server/session";
import { stripe } from "@/server/stripe";
import { BOOKED_STATUSES, COUNTED_REFUND_STATES, DEMO_SESSION_PREFIX, DEPOSIT_CURRENCY, idOf, type PaymentAlertRow, type PaymentRow, providerError, type RefundRow } from "./common";

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

/** The provider's sessions of the company (by the metadata we set) and their refunds, every page. */
async function providerRecords(companyId: string) {
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
  return { sessions, sessionByPi, providerRefunds };
}

/** Sessions against ledger payments: missing on either side, amounts, states and refunded sums. */
function paymentDifferences(sessions: Stripe.Checkout.Session[], payments: PaymentRow[], providerRefunds: Stripe.Refund[]): ReconciliationDifference[] {
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
  return differences;
}

/** Provider refunds against ledger refunds: missing on either side, amounts and states. */
function refundDifferences(providerRefunds: Stripe.Refund[], sessionByPi: Map<string, Stripe.Checkout.Session>, refunds: RefundRow[], payments: PaymentRow[]): ReconciliationDifference[] {
  const differences: ReconciliationDifference[] = [];
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
  return differences;
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

  const { sessions, sessionByPi, providerRefunds } = await providerRecords(companyId);

  const differences = [...paymentDifferences(sessions, payments, providerRefunds), ...refundDifferences(providerRefunds, sessionByPi, refunds, payments)];

  return {
    checkedAt: new Date(),
    counts: { ledgerPayments: payments.length, providerSessions: sessions.length, ledgerRefunds: refunds.length, providerRefunds: providerRefunds.length },
    differences,
    demoRowsSkipped: ledgerPayments.length - payments.length + (ledgerRefunds.length - refunds.length),
  };
}
