import "server-only";
// Stripe webhook events: an allow-list with one handler each. Every event id is recorded in
// webhook_event inside the same transaction as the ledger change it causes, so a replay (or a
// concurrent second delivery) finds the id and changes nothing. E-mail goes out only after the
// commit, and a mail failure never turns into a failed delivery.
import { createHash } from "node:crypto";
import { eq } from "drizzle-orm";
import type Stripe from "stripe";
import { z } from "zod";
import { company, paymentAlert, webhookEvent } from "@/db/schema";
import { formatCentsExact } from "@/lib/format";
import { db, transaction, type Tx } from "@/server/db";
import {
  applyChargeRefunded,
  bookPayment,
  lockPaymentFor,
  markPaymentExpired,
  markPaymentFailed,
  type AfterCommit,
  type LedgerOutcome,
} from "@/server/payments";
import { stripe } from "@/server/stripe";

export const HANDLED_EVENT_TYPES = [
  "checkout.session.completed",
  "payment_intent.succeeded",
  "payment_intent.payment_failed",
  "charge.refunded",
  "checkout.session.expired",
] as const;
export type HandledEventType = (typeof HANDLED_EVENT_TYPES)[number];
type HandledEvent = Extract<Stripe.Event, { type: HandledEventType }>;

export type WebhookResult =
  | { status: "processed"; outcome: LedgerOutcome["outcome"]; note?: string }
  | { status: "duplicate" }
  | { status: "ignored"; note: string }
  | { status: "rejected"; note: string };

const idOf = (v: string | { id: string } | null | undefined): string | null => (v == null ? null : typeof v === "string" ? v : v.id);
const unknownPayment = (what: string): LedgerOutcome => ({ outcome: "ignored", note: `no ledger row for ${what}` });

type Handler<E extends HandledEvent> = (tx: Tx, event: E, after: AfterCommit[]) => Promise<LedgerOutcome>;
type Handlers = { [T in HandledEventType]: Handler<Extract<HandledEvent, { type: T }>> };

const handlers: Handlers = {
  "checkout.session.completed": async (tx, event, after) => {
    const s = event.data.object;
    const row = await lockPaymentFor(tx, { metadata: s.metadata, sessionId: s.id });
    if (!row) return unknownPayment(s.id);
    if (s.payment_status !== "paid") return { outcome: "ignored", note: `session ${s.id} completed with payment ${s.payment_status}` };
    return bookPayment(
      tx,
      row,
      { amountCents: s.amount_total, currency: s.currency, paymentIntentId: idOf(s.payment_intent), chargeId: null, at: new Date(event.created * 1000) },
      event.id,
      after,
    );
  },

  "payment_intent.succeeded": async (tx, event, after) => {
    const pi = event.data.object;
    const row = await lockPaymentFor(tx, { metadata: pi.metadata, paymentIntentId: pi.id, sessionId: await sessionIdFor(pi) });
    if (!row) return unknownPayment(pi.id);
    return bookPayment(
      tx,
      row,
      { amountCents: pi.amount_received, currency: pi.currency, paymentIntentId: pi.id, chargeId: idOf(pi.latest_charge), at: new Date(event.created * 1000) },
      event.id,
      after,
    );
  },

  "payment_intent.payment_failed": async (tx, event) => {
    const pi = event.data.object;
    const row = await lockPaymentFor(tx, { metadata: pi.metadata, paymentIntentId: pi.id, sessionId: await sessionIdFor(pi) });
    if (!row) return unknownPayment(pi.id);
    const message = pi.last_payment_error?.message ?? "The card was declined.";
    return markPaymentFailed(tx, row, pi.id, message);
  },

  "charge.refunded": async (tx, event, after) => {
    const charge = event.data.object;
    const piId = idOf(charge.payment_intent);
    let row = await lockPaymentFor(tx, { metadata: charge.metadata, chargeId: charge.id, paymentIntentId: piId });
    if (!row && piId) {
      // Before the payment's own event landed the ledger knows only the session: ask the provider whose it is.
      const pi = await stripe().paymentIntents.retrieve(piId);
      row = await lockPaymentFor(tx, { metadata: pi.metadata, sessionId: await sessionIdFor(pi) });
    }
    if (!row) return flagUnknownRefund(tx, event, charge, piId);
    return applyChargeRefunded(tx, row, { paymentIntentId: piId, chargeId: charge.id }, event.id, after);
  },

  "checkout.session.expired": async (tx, event) => {
    const s = event.data.object;
    const row = await lockPaymentFor(tx, { metadata: s.metadata, sessionId: s.id });
    if (!row) return unknownPayment(s.id);
    return markPaymentExpired(tx, row);
  },
};

/**
 * A refund of a payment the ledger does not know: money left the company's account and no row
 * says why. When our metadata (on the charge, else its PaymentIntent) names one of our
 * companies, the office of that company sees it on Money → Reconciliation; otherwise only the
 * webhook_event row and the log keep it (no company may see another's alerts).
 */
async function flagUnknownRefund(tx: Tx, event: Stripe.Event, charge: Stripe.Charge, piId: string | null): Promise<LedgerOutcome> {
  let companyId = charge.metadata?.companyId ?? null;
  if (!companyId && piId) companyId = (await stripe().paymentIntents.retrieve(piId)).metadata?.companyId ?? null;
  const [owner] = companyId ? await tx.select({ id: company.id }).from(company).where(eq(company.id, companyId)).limit(1) : [];
  const what = `refund of ${charge.amount_refunded == null ? "an unknown amount" : formatCentsExact(charge.amount_refunded, charge.currency)} on charge ${charge.id}${piId ? ` (payment intent ${piId})` : ""}, a payment the ledger does not know`;
  if (!owner) {
    console.warn(`webhook ${event.id}: ${what}; no company named in its metadata`);
    return { outcome: "flagged", note: `${what}; no company named` };
  }
  await tx.insert(paymentAlert).ignore().values({
    id: crypto.randomUUID(),
    companyId: owner.id,
    kind: "unknown_refund",
    webhookEventId: event.id,
    chargeId: charge.id,
    paymentIntentId: piId,
    amountCents: Number.isInteger(charge.amount_refunded) ? charge.amount_refunded : null,
    detail: `The provider reports a ${what}.`.slice(0, 500),
  });
  return { outcome: "flagged", note: what };
}

/**
 * The Checkout Session of a PaymentIntent, asked from the provider only when our metadata is
 * missing (a PaymentIntent made by Checkout carries payment_intent_data.metadata).
 */
async function sessionIdFor(pi: Stripe.PaymentIntent): Promise<string | null> {
  if (pi.metadata?.paymentId) return null;
  const list = await stripe().checkout.sessions.list({ payment_intent: pi.id, limit: 1 });
  return list.data.find((s) => idOf(s.payment_intent) === pi.id)?.id ?? null;
}

function isHandled(event: Stripe.Event): event is HandledEvent {
  return (HANDLED_EVENT_TYPES as readonly string[]).includes(event.type);
}

// ── Signed but malformed events ───────────────────────────────────────────────────────────
// A body with a valid signature that is not what we need (not JSON, no id, an allow-listed type
// whose object lacks the fields its handler reads) will not get better by delivering it again:
// it is recorded as rejected with the reason and answered 2xx, so the provider stops retrying.

const objectId = z.string().min(1).max(255);
const ref = z.union([objectId, z.object({ id: objectId }).loose()]);
const metadata = z.record(z.string(), z.string()).nullish();
const cents = z.number().int().nonnegative();
const currency = z.string().length(3);

/** What each handler reads from `data.object`; anything else in the object is left alone. */
const OBJECT_SCHEMAS: Record<HandledEventType, z.ZodType> = {
  "checkout.session.completed": z.object({ id: objectId, metadata, payment_status: z.string(), amount_total: cents.nullable(), currency: currency.nullable(), payment_intent: ref.nullish() }).loose(),
  "payment_intent.succeeded": z.object({ id: objectId, metadata, amount_received: cents, currency, latest_charge: ref.nullish() }).loose(),
  "payment_intent.payment_failed": z.object({ id: objectId, metadata, last_payment_error: z.object({ message: z.string().optional() }).loose().nullish() }).loose(),
  "charge.refunded": z.object({ id: objectId, metadata, payment_intent: ref.nullish(), amount_refunded: cents.optional() }).loose(),
  "checkout.session.expired": z.object({ id: objectId, metadata }).loose(),
};

const envelopeSchema = z
  .object({ id: objectId, type: z.string().min(1).max(100), created: z.number().int().positive(), data: z.object({ object: z.record(z.string(), z.unknown()) }).loose() })
  .loose();

/** An id for a body that has none we can trust: the same body gets the same id, so a retry is a duplicate. */
const bodyId = (raw: string) => `malformed_${createHash("sha256").update(raw).digest("hex").slice(0, 40)}`;

function firstIssue(error: z.ZodError): string {
  const issue = error.issues[0];
  return issue ? `${issue.path.join(".") || "body"}: ${issue.message}` : "invalid";
}

/**
 * Checks a signature-verified body: the event when it is one we can act on (or one we ignore by
 * type), else the reason it is rejected and the id to record it under.
 */
export function parseSignedEvent(raw: string): { ok: true; event: Stripe.Event } | { ok: false; id: string; type: string; reason: string } {
  let json: unknown;
  try {
    json = JSON.parse(raw);
  } catch {
    return { ok: false, id: bodyId(raw), type: "unparsed", reason: "the body is not JSON" };
  }
  const envelope = envelopeSchema.safeParse(json);
  if (!envelope.success) {
    const id = typeof (json as { id?: unknown } | null)?.id === "string" ? String((json as { id: string }).id).slice(0, 255) : bodyId(raw);
    return { ok: false, id, type: "unparsed", reason: `not an event: ${firstIssue(envelope.error)}` };
  }
  const { id, type, data } = envelope.data;
  const schema = (OBJECT_SCHEMAS as Record<string, z.ZodType | undefined>)[type];
  if (schema) {
    const object = schema.safeParse(data.object);
    if (!object.success) return { ok: false, id, type, reason: `data.object.${firstIssue(object.error)}` };
  }
  return { ok: true, event: json as Stripe.Event };
}

/** Records a rejected event once (a redelivery finds the row) and says so. */
export async function recordRejectedEvent(id: string, type: string, reason: string): Promise<WebhookResult> {
  const note = reason.slice(0, 500);
  const inserted = await db().insert(webhookEvent).ignore().values({ id, type: type.slice(0, 100), outcome: "rejected", note });
  if (inserted[0].affectedRows !== 1) return { status: "duplicate" };
  console.warn(`webhook ${id} (${type}) rejected: ${note}`);
  return { status: "rejected", note };
}

/**
 * Processes one verified event exactly once. Resolves only after the ledger transaction has
 * committed (the route then answers 2xx); throws on any failure, so the route answers 500
 * and the provider delivers it again.
 */
export async function processStripeEvent(event: Stripe.Event): Promise<WebhookResult> {
  if (!isHandled(event)) return { status: "ignored", note: `event type ${event.type} is not handled` };
  const after: AfterCommit[] = [];
  const result = await transaction(async (tx): Promise<WebhookResult> => {
    // The id first: a concurrent delivery of the same event waits here for our commit, then finds it.
    const inserted = await tx.insert(webhookEvent).ignore().values({ id: event.id, type: event.type, outcome: "processing" });
    if (inserted[0].affectedRows !== 1) return { status: "duplicate" };
    const handler = handlers[event.type] as Handler<HandledEvent>;
    const outcome = await handler(tx, event, after);
    await tx
      .update(webhookEvent)
      .set({ outcome: outcome.outcome, note: outcome.note?.slice(0, 500) ?? null })
      .where(eq(webhookEvent.id, event.id));
    return { status: "processed", ...outcome };
  });
  for (const task of after) {
    try {
      await task();
    } catch (err) {
      // Booked and committed; the office can re-send the receipt from the Money tab.
      console.error(`webhook ${event.id} (${event.type}) committed; a follow-up (e-mail) failed`, err);
    }
  }
  return result;
}
