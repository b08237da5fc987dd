// The dev payments server: a local fake of the Stripe HTTP API for the subset Kilowright uses,
// reached through the official `stripe` SDK (host/port/protocol options). Nothing here ever
// leaves the machine and no real money moves.
//
// API (form-encoded bodies and query strings as the SDK sends them, `Authorization: Bearer <key>`):
//   POST /v1/checkout/sessions            create (mode=payment; line_items with price_data or
//                                           amount/currency; metadata; success_url; cancel_url;
//                                           customer_email; client_reference_id;
//                                           payment_intent_data[metadata|description|receipt_email];
//                                           expires_at 30 min – 24 h ahead)
//   GET  /v1/checkout/sessions[/:id]      list (limit, starting_after, ending_before, status,
//                                           payment_intent, created) / retrieve
//   GET  /v1/checkout/sessions/:id/line_items
//   POST /v1/checkout/sessions/:id/expire
//   GET  /v1/payment_intents[/:id]        list / retrieve
//   GET  /v1/charges[/:id]                list (payment_intent) / retrieve
//   POST /v1/refunds                      payment_intent or charge; amount (default: what is left)
//   GET  /v1/refunds[/:id]                list (payment_intent, charge) / retrieve
//   GET  /v1/events[/:id]                 list (type with `*` wildcard, types[]) / retrieve
//   `expand[]` works on the id fields (payment_intent, latest_charge, charge) and line_items.
//   Idempotency-Key on POSTs: the same key and parameters replay the first answer
//   (`Idempotent-Replayed: true`); the same key with other parameters or another endpoint is a
//   400 idempotency_error. Errors are `{ error: { type, code, message, param } }`.
//
// Hosted checkout page: GET/POST /pay/:sessionId (the session's `url`). Stripe's documented test
// cards behave as documented (src/fakes/payments/cards.ts).
//
// Webhooks: every event of an enabled type is POSTed to `webhookUrl`, signed with
// `Stripe-Signature: t=…,v1=…`, retried with doubling delays until a 2xx answer; the queue is
// kept in the data folder, so a restart resumes it.
//
// Dev control API (loopback only, no key; for tests and the demo):
//   GET  /_dev                             this list
//   GET  /_dev/deliveries[?event=evt_…&type=…&status=pending|delivered|failed]
//                                           every webhook delivery with its attempts, newest first
//   POST /_dev/deliveries/flush            makes every pending delivery due now (skips the back-off)
//   POST /_dev/events/:id/redeliver        queues one more delivery of an event
//   POST /_dev/sessions/:id/pay            pays without the browser: JSON or form
//                                           { card, exp?, cvc?, postal_code?, email? }
//   GET  /health                           { ok: true }
//
// State: one JSON file in `dataDir` (src/fakes/payments/store.ts), written before each answer.
import type { IncomingMessage, ServerResponse } from "node:http";
import { createServer } from "node:http";
import type { AddressInfo } from "node:net";
import path from "node:path";
import { checkCardFields, outcomeOf, type CardDecline, type CheckedCard } from "./payments/cards";
import { StripeApiError, invalidInteger, invalidParam, invalidRequest, missingParam, noSuch, unknownParam } from "./payments/errors";
import { FormError, canonicalParams, parseForm, type ParamObject, type ParamValue } from "./payments/form";
import {
  formatAmount,
  newId,
  nowSeconds,
  publicView,
  type CardDetails,
  type Charge,
  type CheckoutSession,
  type Delivery,
  type LineItem,
  type Metadata,
  type PaymentIntent,
  type Refund,
  type StripeEvent,
} from "./payments/objects";
import { checkoutPage, statusPage, type FormState } from "./payments/page";
import { PaymentsStore } from "./payments/store";
import { WebhookSender, type RetryOptions } from "./payments/webhooks";

export type { Delivery, StripeEvent } from "./payments/objects";
export { signatureHeader } from "./payments/webhooks";

/** The event types a Kilowright webhook endpoint subscribes to (the others are listed, not sent). */
export const DEFAULT_WEBHOOK_EVENTS = [
  "checkout.session.completed",
  "checkout.session.expired",
  "payment_intent.succeeded",
  "payment_intent.payment_failed",
  "charge.refunded",
] as const;

export interface PaymentsFakeOptions {
  /** 0 picks a free port; the real one is in the returned url. */
  port: number;
  host?: string;
  /** Where the state file lives; created when missing. */
  dataDir: string;
  /** The only key accepted as `Authorization: Bearer <apiKey>` (sk_test_…). */
  apiKey: string;
  /** Where events are POSTed (the app's /api/webhooks/stripe); null sends nothing. */
  webhookUrl: string | null;
  /** The endpoint's signing secret (whsec_…). */
  webhookSecret: string;
  /** Event types delivered to webhookUrl. Default: DEFAULT_WEBHOOK_EVENTS. */
  webhookEvents?: readonly string[];
  /** Back-off of webhook retries (shorten it in tests). */
  retry?: RetryOptions;
  /** Base of the hosted page links in session urls; default the server's own url. */
  publicUrl?: string;
  /** Receives one line per webhook attempt (the CLI prints them; tests stay quiet). */
  log?: (line: string) => void;
}

export interface PaymentsFake {
  /** Base URL without a trailing slash, e.g. http://127.0.0.1:3520 — what STRIPE_API_BASE points at. */
  url: string;
  port: number;
  dataDir: string;
  /** A copy of every webhook delivery, newest first. */
  deliveries(): Delivery[];
  /** Makes every pending webhook delivery due now. */
  flushDeliveries(): void;
  close(): Promise<void>;
}

/** The API version of the installed SDK (stripe 23); the tests check they agree. */
export const API_VERSION = "2026-10-28.endive";
const MAX_BODY_BYTES = 1024 * 1024;
const MIN_EXPIRY_S = 30 * 60;
const MAX_EXPIRY_S = 24 * 3600;
const IDEMPOTENCY_WINDOW_S = 24 * 3600;
const MAX_IDEMPOTENCY_KEY = 255;

// ---------------------------------------------------------------------------------------------
// Reading parameters

type Params = ParamObject;

function str(params: Params, name: string, opts: { required?: boolean; max?: number; param?: string } = {}): string | null {
  const param = opts.param ?? name;
  const v = params[name];
  if (v === undefined || v === "") {
    if (opts.required) throw missingParam(param);
    return null;
  }
  if (typeof v !== "string") throw invalidParam(param, `Invalid string: ${param} must be a string, not an object or array.`);
  if (opts.max !== undefined && v.length > opts.max) {
    throw invalidParam(param, `Invalid string: ${v.slice(0, 20)}...; must be at most ${opts.max} characters`, "string_length_too_long");
  }
  return v;
}

function int(params: Params, name: string, opts: { required?: boolean; min?: number; max?: number; param?: string } = {}): number | null {
  const param = opts.param ?? name;
  const v = params[name];
  if (v === undefined || v === "") {
    if (opts.required) throw missingParam(param);
    return null;
  }
  if (typeof v !== "string" || !/^-?\d{1,15}$/.test(v)) throw invalidInteger(param, typeof v === "string" ? v : JSON.stringify(v));
  const n = Number(v);
  if (opts.min !== undefined && n < opts.min) throw invalidParam(param, `This value must be greater than or equal to ${opts.min}.`, "parameter_invalid_integer");
  if (opts.max !== undefined && n > opts.max) throw invalidParam(param, `This value must be less than or equal to ${opts.max}.`, "parameter_invalid_integer");
  return n;
}

function obj(params: Params, name: string, param = name): Params | null {
  const v = params[name];
  if (v === undefined || v === "") return null;
  if (typeof v !== "object" || Array.isArray(v)) throw invalidParam(param, `Invalid object: ${param} must be a hash.`, "parameter_invalid_object");
  return v;
}

function list(params: Params, name: string, param = name): ParamValue[] | null {
  const v = params[name];
  if (v === undefined || v === "") return null;
  if (!Array.isArray(v)) throw invalidParam(param, `Invalid array: ${param} must be an array.`, "parameter_invalid_array");
  return v;
}

function onlyKnown(params: Params, known: readonly string[], prefix = ""): void {
  for (const key of Object.keys(params)) {
    if (!known.includes(key)) throw unknownParam(prefix ? `${prefix}[${key}]` : key);
  }
}

/** Metadata as the API takes it: at most 50 keys, keys ≤ 40 and values ≤ 500 characters; "" unsets. */
function metadataOf(params: Params, name: string, param = name): Metadata {
  const m = obj(params, name, param);
  const out: Metadata = {};
  if (!m) return out;
  const keys = Object.keys(m);
  if (keys.length > 50) throw invalidParam(param, "Invalid metadata: metadata can have up to 50 keys.", "parameter_invalid_object");
  for (const key of keys) {
    const value = m[key];
    if (typeof value !== "string") throw invalidParam(`${param}[${key}]`, `Invalid string: metadata values must be strings.`);
    if (key.length > 40) throw invalidParam(`${param}[${key}]`, `Invalid metadata: keys can be up to 40 characters long.`);
    if (value.length > 500) throw invalidParam(`${param}[${key}]`, `Invalid metadata: values can be up to 500 characters long.`);
    if (value !== "") out[key] = value;
  }
  return out;
}

function currencyOf(value: string | null, param: string): string {
  if (value === null) throw missingParam(param);
  const c = value.toLowerCase();
  if (!/^[a-z]{3}$/.test(c)) throw invalidParam(param, `Invalid currency: ${value}. Stripe currently supports these currencies: usd, eur, gbp, …`, "parameter_invalid_string");
  return c;
}

function urlOf(value: string | null, param: string): string | null {
  if (value === null) return null;
  // {CHECKOUT_SESSION_ID} is a template the service fills in; braces are not valid in a URL.
  const probe = value.replaceAll("{CHECKOUT_SESSION_ID}", "cs_test_probe");
  let parsed: URL;
  try {
    parsed = new URL(probe);
  } catch {
    throw invalidParam(param, "Not a valid URL", "url_invalid");
  }
  if (parsed.protocol !== "http:" && parsed.protocol !== "https:") throw invalidParam(param, "Not a valid URL", "url_invalid");
  return value;
}

/** `created` as a number or { gt, gte, lt, lte } (Unix seconds). */
function createdFilter(params: Params): (created: number) => boolean {
  const v = params.created;
  if (v === undefined || v === "") return () => true;
  if (typeof v === "string") {
    const n = int(params, "created");
    return (c) => c === n;
  }
  if (Array.isArray(v)) throw invalidParam("created", "Invalid timestamp or range for created.");
  onlyKnown(v, ["gt", "gte", "lt", "lte"], "created");
  const bound = (k: string) => int(v, k, { param: `created[${k}]` });
  const gt = bound("gt");
  const gte = bound("gte");
  const lt = bound("lt");
  const lte = bound("lte");
  return (c) => (gt === null || c > gt) && (gte === null || c >= gte) && (lt === null || c < lt) && (lte === null || c <= lte);
}

/** GET /_dev answers with this list. */
const DEV_API = [
  "GET  /_dev/deliveries[?event=evt_…&type=…&status=pending|delivered|failed]  every webhook delivery and its attempts, newest first",
  "POST /_dev/deliveries/flush  makes every pending delivery due now",
  "POST /_dev/events/:id/redeliver  queues one more delivery of an event",
  'POST /_dev/sessions/:id/pay  {"card":"4242424242424242","exp?":"12/30","cvc?":"123","postal_code?":"10001","email?":"…"}  pays without a browser',
];

const LIST_PARAMS = ["limit", "starting_after", "ending_before", "created", "expand"];

// ---------------------------------------------------------------------------------------------
// The server

export async function startPaymentsFake(options: PaymentsFakeOptions): Promise<PaymentsFake> {
  const { port, host = "127.0.0.1", apiKey, webhookSecret } = options;
  if (!apiKey) throw new Error("startPaymentsFake: apiKey is required");
  if (options.webhookUrl && !webhookSecret) throw new Error("startPaymentsFake: webhookSecret is required with a webhookUrl");
  const dataDir = path.resolve(options.dataDir);
  const store = new PaymentsStore(dataDir);
  await store.load();
  const webhookEvents = new Set(options.webhookEvents ?? DEFAULT_WEBHOOK_EVENTS);
  const sender = new WebhookSender(store, options.webhookUrl || null, webhookSecret, options.retry, options.log);
  let baseUrl = ""; // set once listening
  let expiryTimer: NodeJS.Timeout | null = null;
  let closed = false;

  // ── Events ──────────────────────────────────────────────────────────────────────────────
  interface RequestInfo {
    id: string | null;
    idempotencyKey: string | null;
  }
  const AUTOMATIC: RequestInfo = { id: null, idempotencyKey: null };

  function emit(type: string, object: unknown, request: RequestInfo, previous?: Record<string, unknown>): StripeEvent {
    const event: StripeEvent = {
      id: newId("evt_"),
      object: "event",
      api_version: API_VERSION,
      created: nowSeconds(),
      data: { object: publicView(object as object), ...(previous ? { previous_attributes: previous } : {}) },
      livemode: false,
      pending_webhooks: 0,
      request: { id: request.id, idempotency_key: request.idempotencyKey },
      type,
    };
    store.events.add(event);
    if (webhookEvents.has(type)) sender.enqueue(event);
    return event;
  }

  // ── Checkout Sessions ───────────────────────────────────────────────────────────────────
  const SESSION_CREATE_PARAMS = [
    // implemented
    "mode", "line_items", "metadata", "success_url", "cancel_url", "customer_email", "client_reference_id",
    "payment_intent_data", "expires_at", "expand", "currency", "locale", "submit_type", "payment_method_types",
    // accepted and ignored (they change nothing the fake shows)
    "after_expiration", "allow_promotion_codes", "allowed_payment_method_types", "automatic_tax", "billing_address_collection",
    "consent_collection", "custom_text", "customer_creation", "invoice_creation", "payment_method_collection",
    "payment_method_options", "phone_number_collection", "ui_mode", "wallet_options", "adaptive_pricing", "branding_settings",
  ];
  const LINE_ITEM_PARAMS = ["price", "price_data", "quantity", "amount", "currency", "name", "description", "metadata", "adjustable_quantity", "tax_rates", "dynamic_tax_rates"];
  const PRICE_DATA_PARAMS = ["currency", "unit_amount", "unit_amount_decimal", "product_data", "product", "tax_behavior"];
  const PI_DATA_PARAMS = ["metadata", "description", "receipt_email", "capture_method", "setup_future_usage", "statement_descriptor", "statement_descriptor_suffix", "shipping", "transfer_group"];

  function lineItemOf(raw: ParamValue, index: number, now: number): LineItem {
    const p = `line_items[${index}]`;
    if (typeof raw !== "object" || Array.isArray(raw)) throw invalidParam(p, `Invalid object: ${p} must be a hash.`, "parameter_invalid_object");
    onlyKnown(raw, LINE_ITEM_PARAMS, p);
    const quantity = int(raw, "quantity", { param: `${p}[quantity]`, min: 1, max: 999_999 }) ?? null;
    let unitAmount: number;
    let currency: string;
    let name: string;
    const price = str(raw, "price", { param: `${p}[price]` });
    if (price !== null) throw noSuch("price", price, `${p}[price]`); // the fake keeps no Price objects: use price_data
    const priceData = obj(raw, "price_data", `${p}[price_data]`);
    if (priceData) {
      const pp = `${p}[price_data]`;
      onlyKnown(priceData, PRICE_DATA_PARAMS, pp);
      currency = currencyOf(str(priceData, "currency", { param: `${pp}[currency]` }), `${pp}[currency]`);
      const decimal = str(priceData, "unit_amount_decimal", { param: `${pp}[unit_amount_decimal]` });
      const ua = int(priceData, "unit_amount", { param: `${pp}[unit_amount]`, min: 0, max: 99_999_999 });
      if (ua === null && decimal === null) throw missingParam(`${pp}[unit_amount]`);
      if (ua !== null) unitAmount = ua;
      else {
        if (!/^\d+(\.\d+)?$/.test(decimal!)) throw invalidParam(`${pp}[unit_amount_decimal]`, `Invalid decimal: ${decimal}`);
        unitAmount = Math.round(Number(decimal));
      }
      const productData = obj(priceData, "product_data", `${pp}[product_data]`);
      if (!productData) {
        const product = str(priceData, "product", { param: `${pp}[product]` });
        if (product !== null) throw noSuch("product", product, `${pp}[product]`);
        throw missingParam(`${pp}[product_data]`);
      }
      onlyKnown(productData, ["name", "description", "images", "metadata", "tax_code", "unit_label"], `${pp}[product_data]`);
      name = str(productData, "name", { required: true, param: `${pp}[product_data][name]`, max: 250 })!;
    } else if (raw.amount !== undefined) {
      // The older inline form: amount, currency, name, quantity.
      unitAmount = int(raw, "amount", { param: `${p}[amount]`, min: 0, max: 99_999_999 })!;
      currency = currencyOf(str(raw, "currency", { param: `${p}[currency]` }), `${p}[currency]`);
      name = str(raw, "name", { required: true, param: `${p}[name]`, max: 250 })!;
    } else {
      throw invalidRequest(`You must specify either \`price\` or \`price_data\` in ${p}.`, p);
    }
    if (quantity === null) throw missingParam(`${p}[quantity]`);
    const total = unitAmount * quantity;
    return {
      id: newId("li_"),
      object: "item",
      amount_discount: 0,
      amount_subtotal: total,
      amount_tax: 0,
      amount_total: total,
      currency,
      description: (raw.description as string | undefined) || name,
      metadata: metadataOf(raw, "metadata", `${p}[metadata]`),
      price: {
        id: newId("price_"),
        object: "price",
        active: false,
        currency,
        metadata: {},
        product: newId("prod_", 14),
        type: "one_time",
        unit_amount: unitAmount,
        livemode: false,
        created: now,
      },
      quantity,
    };
  }

  function createSession(params: Params): CheckoutSession {
    onlyKnown(params, SESSION_CREATE_PARAMS);
    const now = nowSeconds();
    const mode = str(params, "mode");
    if (mode === null) throw missingParam("mode");
    if (!["payment", "subscription", "setup"].includes(mode)) {
      throw invalidParam("mode", `Invalid mode: must be one of payment, setup, or subscription`, "parameter_invalid_string");
    }
    if (mode !== "payment") throw invalidParam("mode", `The dev payments server supports only mode=payment (got ${mode}).`);
    const rawItems = list(params, "line_items");
    if (!rawItems || rawItems.length === 0) throw missingParam("line_items");
    if (rawItems.length > 100) throw invalidParam("line_items", "You may only specify up to 100 line items.");
    const items = rawItems.map((raw, i) => lineItemOf(raw, i, now));
    const currency = items[0].currency;
    const other = items.findIndex((li) => li.currency !== currency);
    if (other >= 0) throw invalidParam(`line_items[${other}]`, "All line items must have the same currency.");
    const given = str(params, "currency");
    if (given !== null && given.toLowerCase() !== currency) throw invalidParam("currency", `The currency ${given} does not match the line items' currency (${currency}).`);
    const amount = items.reduce((s, li) => s + li.amount_total, 0);
    // The service's minimum charge; only the dollar one is modelled (Kilowright charges in usd).
    if (currency === "usd" && amount < 50) {
      throw invalidRequest(`The Checkout Session's total amount due must add up to at least $0.50 usd`, "line_items", "amount_too_small");
    }
    if (amount > 99_999_999) throw invalidRequest("Amount must be no more than $999,999.99", "line_items", "amount_too_large");
    const successUrl = urlOf(str(params, "success_url", { max: 5000 }), "success_url");
    const cancelUrl = urlOf(str(params, "cancel_url", { max: 5000 }), "cancel_url");
    const customerEmail = str(params, "customer_email", { max: 800 });
    if (customerEmail !== null && !/^[^\s@]+@[^\s@]+\.[^\s@]+$/.test(customerEmail)) throw invalidParam("customer_email", `Invalid email address: ${customerEmail}`, "email_invalid");
    const clientReferenceId = str(params, "client_reference_id", { max: 200 });
    let expiresAt = int(params, "expires_at");
    if (expiresAt === null) expiresAt = now + MAX_EXPIRY_S;
    else if (expiresAt < now + MIN_EXPIRY_S - 60) {
      throw invalidParam("expires_at", "The `expires_at` timestamp must be at least 30 minutes from Checkout Session creation.", "parameter_invalid_integer");
    } else if (expiresAt > now + MAX_EXPIRY_S + 60) {
      throw invalidParam("expires_at", "The `expires_at` timestamp must be less than 24 hours from Checkout Session creation.", "parameter_invalid_integer");
    }
    const piData = obj(params, "payment_intent_data") ?? {};
    onlyKnown(piData, PI_DATA_PARAMS, "payment_intent_data");
    const id = newId("cs_test_a1", 56);
    const session: CheckoutSession = {
      id,
      object: "checkout.session",
      after_expiration: null,
      allow_promotion_codes: null,
      amount_subtotal: amount,
      amount_total: amount,
      automatic_tax: { enabled: false, liability: null, status: null },
      billing_address_collection: null,
      cancel_url: cancelUrl,
      client_reference_id: clientReferenceId,
      client_secret: null,
      created: now,
      currency,
      customer: null,
      customer_creation: "if_required",
      customer_details: null,
      customer_email: customerEmail,
      expires_at: expiresAt,
      invoice: null,
      livemode: false,
      locale: str(params, "locale"),
      metadata: metadataOf(params, "metadata"),
      mode: "payment",
      payment_intent: null,
      payment_link: null,
      payment_method_types: ["card"],
      payment_status: "unpaid",
      status: "open",
      submit_type: str(params, "submit_type"),
      success_url: successUrl,
      total_details: { amount_discount: 0, amount_shipping: 0, amount_tax: 0 },
      ui_mode: "hosted",
      url: `${baseUrl}/pay/${id}`,
      _line_items: items,
      _payment_intent_data: {
        metadata: metadataOf(piData, "metadata", "payment_intent_data[metadata]"),
        description: str(piData, "description", { param: "payment_intent_data[description]", max: 1000 }),
        receipt_email: str(piData, "receipt_email", { param: "payment_intent_data[receipt_email]" }),
      },
    };
    store.sessions.add(session);
    armExpiry();
    return session;
  }

  function sessionOrThrow(id: string): CheckoutSession {
    const s = store.sessions.get(id);
    if (!s) throw noSuch("checkout.session", id, "session");
    return s;
  }

  function expireSession(session: CheckoutSession, request: RequestInfo): void {
    session.status = "expired";
    session.url = null;
    if (session.payment_intent) {
      const pi = store.paymentIntents.get(session.payment_intent);
      if (pi && pi.status === "requires_payment_method") {
        pi.status = "canceled";
        pi.canceled_at = nowSeconds();
        pi.cancellation_reason = "abandoned";
        emit("payment_intent.canceled", pi, request);
      }
    }
    emit("checkout.session.expired", session, request);
  }

  /** Expires open sessions whose expires_at has passed, then re-arms the timer. */
  function sweepExpired(): boolean {
    const now = nowSeconds();
    let changed = false;
    for (const s of store.sessions.all()) {
      if (s.status === "open" && s.expires_at <= now) {
        expireSession(s, AUTOMATIC);
        changed = true;
      }
    }
    return changed;
  }

  function armExpiry(): void {
    if (closed) return;
    if (expiryTimer) clearTimeout(expiryTimer);
    expiryTimer = null;
    let next = Infinity;
    for (const s of store.sessions.all()) if (s.status === "open") next = Math.min(next, s.expires_at);
    if (next === Infinity) return;
    const wait = Math.max(0, Math.min(next * 1000 - Date.now() + 50, 2 ** 31 - 1));
    expiryTimer = setTimeout(() => {
      expiryTimer = null;
      if (sweepExpired()) void store.save().then(() => sender.schedule());
      armExpiry();
    }, wait);
    expiryTimer.unref?.();
  }

  // ── Paying ──────────────────────────────────────────────────────────────────────────────
  function cardDetails(card: CheckedCard): CardDetails {
    return { brand: card.brand === "unknown" ? "visa" : card.brand, country: "US", exp_month: card.expMonth, exp_year: card.expYear, funding: "credit", last4: card.last4 };
  }

  function paymentIntentFor(session: CheckoutSession, request: RequestInfo): PaymentIntent {
    if (session.payment_intent) {
      const existing = store.paymentIntents.get(session.payment_intent);
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
    store.paymentIntents.add(pi);
    session.payment_intent = id;
    emit("payment_intent.created", pi, request);
    return pi;
  }

  /**
   * One payment attempt with a card that passed the form's checks. On success the session is
   * complete and paid; on a decline the PaymentIntent carries last_payment_error and the
   * session stays open for another card.
   */
  function pay(session: CheckoutSession, card: CheckedCard, email: string | null, request: RequestInfo): { ok: true } | { ok: false; decline: CardDecline } {
    const pi = paymentIntentFor(session, request);
    const decline = outcomeOf(card.digits);
    const pmId = newId("pm_");
    const details = cardDetails(card);
    const payerEmail = session.customer_email ?? email;
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
    store.charges.add(charge);
    pi.latest_charge = charge.id;
    if (decline) {
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
      emit("charge.failed", charge, request);
      emit("payment_intent.payment_failed", pi, request);
      return { ok: false, decline };
    }
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
    emit("charge.succeeded", charge, request);
    emit("payment_intent.succeeded", pi, request);
    emit("checkout.session.completed", session, request);
    return { ok: true };
  }

  // ── Refunds ─────────────────────────────────────────────────────────────────────────────
  const REFUND_CREATE_PARAMS = ["payment_intent", "charge", "amount", "reason", "metadata", "expand", "instructions_email", "refund_application_fee", "reverse_transfer", "currency", "origin", "customer"];

  function createRefund(params: Params, request: RequestInfo): Refund {
    onlyKnown(params, REFUND_CREATE_PARAMS);
    const piId = str(params, "payment_intent");
    const chargeId = str(params, "charge");
    if (piId === null && chargeId === null) throw invalidRequest("One of the following params should be provided for this request: payment_intent or charge.", "payment_intent", "parameter_missing");
    let charge: Charge | undefined;
    let pi: PaymentIntent | undefined;
    if (piId !== null) {
      pi = store.paymentIntents.get(piId);
      if (!pi) throw noSuch("payment_intent", piId, "payment_intent");
      const latest = pi.latest_charge ? store.charges.get(pi.latest_charge) : undefined;
      if (pi.status !== "succeeded" || !latest || latest.status !== "succeeded") {
        throw invalidRequest(`This PaymentIntent (${piId}) does not have a successful charge to refund.`, "payment_intent");
      }
      charge = latest;
    }
    if (chargeId !== null) {
      const byCharge = store.charges.get(chargeId);
      if (!byCharge) throw noSuch("charge", chargeId, "charge");
      if (charge && charge.id !== byCharge.id) throw invalidRequest(`Charge ${chargeId} does not belong to PaymentIntent ${piId}.`, "charge");
      if (byCharge.status !== "succeeded") throw invalidRequest(`Charge ${chargeId} has not succeeded, so it cannot be refunded.`, "charge");
      charge = byCharge;
      pi = store.paymentIntents.get(byCharge.payment_intent);
    }
    if (!charge || !pi) throw invalidRequest("No charge to refund.", "charge");
    const remaining = charge.amount - charge.amount_refunded;
    if (remaining <= 0) throw invalidRequest(`Charge ${charge.id} has already been refunded.`, undefined, "charge_already_refunded");
    const amount = int(params, "amount", { min: 1 }) ?? remaining;
    if (amount > remaining) {
      throw invalidRequest(
        `Refund amount (${formatAmount(amount, charge.currency)}) is greater than unrefunded amount on charge (${formatAmount(remaining, charge.currency)})`,
        "amount",
        "amount_too_large",
      );
    }
    const reason = str(params, "reason");
    if (reason !== null && !["duplicate", "fraudulent", "requested_by_customer"].includes(reason)) {
      throw invalidParam("reason", `Invalid reason: must be one of duplicate, fraudulent, or requested_by_customer`);
    }
    const refund: Refund = {
      id: newId("re_"),
      object: "refund",
      amount,
      balance_transaction: newId("txn_"),
      charge: charge.id,
      created: nowSeconds(),
      currency: charge.currency,
      destination_details: { card: { reference_status: "pending", reference_type: "acquirer_reference_number", type: "refund" }, type: "card" },
      metadata: metadataOf(params, "metadata"),
      payment_intent: pi.id,
      reason: reason as Refund["reason"],
      receipt_number: null,
      source_transfer_reversal: null,
      status: "succeeded",
      transfer_reversal: null,
    };
    store.refunds.add(refund);
    const previous = { amount_refunded: charge.amount_refunded, refunded: charge.refunded, refunds: publicView(charge.refunds) };
    charge.amount_refunded += amount;
    charge.refunded = charge.amount_refunded >= charge.amount;
    charge.refunds.data.unshift(refund);
    charge.refunds.total_count = charge.refunds.data.length;
    emit("refund.created", refund, request);
    emit("charge.refunded", charge, request, charge.refunded ? previous : { amount_refunded: previous.amount_refunded, refunds: previous.refunds });
    return refund;
  }

  // ── Lists and expansion ─────────────────────────────────────────────────────────────────
  type Kind = "checkout.session" | "payment_intent" | "charge" | "refund" | "event" | "item";

  function lookup(kind: Kind, id: string): object | undefined {
    switch (kind) {
      case "checkout.session":
        return store.sessions.get(id);
      case "payment_intent":
        return store.paymentIntents.get(id);
      case "charge":
        return store.charges.get(id);
      case "refund":
        return store.refunds.get(id);
      case "event":
        return store.events.get(id);
      default:
        return undefined;
    }
  }

  const EXPANDABLE: Partial<Record<Kind, Record<string, Kind>>> = {
    "checkout.session": { payment_intent: "payment_intent" },
    payment_intent: { latest_charge: "charge" },
    charge: { payment_intent: "payment_intent" },
    refund: { charge: "charge", payment_intent: "payment_intent" },
  };

  function lineItemsList(session: CheckoutSession, url: string) {
    return { object: "list", data: structuredClone(session._line_items), has_more: false, url };
  }

  /** Replaces id fields by their objects along each `a.b.c` path. */
  function expand(kind: Kind, source: object, paths: string[]): Record<string, unknown> {
    const out = publicView(source) as Record<string, unknown>;
    for (const p of paths) {
      const [head, ...rest] = p.split(".");
      if (kind === "checkout.session" && head === "line_items" && rest.length === 0) {
        out.line_items = lineItemsList(source as CheckoutSession, `/v1/checkout/sessions/${(source as CheckoutSession).id}/line_items`);
        continue;
      }
      const target = EXPANDABLE[kind]?.[head];
      if (!target) throw invalidParam("expand", `This property cannot be expanded (${head}).`);
      const current = out[head];
      let child: object | undefined;
      if (typeof current === "string") child = lookup(target, current);
      else if (current && typeof current === "object") child = current;
      if (!child) continue; // null stays null
      out[head] = rest.length > 0 ? expand(target, child, [rest.join(".")]) : publicView(child);
    }
    return out;
  }

  function expandParam(params: Params): string[] {
    const v = params.expand;
    if (v === undefined || v === "") return [];
    const items = Array.isArray(v) ? v : [v];
    return items.map((x, i) => {
      if (typeof x !== "string") throw invalidParam(`expand[${i}]`, "Invalid string: expand entries must be strings.");
      return x;
    });
  }

  function one(kind: Kind, item: object, params: Params): Record<string, unknown> {
    return expand(kind, item, expandParam(params));
  }

  function listOf<T extends { id: string; created: number }>(kind: Kind, all: T[], params: Params, url: string, filter: (item: T) => boolean = () => true) {
    const limit = int(params, "limit", { min: 1, max: 100 }) ?? 10;
    const after = str(params, "starting_after");
    const before = str(params, "ending_before");
    if (after !== null && before !== null) throw invalidRequest("You may only specify one of these parameters: ending_before, starting_after.", "starting_after");
    const created = createdFilter(params);
    const expandPaths = expandParam(params).map((p, i) => {
      if (!p.startsWith("data.")) throw invalidParam(`expand[${i}]`, `This property cannot be expanded (${p}). You may want to try expanding 'data.${p}' instead.`);
      return p.slice("data.".length);
    });
    const position = new Map(all.map((item, i) => [item.id, i]));
    const matching = all.filter((item) => created(item.created) && filter(item)); // newest first
    let page: T[];
    let hasMore: boolean;
    if (after !== null) {
      const at = position.get(after);
      if (at === undefined) throw noSuch(kind, after, "starting_after");
      const rest = matching.filter((item) => position.get(item.id)! > at);
      page = rest.slice(0, limit);
      hasMore = rest.length > limit;
    } else if (before !== null) {
      const at = position.get(before);
      if (at === undefined) throw noSuch(kind, before, "ending_before");
      const rest = matching.filter((item) => position.get(item.id)! < at);
      page = rest.slice(Math.max(0, rest.length - limit));
      hasMore = rest.length > limit;
    } else {
      page = matching.slice(0, limit);
      hasMore = matching.length > limit;
    }
    return { object: "list", data: page.map((item) => expand(kind, item, expandPaths)), has_more: hasMore, url };
  }

  // ── Routing the API ─────────────────────────────────────────────────────────────────────
  interface ApiResult {
    status: number;
    body: unknown;
  }

  function routeApi(method: string, parts: string[], params: Params, request: RequestInfo): ApiResult {
    const ok = (body: unknown): ApiResult => ({ status: 200, body });
    const pathText = `/${parts.join("/")}`;
    const unrecognized = () =>
      invalidRequest(
        `Unrecognized request URL (${method}: ${pathText}). The dev payments server implements only the Checkout Session, PaymentIntent, Charge, Refund and Event calls Kilowright uses (see src/fakes/payments-server.ts).`,
        undefined,
        undefined,
        404,
      );
    const [, resource, a, b, c] = parts; // parts[0] === "v1"

    if (resource === "checkout" && a === "sessions") {
      if (b === undefined) {
        if (method === "POST") return ok(one("checkout.session", createSession(params), params));
        if (method === "GET") {
          onlyKnown(params, [...LIST_PARAMS, "status", "payment_intent", "customer_details", "payment_link", "customer", "subscription"]);
          const status = str(params, "status");
          const piFilter = str(params, "payment_intent");
          return ok(
            listOf("checkout.session", store.sessions.newestFirst(), params, "/v1/checkout/sessions", (s) => (status === null || s.status === status) && (piFilter === null || s.payment_intent === piFilter)),
          );
        }
        throw unrecognized();
      }
      const session = sessionOrThrow(b);
      if (c === undefined && method === "GET") {
        onlyKnown(params, ["expand"]);
        return ok(one("checkout.session", session, params));
      }
      if (c === "expire" && method === "POST" && parts.length === 5) {
        onlyKnown(params, ["expand"]);
        if (session.status !== "open") {
          throw invalidRequest(`Only Checkout Sessions with a status in ["open"] can be expired. This Checkout Session has a status of "${session.status}".`, "session");
        }
        expireSession(session, request);
        armExpiry();
        return ok(one("checkout.session", session, params));
      }
      if (c === "line_items" && method === "GET" && parts.length === 5) {
        onlyKnown(params, LIST_PARAMS);
        const items = [...session._line_items].map((li) => ({ ...li, created: 0 }));
        const listed = listOf("item", items, params, `/v1/checkout/sessions/${session.id}/line_items`);
        return ok({ ...listed, data: (listed.data as Record<string, unknown>[]).map(({ created: _created, ...li }) => li) });
      }
      throw unrecognized();
    }

    if (resource === "payment_intents" && method === "GET" && b === undefined) {
      if (a === undefined) {
        onlyKnown(params, [...LIST_PARAMS, "customer"]);
        return ok(listOf("payment_intent", store.paymentIntents.newestFirst(), params, "/v1/payment_intents"));
      }
      onlyKnown(params, ["expand", "client_secret"]);
      const pi = store.paymentIntents.get(a);
      if (!pi) throw noSuch("payment_intent", a, "intent");
      return ok(one("payment_intent", pi, params));
    }

    if (resource === "charges" && method === "GET" && b === undefined) {
      if (a === undefined) {
        onlyKnown(params, [...LIST_PARAMS, "payment_intent", "customer", "transfer_group"]);
        const piFilter = str(params, "payment_intent");
        return ok(listOf("charge", store.charges.newestFirst(), params, "/v1/charges", (ch) => piFilter === null || ch.payment_intent === piFilter));
      }
      onlyKnown(params, ["expand"]);
      const charge = store.charges.get(a);
      if (!charge) throw noSuch("charge", a, "charge");
      return ok(one("charge", charge, params));
    }

    if (resource === "refunds" && b === undefined) {
      if (a === undefined && method === "POST") return ok(one("refund", createRefund(params, request), params));
      if (a === undefined && method === "GET") {
        onlyKnown(params, [...LIST_PARAMS, "payment_intent", "charge"]);
        const piFilter = str(params, "payment_intent");
        const chargeFilter = str(params, "charge");
        return ok(
          listOf("refund", store.refunds.newestFirst(), params, "/v1/refunds", (r) => (piFilter === null || r.payment_intent === piFilter) && (chargeFilter === null || r.charge === chargeFilter)),
        );
      }
      if (a !== undefined && method === "GET") {
        onlyKnown(params, ["expand"]);
        const refund = store.refunds.get(a);
        if (!refund) throw noSuch("refund", a, "refund");
        return ok(one("refund", refund, params));
      }
      throw unrecognized();
    }

    if (resource === "events" && method === "GET" && b === undefined) {
      if (a === undefined) {
        onlyKnown(params, [...LIST_PARAMS, "type", "types", "delivery_success"]);
        const type = str(params, "type");
        const typesRaw = list(params, "types");
        const types = typesRaw ? typesRaw.map((t, i) => (typeof t === "string" ? t : (() => { throw invalidParam(`types[${i}]`, "Invalid string"); })())) : null;
        if (type !== null && types !== null) throw invalidRequest("You may only specify one of these parameters: type, types.", "type");
        const matches = (pattern: string, t: string) => (pattern.endsWith(".*") ? t.startsWith(pattern.slice(0, -1)) : pattern === t);
        const successRaw = str(params, "delivery_success");
        const deliveredFilter = successRaw === null ? null : successRaw === "true";
        return ok(
          listOf("event", store.events.newestFirst(), params, "/v1/events", (e) => {
            if (type !== null && !matches(type, e.type)) return false;
            if (types !== null && !types.some((t) => matches(t, e.type))) return false;
            if (deliveredFilter !== null) {
              const ds = store.deliveries.all().filter((d) => d.eventId === e.id);
              const delivered = ds.length > 0 && ds.every((d) => d.status === "delivered");
              if (delivered !== deliveredFilter) return false;
            }
            return true;
          }),
        );
      }
      onlyKnown(params, ["expand"]);
      const event = store.events.get(a);
      if (!event) throw noSuch("event", a, "id");
      return ok(publicView(event));
    }

    throw unrecognized();
  }

  // ── Idempotency ─────────────────────────────────────────────────────────────────────────
  function pruneIdempotency(): void {
    const cutoff = nowSeconds() - IDEMPOTENCY_WINDOW_S;
    for (const r of store.idempotency.all()) if (r.createdAt < cutoff) store.idempotency.delete(r.id);
  }

  // ── HTTP ────────────────────────────────────────────────────────────────────────────────
  function send(res: ServerResponse, status: number, body: unknown, headers: Record<string, string> = {}): void {
    const text = `${JSON.stringify(body, null, 2)}\n`;
    res.writeHead(status, { "content-type": "application/json; charset=utf-8", "content-length": Buffer.byteLength(text), "cache-control": "no-store", ...headers });
    res.end(text);
  }

  function sendHtml(res: ServerResponse, status: number, html: string): void {
    res.writeHead(status, { "content-type": "text/html; charset=utf-8", "content-length": Buffer.byteLength(html), "cache-control": "no-store" });
    res.end(html);
  }

  function redirect(res: ServerResponse, location: string): void {
    res.writeHead(303, { location, "content-length": 0, "cache-control": "no-store" });
    res.end();
  }

  async function readBody(req: IncomingMessage): Promise<string> {
    const chunks: Buffer[] = [];
    let size = 0;
    for await (const chunk of req) {
      const buf = Buffer.isBuffer(chunk) ? chunk : Buffer.from(String(chunk));
      size += buf.length;
      if (size > MAX_BODY_BYTES) throw invalidRequest("The request body is too large.", undefined, undefined, 413);
      chunks.push(buf);
    }
    return Buffer.concat(chunks).toString("utf8");
  }

  function parseParams(text: string): Params {
    try {
      return parseForm(text);
    } catch (err) {
      if (err instanceof FormError) throw invalidRequest(`Invalid request: ${err.message}`);
      throw err;
    }
  }

  function checkAuth(req: IncomingMessage): void {
    const header = req.headers.authorization;
    let key: string | null = null;
    if (header) {
      const bearer = /^Bearer\s+(\S+)\s*$/i.exec(header);
      const basic = /^Basic\s+(\S+)\s*$/i.exec(header);
      if (bearer) key = bearer[1];
      else if (basic) key = Buffer.from(basic[1], "base64").toString("utf8").split(":")[0] || null;
    }
    if (!key) {
      throw invalidRequest(
        "You did not provide an API key. You need to provide your API key in the Authorization header, using Bearer auth (e.g. 'Authorization: Bearer YOUR_SECRET_KEY').",
        undefined,
        undefined,
        401,
      );
    }
    if (key !== apiKey) {
      const shown = key.length > 8 ? `${key.slice(0, 8)}${"*".repeat(Math.max(0, key.length - 12))}${key.slice(-4)}` : key;
      throw invalidRequest(`Invalid API Key provided: ${shown}`, undefined, "api_key_invalid", 401);
    }
  }

  async function handleApi(req: IncomingMessage, res: ServerResponse, url: URL, parts: string[]): Promise<void> {
    const requestId = newId("req_", 14);
    const baseHeaders: Record<string, string> = {
      "request-id": requestId,
      "stripe-version": String(req.headers["stripe-version"] ?? API_VERSION),
    };
    const method = req.method ?? "GET";
    try {
      checkAuth(req);
      const rawKey = req.headers["idempotency-key"];
      const key = method === "POST" && rawKey !== undefined ? (Array.isArray(rawKey) ? rawKey[0] : rawKey) : null;
      if (key !== null) {
        if (key.length === 0 || key.length > MAX_IDEMPOTENCY_KEY) {
          throw invalidRequest(`Invalid idempotency key: keys must be between 1 and ${MAX_IDEMPOTENCY_KEY} characters long.`, undefined, "idempotency_key_invalid");
        }
        baseHeaders["idempotency-key"] = key;
      }
      const params = method === "GET" || method === "DELETE" ? parseParams(url.search.slice(1)) : parseParams(await readBody(req));
      const pathText = url.pathname.replace(/\/+$/, "");
      const paramsText = canonicalParams(params);

      if (sweepExpired()) {
        armExpiry();
        await store.save();
        sender.schedule();
      }
      if (key !== null) {
        pruneIdempotency();
        const existing = store.idempotency.get(key);
        if (existing) {
          if (existing.method !== method || existing.path !== pathText) {
            throw new StripeApiError(400, {
              type: "idempotency_error",
              message: `Keys for idempotent requests can only be used for the same endpoint they were first used for ('${existing.method} ${existing.path}' vs '${method} ${pathText}'). Try using a key other than '${key}' if you meant to execute a different request.`,
            });
          }
          if (existing.paramsText !== paramsText) {
            throw new StripeApiError(400, {
              type: "idempotency_error",
              message: `Keys for idempotent requests can only be used with the same parameters they were first used with. Try using a key other than '${key}' if you meant to execute a different request.`,
            });
          }
          return send(res, existing.status, existing.body, { ...baseHeaders, "request-id": existing.requestId, "idempotent-replayed": "true" });
        }
      }

      const info: RequestInfo = { id: requestId, idempotencyKey: key };
      let result: ApiResult;
      // From the idempotency check to recording the result nothing awaits, so two requests
      // with one key cannot both run.
      try {
        result = routeApi(method, parts, params, info);
      } catch (err) {
        // Errors raised once the call started executing (not bad parameters) are kept for the
        // key like results: a retry sees the same answer. The fake's only such error is a
        // refund refused for the amount; validation errors are not saved, as with the service.
        if (key !== null && err instanceof StripeApiError && err.error.code === "amount_too_large") {
          store.idempotency.add({ id: key, method, path: pathText, paramsText, status: err.status, body: err.body(), requestId, createdAt: nowSeconds() });
          await store.save();
        }
        throw err;
      }
      if (method === "POST") {
        if (key !== null) {
          store.idempotency.add({ id: key, method, path: pathText, paramsText, status: result.status, body: result.body, requestId, createdAt: nowSeconds() });
        }
        await store.save();
        sender.schedule();
      }
      return send(res, result.status, result.body, baseHeaders);
    } catch (err) {
      if (err instanceof StripeApiError) return send(res, err.status, err.body(), baseHeaders);
      throw err;
    }
  }

  // ── The hosted page ─────────────────────────────────────────────────────────────────────
  function successUrlOf(session: CheckoutSession): string | null {
    return session.success_url ? session.success_url.replaceAll("{CHECKOUT_SESSION_ID}", session.id) : null;
  }

  function closedPage(res: ServerResponse, session: CheckoutSession): void {
    if (session.status === "complete") {
      const back = successUrlOf(session);
      return sendHtml(res, 200, statusPage("This payment is complete", `${formatAmount(session.amount_total, session.currency)} was paid. You can close this page.`, back ? { href: back, label: "Return to the site" } : null));
    }
    return sendHtml(
      res,
      410,
      statusPage("This checkout has expired", "Nothing was charged. Ask for a new payment link.", session.cancel_url ? { href: session.cancel_url, label: "Go back" } : null),
    );
  }

  async function handlePage(req: IncomingMessage, res: ServerResponse, sessionId: string): Promise<void> {
    const method = req.method ?? "GET";
    if (sweepExpired()) {
      armExpiry();
      await store.save();
      sender.schedule();
    }
    const session = store.sessions.get(sessionId);
    if (!session) return sendHtml(res, 404, statusPage("Payment link not found", "This payment link is not valid. Check the link you were sent.", null));
    if (method === "GET" || method === "HEAD") {
      if (session.status !== "open") return closedPage(res, session);
      return sendHtml(res, 200, checkoutPage(session));
    }
    if (method !== "POST") {
      res.writeHead(405, { allow: "GET, POST" });
      return void res.end();
    }
    const form = parseParams(await readBody(req));
    const field = (name: string) => (typeof form[name] === "string" ? (form[name] as string) : "");
    if (session.status !== "open") {
      // A second press of Pay after the payment went through goes where the first one went.
      const back = successUrlOf(session);
      if (session.status === "complete" && back) return redirect(res, back);
      return closedPage(res, session);
    }
    const state: FormState = { number: field("number"), exp: field("exp"), cvc: field("cvc"), postal: field("postal"), email: field("email") };
    const result = attemptFromFields(session, { number: state.number!, exp: state.exp!, cvc: state.cvc!, postal: state.postal!, email: state.email || null });
    if (result.kind === "field") return sendHtml(res, 400, checkoutPage(session, { ...state, error: { message: result.message, field: result.field } }));
    await store.save();
    sender.schedule();
    if (result.kind === "declined") {
      return sendHtml(res, 402, checkoutPage(session, { ...state, error: { message: result.decline.message, field: null } }));
    }
    const back = successUrlOf(session);
    if (back) return redirect(res, back);
    return closedPage(res, session);
  }

  type Attempt =
    | { kind: "field"; field: "number" | "exp" | "cvc" | "postal" | "email"; message: string }
    | { kind: "declined"; decline: CardDecline }
    | { kind: "paid" };

  function attemptFromFields(session: CheckoutSession, f: { number: string; exp: string; cvc: string; postal: string; email: string | null }, request: RequestInfo = AUTOMATIC): Attempt {
    if (!session.customer_email) {
      const email = (f.email ?? "").trim();
      if (!/^[^\s@]+@[^\s@]+\.[^\s@]+$/.test(email)) return { kind: "field", field: "email", message: "Enter a valid e-mail address for the receipt." };
    }
    const checked = checkCardFields({ number: f.number, exp: f.exp, cvc: f.cvc, postalCode: f.postal });
    if (!checked.ok) return { kind: "field", field: checked.field, message: checked.message };
    const outcome = pay(session, checked.card, f.email?.trim() || null, request);
    return outcome.ok ? { kind: "paid" } : { kind: "declined", decline: outcome.decline };
  }

  // ── Dev control API ─────────────────────────────────────────────────────────────────────
  function isLoopback(req: IncomingMessage): boolean {
    const a = req.socket.remoteAddress ?? "";
    return a === "127.0.0.1" || a === "::1" || a === "::ffff:127.0.0.1" || a.startsWith("127.");
  }

  async function readDevParams(req: IncomingMessage): Promise<Params> {
    const text = await readBody(req);
    if (text.trim() === "") return {};
    if (String(req.headers["content-type"] ?? "").includes("application/json")) {
      let parsed: unknown;
      try {
        parsed = JSON.parse(text);
      } catch {
        throw invalidRequest("The request body must be valid JSON.");
      }
      if (typeof parsed !== "object" || parsed === null || Array.isArray(parsed)) throw invalidRequest("The request body must be a JSON object.");
      const out: Params = {};
      for (const [k, v] of Object.entries(parsed)) if (v !== null && v !== undefined) out[k] = String(v);
      return out;
    }
    return parseParams(text);
  }

  async function handleDev(req: IncomingMessage, res: ServerResponse, url: URL, parts: string[]): Promise<void> {
    const method = req.method ?? "GET";
    try {
      if (!isLoopback(req)) throw invalidRequest("The dev control API answers only on loopback.", undefined, undefined, 403);
      const [, a, b, c] = parts;
      if (a === undefined && method === "GET") return send(res, 200, { data: DEV_API });
      if (a === "deliveries" && b === undefined && method === "GET") {
        const event = url.searchParams.get("event");
        const type = url.searchParams.get("type");
        const status = url.searchParams.get("status");
        const data = store.deliveries
          .newestFirst()
          .filter((d) => (!event || d.eventId === event) && (!type || d.type === type) && (!status || d.status === status));
        return send(res, 200, { data: structuredClone(data) });
      }
      if (a === "deliveries" && b === "flush" && c === undefined && method === "POST") {
        const due = sender.flushNow();
        sender.schedule();
        return send(res, 200, { data: { due } });
      }
      if (a === "events" && b && c === "redeliver" && method === "POST") {
        const event = store.events.get(b);
        if (!event) throw noSuch("event", b, "id");
        const delivery = sender.enqueue(event);
        if (!delivery) throw invalidRequest("This dev payments server has no webhook URL, so nothing can be delivered.");
        const queued = structuredClone(delivery); // as queued: it may be sent before this answer
        await store.save();
        sender.schedule();
        return send(res, 200, { data: queued });
      }
      if (a === "sessions" && b && c === "pay" && method === "POST") {
        const params = await readDevParams(req);
        const session = sessionOrThrow(b);
        if (sweepExpired()) armExpiry();
        if (session.status !== "open") throw invalidRequest(`This Checkout Session is ${session.status}, so it cannot be paid.`, "session", "checkout_session_not_open");
        const year = new Date().getUTCFullYear() + 5;
        const number = (params.card ?? params.number ?? "4242424242424242") as string;
        const digits = number.replace(/\D/g, "");
        const attempt = attemptFromFields(
          session,
          {
            number,
            exp: (params.exp as string | undefined) ?? `12/${String(year).slice(-2)}`,
            cvc: (params.cvc as string | undefined) ?? (/^3[47]/.test(digits) ? "1234" : "123"),
            postal: (params.postal_code as string | undefined) ?? "10001",
            email: (params.email as string | undefined) ?? (session.customer_email ? null : "payer@example.com"),
          },
          { id: newId("req_", 14), idempotencyKey: null },
        );
        if (attempt.kind === "field") throw invalidRequest(attempt.message, attempt.field);
        await store.save();
        sender.schedule();
        const pi = session.payment_intent ? store.paymentIntents.get(session.payment_intent) : undefined;
        const data = { session: publicView(session), payment_intent: pi ? publicView(pi) : null };
        if (attempt.kind === "declined") {
          const d = attempt.decline;
          const err = new StripeApiError(402, {
            type: "card_error",
            code: d.code,
            ...(d.declineCode ? { decline_code: d.declineCode } : {}),
            message: d.message,
            payment_intent: data.payment_intent,
          });
          return send(res, 402, { ...err.body(), data });
        }
        return send(res, 200, { data });
      }
      throw invalidRequest(`Unrecognized dev control URL (${method}: ${url.pathname}).`, undefined, undefined, 404);
    } catch (err) {
      if (err instanceof StripeApiError) return send(res, err.status, err.body());
      throw err;
    }
  }

  async function handle(req: IncomingMessage, res: ServerResponse): Promise<void> {
    const url = new URL(req.url ?? "/", "http://fake.invalid");
    let parts: string[];
    try {
      parts = url.pathname.split("/").filter(Boolean).map((p) => decodeURIComponent(p));
    } catch {
      return send(res, 400, invalidRequest("Invalid percent-encoding in the URL.").body());
    }
    if (url.pathname === "/health") return send(res, 200, { ok: true });
    if (parts[0] === "v1") return handleApi(req, res, url, parts);
    if (parts[0] === "pay" && parts.length === 2) return handlePage(req, res, parts[1]);
    if (parts[0] === "_dev") return handleDev(req, res, url, parts);
    if (url.pathname === "/") return sendHtml(res, 200, statusPage("Dev payments", "A local stand-in for Stripe's API used by Kilowright in demo and tests. Checkout pages live under /pay/.", null));
    return send(res, 404, invalidRequest(`Unrecognized request URL (${req.method}: ${url.pathname}).`, undefined, undefined, 404).body());
  }

  const server = createServer((req, res) => {
    handle(req, res).catch((err: unknown) => {
      console.error("dev payments: unexpected error", err);
      if (!res.headersSent) send(res, 500, { error: { type: "api_error", message: "The dev payments server failed; see its log." } });
      else res.destroy();
    });
  });

  await new Promise<void>((resolve, reject) => {
    server.once("error", reject);
    server.listen(port, host, () => {
      server.off("error", reject);
      resolve();
    });
  });
  const actualPort = (server.address() as AddressInfo).port;
  const urlHost = host.includes(":") ? `[${host}]` : host;
  const url = `http://${urlHost}:${actualPort}`;
  baseUrl = (options.publicUrl ?? url).replace(/\/+$/, "");

  // Sessions made by an earlier run keep their own url; expire what ran out while stopped, and
  // resume the deliveries still pending.
  if (sweepExpired()) await store.save();
  armExpiry();
  sender.schedule();

  return {
    url,
    port: actualPort,
    dataDir,
    deliveries: () => structuredClone(store.deliveries.newestFirst()),
    flushDeliveries: () => {
      sender.flushNow();
      sender.schedule();
    },
    close: async () => {
      closed = true;
      if (expiryTimer) clearTimeout(expiryTimer);
      await sender.close();
      await new Promise<void>((resolve, reject) => {
        server.close((err) => (err ? reject(err) : resolve()));
        server.closeAllConnections();
      });
      await store.flush();
    },
  };
}
