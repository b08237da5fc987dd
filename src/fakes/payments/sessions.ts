import { invalidParam, invalidRequest, missingParam, noSuch } from "./errors";
import type { ParamValue } from "./form";
import { newId, nowSeconds, type CheckoutSession, type LineItem } from "./objects";
import { type ApiCall, type ApiResult, AUTOMATIC, type FakeContext, ok, type RequestInfo } from "./context";
import { emit } from "./events";
import { currencyOf, int, list, LIST_PARAMS, metadataOf, obj, onlyKnown, type Params, str, urlOf } from "./params";
import { one, listOf } from "./lists";

// ── Checkout Sessions ──────────────────────────────────────────────

const MIN_EXPIRY_S = 30 * 60;
const MAX_EXPIRY_S = 24 * 3600;

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

/** The session's mode: the service's three are known, only payment is served. */
function checkMode(params: Params): void {
  const mode = str(params, "mode");
  if (mode === null) throw missingParam("mode");
  if (!["payment", "subscription", "setup"].includes(mode)) {
    throw invalidParam("mode", `Invalid mode: must be one of payment, setup, or subscription`, "parameter_invalid_string");
  }
  if (mode !== "payment") throw invalidParam("mode", `The dev payments server supports only mode=payment (got ${mode}).`);
}

/** The line items, their one currency and their total, checked against the service's limits. */
function sessionItems(params: Params, now: number): { items: LineItem[]; currency: string; amount: number } {
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
  return { items, currency, amount };
}

/** expires_at: 24 hours when not given, else between 30 minutes and 24 hours from now (a minute's slack each way). */
function expiresAtOf(params: Params, now: number): number {
  const expiresAt = int(params, "expires_at");
  if (expiresAt === null) return now + MAX_EXPIRY_S;
  if (expiresAt < now + MIN_EXPIRY_S - 60) {
    throw invalidParam("expires_at", "The `expires_at` timestamp must be at least 30 minutes from Checkout Session creation.", "parameter_invalid_integer");
  } else if (expiresAt > now + MAX_EXPIRY_S + 60) {
    throw invalidParam("expires_at", "The `expires_at` timestamp must be less than 24 hours from Checkout Session creation.", "parameter_invalid_integer");
  }
  return expiresAt;
}

/** POST /v1/checkout/sessions: the session object, field by field as the service shows it. */
export function createSession(ctx: FakeContext, params: Params): CheckoutSession {
  onlyKnown(params, SESSION_CREATE_PARAMS);
  const now = nowSeconds();
  checkMode(params);
  const { items, currency, amount } = sessionItems(params, now);
  const successUrl = urlOf(str(params, "success_url", { max: 5000 }), "success_url");
  const cancelUrl = urlOf(str(params, "cancel_url", { max: 5000 }), "cancel_url");
  const customerEmail = str(params, "customer_email", { max: 800 });
  if (customerEmail !== null && !/^[^\s@]+@[^\s@]+\.[^\s@]+$/.test(customerEmail)) throw invalidParam("customer_email", `Invalid email address: ${customerEmail}`, "email_invalid");
  const clientReferenceId = str(params, "client_reference_id", { max: 200 });
  const expiresAt = expiresAtOf(params, now);
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
    url: `${ctx.baseUrl}/pay/${id}`,
    _line_items: items,
    _payment_intent_data: {
      metadata: metadataOf(piData, "metadata", "payment_intent_data[metadata]"),
      description: str(piData, "description", { param: "payment_intent_data[description]", max: 1000 }),
      receipt_email: str(piData, "receipt_email", { param: "payment_intent_data[receipt_email]" }),
    },
  };
  ctx.store.sessions.add(session);
  armExpiry(ctx);
  return session;
}

export function sessionOrThrow(ctx: FakeContext, id: string): CheckoutSession {
  const s = ctx.store.sessions.get(id);
  if (!s) throw noSuch("checkout.session", id, "session");
  return s;
}

export function expireSession(ctx: FakeContext, session: CheckoutSession, request: RequestInfo): void {
  session.status = "expired";
  session.url = null;
  if (session.payment_intent) {
    const pi = ctx.store.paymentIntents.get(session.payment_intent);
    if (pi && pi.status === "requires_payment_method") {
      pi.status = "canceled";
      pi.canceled_at = nowSeconds();
      pi.cancellation_reason = "abandoned";
      emit(ctx, "payment_intent.canceled", pi, request);
    }
  }
  emit(ctx, "checkout.session.expired", session, request);
}

/** Expires open sessions whose expires_at has passed, then re-arms the timer. */
export function sweepExpired(ctx: FakeContext): boolean {
  const now = nowSeconds();
  let changed = false;
  for (const s of ctx.store.sessions.all()) {
    if (s.status === "open" && s.expires_at <= now) {
      expireSession(ctx, s, AUTOMATIC);
      changed = true;
    }
  }
  return changed;
}

export function armExpiry(ctx: FakeContext): void {
  if (ctx.closed) return;
  if (ctx.expiryTimer) clearTimeout(ctx.expiryTimer);
  ctx.expiryTimer = null;
  let next = Infinity;
  for (const s of ctx.store.sessions.all()) if (s.status === "open") next = Math.min(next, s.expires_at);
  if (next === Infinity) return;
  const wait = Math.max(0, Math.min(next * 1000 - Date.now() + 50, 2 ** 31 - 1));
  ctx.expiryTimer = setTimeout(() => {
    ctx.expiryTimer = null;
    if (sweepExpired(ctx)) void ctx.store.save().then(() => ctx.sender.schedule());
    armExpiry(ctx);
  }, wait);
  ctx.expiryTimer.unref?.();
}

/** /v1/checkout/sessions[/:id[/expire|/line_items]] */
export function routeSessions(ctx: FakeContext, call: ApiCall): ApiResult {
  const { method, parts, params, request, unrecognized } = call;
  const [, , , b, c] = parts; // /v1/checkout/sessions/:id/…
  if (b === undefined) {
    if (method === "POST") return ok(one(ctx, "checkout.session", createSession(ctx, params), params));
    if (method === "GET") {
      onlyKnown(params, [...LIST_PARAMS, "status", "payment_intent", "customer_details", "payment_link", "customer", "subscription"]);
      const status = str(params, "status");
      const piFilter = str(params, "payment_intent");
      return ok(
        listOf(ctx, "checkout.session", ctx.store.sessions.newestFirst(), params, "/v1/checkout/sessions", (s) => (status === null || s.status === status) && (piFilter === null || s.payment_intent === piFilter)),
      );
    }
    throw unrecognized();
  }
  const session = sessionOrThrow(ctx, b);
  if (c === undefined && method === "GET") {
    onlyKnown(params, ["expand"]);
    return ok(one(ctx, "checkout.session", session, params));
  }
  if (c === "expire" && method === "POST" && parts.length === 5) {
    onlyKnown(params, ["expand"]);
    if (session.status !== "open") {
      throw invalidRequest(`Only Checkout Sessions with a status in ["open"] can be expired. This Checkout Session has a status of "${session.status}".`, "session");
    }
    expireSession(ctx, session, request);
    armExpiry(ctx);
    return ok(one(ctx, "checkout.session", session, params));
  }
  if (c === "line_items" && method === "GET" && parts.length === 5) {
    onlyKnown(params, LIST_PARAMS);
    const items = [...session._line_items].map((li) => ({ ...li, created: 0 }));
    const listed = listOf(ctx, "item", items, params, `/v1/checkout/sessions/${session.id}/line_items`);
    return ok({ ...listed, data: (listed.data as Record<string, unknown>[]).map(({ created: _created, ...li }) => li) });
  }
  throw unrecognized();
}
