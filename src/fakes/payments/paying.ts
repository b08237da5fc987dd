import { outcomeOf, type CardDecline, type CheckedCard } from "./cards";
import { newId, nowSeconds, type CardDetails, type Charge, type CheckoutSession, type PaymentIntent } from "./objects";
import { type ApiCall, type ApiResult, type FakeContext, ok, type RequestInfo } from "./context";
import { emit } from "./events";
import { noSuch } from "./errors";
import { listOf, one } from "./lists";
import { onlyKnown, LIST_PARAMS, str } from "./params";

// ── Paying: PaymentIntents and Charges ──────────────────────────────────────────────

function cardDetails(card: CheckedCard): CardDetails {
  return { brand: card.brand === "unknown" ? "visa" : card.brand, country: "US", exp_month: card.expMonth, exp_year: card.expYear, funding: "credit", last4: card.last4 };
}

function paymentIntentFor(ctx: FakeContext, session: CheckoutSession, request: RequestInfo): PaymentIntent {
  if (session.payment_intent) {
    const existing = ctx.store.paymentIntents.get(session.payment_intent);
    if (existing) return existing;
  }
  const id = newId("pi_");
  const pi: PaymentIntent = {
    id,
    object: "payment_intent",
    amount: session.amount_total,
    amount_capturable: 0,
    amount_received: 0,
    application: null,
    canceled_at: null,
    cancellation_reason: null,
    capture_method: "automatic_async",
    client_secret: `${id}_secret_${newId("", 25)}`,
    confirmation_method: "automatic",
    created: nowSeconds(),
    currency: session.currency,
    customer: null,
    description: session._payment_intent_data.description,
    last_payment_error: null,
    latest_charge: null,
    livemode: false,
    metadata: { ...session._payment_intent_data.metadata },
    next_action: null,
    payment_method: null,
    payment_method_types: ["card"],
    receipt_email: session._payment_intent_data.receipt_email,
    status: "requires_payment_method",
  };
  ctx.store.paymentIntents.add(pi);
  session.payment_intent = id;
  emit(ctx, "payment_intent.created", pi, request);
  return pi;
}

/** The Charge of one attempt, field by field as the service shows it: captured, or failed with the decline. */
function chargeFor(pi: PaymentIntent, card: CheckedCard, decline: CardDecline | null, pmId: string, details: CardDetails, payerEmail: string | null): Charge {
  const charge: Charge = {
    id: newId("ch_"),
    object: "charge",
    amount: pi.amount,
    amount_captured: decline ? 0 : pi.amount,
    amount_refunded: 0,
    balance_transaction: decline ? null : newId("txn_"),
    billing_details: { address: { city: null, country: null, line1: null, line2: null, postal_code: card.postalCode, state: null }, email: payerEmail, name: null, phone: null },
    captured: !decline,
    created: nowSeconds(),
    currency: pi.currency,
    customer: null,
    description: pi.description,
    failure_code: decline ? decline.code : null,
    failure_message: decline ? decline.message : null,
    livemode: false,
    metadata: { ...pi.metadata },
    outcome: decline
      ? {
          network_status: decline.code === "processing_error" ? "not_sent_to_network" : "declined_by_network",
          reason: decline.declineCode ?? decline.code,
          risk_level: "normal",
          seller_message: "The bank did not return any further details with this decline.",
          type: decline.code === "processing_error" ? "invalid" : "issuer_declined",
        }
      : { network_status: "approved_by_network", reason: null, risk_level: "normal", seller_message: "Payment complete.", type: "authorized" },
    paid: !decline,
    payment_intent: pi.id,
    payment_method: pmId,
    payment_method_details: { card: { ...details, checks: { address_postal_code_check: "pass", cvc_check: decline?.code === "incorrect_cvc" ? "fail" : "pass" } }, type: "card" },
    receipt_email: pi.receipt_email,
    receipt_url: null,
    refunded: false,
    refunds: { object: "list", data: [], has_more: false, total_count: 0, url: "" },
    status: decline ? "failed" : "succeeded",
  };
  charge.refunds.url = `/v1/charges/${charge.id}/refunds`;
  return charge;
}

/** A declined attempt: the PaymentIntent carries last_payment_error and waits for another card. */
function recordDecline(ctx: FakeContext, pi: PaymentIntent, charge: Charge, decline: CardDecline, pmId: string, details: CardDetails, request: RequestInfo): void {
  pi.status = "requires_payment_method";
  pi.payment_method = null;
  pi.last_payment_error = {
    type: "card_error",
    code: decline.code,
    ...(decline.declineCode ? { decline_code: decline.declineCode } : {}),
    message: decline.message,
    doc_url: `https://stripe.com/docs/error-codes/${decline.code.replace(/_/g, "-")}`,
    charge: charge.id,
    payment_method: { id: pmId, object: "payment_method", type: "card", card: details },
  };
  emit(ctx, "charge.failed", charge, request);
  emit(ctx, "payment_intent.payment_failed", pi, request);
}

/** A successful attempt: the PaymentIntent succeeded and the session is complete and paid. */
function recordSuccess(ctx: FakeContext, session: CheckoutSession, pi: PaymentIntent, charge: Charge, card: CheckedCard, pmId: string, payerEmail: string | null, request: RequestInfo): void {
  pi.status = "succeeded";
  pi.amount_received = pi.amount;
  pi.payment_method = pmId;
  pi.last_payment_error = null;
  session.status = "complete";
  session.payment_status = "paid";
  session.url = null;
  session.customer_details = {
    address: { city: null, country: null, line1: null, line2: null, postal_code: card.postalCode, state: null },
    email: payerEmail,
    name: null,
    phone: null,
    tax_exempt: "none",
    tax_ids: [],
  };
  emit(ctx, "charge.succeeded", charge, request);
  emit(ctx, "payment_intent.succeeded", pi, request);
  emit(ctx, "checkout.session.completed", session, request);
}

/**
 * One payment attempt with a card that passed the form's checks. On success the session is
 * complete and paid; on a decline the PaymentIntent carries last_payment_error and the
 * session stays open for another card.
 */
export function pay(ctx: FakeContext, session: CheckoutSession, card: CheckedCard, email: string | null, request: RequestInfo): { ok: true } | { ok: false; decline: CardDecline } {
  const pi = paymentIntentFor(ctx, session, request);
  const decline = outcomeOf(card.digits);
  const pmId = newId("pm_");
  const details = cardDetails(card);
  const payerEmail = session.customer_email ?? email;
  const charge = chargeFor(pi, card, decline, pmId, details, payerEmail);
  ctx.store.charges.add(charge);
  pi.latest_charge = charge.id;
  if (decline) {
    recordDecline(ctx, pi, charge, decline, pmId, details, request);
    return { ok: false, decline };
  }
  recordSuccess(ctx, session, pi, charge, card, pmId, payerEmail, request);
  return { ok: true };
}

/** GET /v1/payment_intents[/:id] */
export function routePaymentIntents(ctx: FakeContext, call: ApiCall): ApiResult {
  const { parts, params } = call;
  const [, , a] = parts; // parts[0] === "v1"
  if (a === undefined) {
    onlyKnown(params, [...LIST_PARAMS, "customer"]);
    return ok(listOf(ctx, "payment_intent", ctx.store.paymentIntents.newestFirst(), params, "/v1/payment_intents"));
  }
  onlyKnown(params, ["expand", "client_secret"]);
  const pi = ctx.store.paymentIntents.get(a);
  if (!pi) throw noSuch("payment_intent", a, "intent");
  return ok(one(ctx, "payment_intent", pi, params));
}

/** GET /v1/charges[/:id] */
export function routeCharges(ctx: FakeContext, call: ApiCall): ApiResult {
  const { parts, params } = call;
  const [, , a] = parts; // parts[0] === "v1"
  if (a === undefined) {
    onlyKnown(params, [...LIST_PARAMS, "payment_intent", "customer", "transfer_group"]);
    const piFilter = str(params, "payment_intent");
    return ok(listOf(ctx, "charge", ctx.store.charges.newestFirst(), params, "/v1/charges", (ch) => piFilter === null || ch.payment_intent === piFilter));
  }
  onlyKnown(params, ["expand"]);
  const charge = ctx.store.charges.get(a);
  if (!charge) throw noSuch("charge", a, "charge");
  return ok(one(ctx, "charge", charge, params));
}
