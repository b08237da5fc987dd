import "server-only";
import Stripe from "stripe";
import { v5 as uuidv5 } from "uuid";
import { payment, paymentAlert, proposal, refund, type PaymentStatus } from "@/db/schema";
import { proposalLabel as shortProposalLabel } from "@/lib/proposal-snapshot";
import type { ProposalSnapshot } from "@/lib/schemas/proposal";
import { HttpError } from "@/server/errors";

export type PaymentRow = typeof payment.$inferSelect;
export type PaymentAlertRow = typeof paymentAlert.$inferSelect;
export type RefundRow = typeof refund.$inferSelect;
export type ProposalRow = typeof proposal.$inferSelect;

/** The currency deposits are asked in (Stripe's lower-case ISO code). */
export const DEPOSIT_CURRENCY = "usd";
/** Statuses of a payment whose money reached the provider (booked or flagged). */
export const BOOKED_STATUSES: readonly PaymentStatus[] = ["paid", "partially_refunded", "refunded", "flagged"];
/** Statuses from which part of the money can still be returned. */
export const REFUNDABLE_STATUSES: readonly PaymentStatus[] = ["paid", "partially_refunded", "flagged"];
/** Statuses of a session the customer may still pay. */
export const UNSETTLED_STATUSES: readonly PaymentStatus[] = ["open", "failed"];
/** Provider refund states that count as money returned (or on its way). */
export const COUNTED_REFUND_STATES = ["succeeded", "pending"];
export const CANCELLED_BEFORE_PAYMENT_REASON = "The agreement was cancelled before this payment arrived";
/** Ledger rows the demo seed writes without a provider record (scripts/lib/seed/payments.ts). */
export const DEMO_SESSION_PREFIX = "cs_test_demo";

export const HOUR_MS = 3_600_000;
/**
 * A Checkout Session may live 30 minutes to 24 hours (Stripe's `expires_at` limits). Ours ends
 * 23 hours after the start of the current hour, so a retried create within the same hour sends
 * the same body and the idempotency key returns the same session.
 */
export const SESSION_LIFETIME_MS = 23 * HOUR_MS;

export const proposalLabelOf = (p: { number: number; version: number }): string => shortProposalLabel(p.number, p.version);

export function chosenOffer(p: { snapshot: ProposalSnapshot; chosenPosition: number | null }) {
  if (p.chosenPosition == null) return null;
  return p.snapshot.offers.find((o) => o.position === p.chosenPosition) ?? null;
}

/** The deposit of a signed proposal: the chosen offer's `depositCents` in the snapshot (company policy at sending). */
export function depositCentsOf(p: { snapshot: ProposalSnapshot; chosenPosition: number | null }): number | null {
  const cents = chosenOffer(p)?.depositCents;
  return typeof cents === "number" && Number.isInteger(cents) && cents > 0 ? cents : null;
}

/** The namespace of Kilowright's name-based ids (a random UUID fixed once; our choice). */
const KILOWRIGHT_ID_NAMESPACE = "0b7c8f52-3a61-4f0e-9d2b-6c1e5a7f4d90";

/**
 * A UUID derived from a text (version 5, RFC 9562 §5.5), so a retried checkout writes the same
 * payment id (and sends the same metadata).
 */
export const derivedUuid = (text: string): string => uuidv5(text, KILOWRIGHT_ID_NAMESPACE);

/** Stripe's errors as the person should read them; anything else is rethrown as it is. */
export function providerError(err: unknown): unknown {
  if (err instanceof Stripe.errors.StripeConnectionError || err instanceof Stripe.errors.StripeAPIError || err instanceof Stripe.errors.StripeRateLimitError) {
    return new HttpError(503, "payments_unavailable", "The payment service cannot be reached right now. Nothing was charged; try again in a minute.");
  }
  return err;
}

export const idOf = (v: string | { id: string } | null | undefined): string | null => (v == null ? null : typeof v === "string" ? v : v.id);
