// The Stripe objects the dev payments server keeps, in the API's documented shapes (only the
// fields Kilowright may read are filled in; the rest are present with their usual empty value).
import { randomBytes } from "node:crypto";

export type Metadata = Record<string, string>;

const ALPHABET = "0123456789ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz";

/** A random id with Stripe's prefix: cs_test_…, pi_…, ch_…, re_…, evt_…, pm_…, txn_…, req_…. */
export function newId(prefix: string, length = 24): string {
  const bytes = randomBytes(length);
  let out = "";
  for (let i = 0; i < length; i++) out += ALPHABET[bytes[i] % ALPHABET.length];
  return `${prefix}${out}`;
}

export const nowSeconds = () => Math.floor(Date.now() / 1000);

export interface LineItem {
  id: string;
  object: "item";
  amount_discount: number;
  amount_subtotal: number;
  amount_tax: number;
  amount_total: number;
  currency: string;
  description: string;
  metadata: Metadata;
  price: {
    id: string;
    object: "price";
    active: boolean;
    currency: string;
    metadata: Metadata;
    product: string;
    type: "one_time";
    unit_amount: number;
    livemode: false;
    created: number;
  };
  quantity: number;
}

export interface CheckoutSession {
  id: string;
  object: "checkout.session";
  after_expiration: null;
  allow_promotion_codes: null;
  amount_subtotal: number;
  amount_total: number;
  automatic_tax: { enabled: false; liability: null; status: null };
  billing_address_collection: null;
  cancel_url: string | null;
  client_reference_id: string | null;
  client_secret: null;
  created: number;
  currency: string;
  customer: null;
  customer_creation: "if_required";
  customer_details: { address: { city: null; country: null; line1: null; line2: null; postal_code: string | null; state: null }; email: string | null; name: string | null; phone: null; tax_exempt: "none"; tax_ids: [] } | null;
  customer_email: string | null;
  expires_at: number;
  invoice: null;
  livemode: false;
  locale: string | null;
  metadata: Metadata;
  mode: "payment";
  payment_intent: string | null;
  payment_link: null;
  payment_method_types: string[];
  payment_status: "unpaid" | "paid" | "no_payment_required";
  status: "open" | "complete" | "expired";
  submit_type: string | null;
  success_url: string | null;
  total_details: { amount_discount: number; amount_shipping: number; amount_tax: number };
  ui_mode: "hosted";
  url: string | null;
  /** Not part of the API object: kept for the hosted page and line-item listing. */
  _line_items: LineItem[];
  /** Not part of the API object: payment_intent_data[…] to copy onto the PaymentIntent. */
  _payment_intent_data: { metadata: Metadata; description: string | null; receipt_email: string | null };
}

export interface PaymentError {
  type: "card_error";
  code: string;
  decline_code?: string;
  message: string;
  doc_url: string;
  charge?: string;
  payment_method: { id: string; object: "payment_method"; type: "card"; card: CardDetails };
}

export interface CardDetails {
  brand: string;
  country: "US";
  exp_month: number;
  exp_year: number;
  funding: "credit";
  last4: string;
}

export interface PaymentIntent {
  id: string;
  object: "payment_intent";
  amount: number;
  amount_capturable: number;
  amount_received: number;
  application: null;
  canceled_at: number | null;
  cancellation_reason: string | null;
  capture_method: "automatic_async";
  client_secret: string;
  confirmation_method: "automatic";
  created: number;
  currency: string;
  customer: null;
  description: string | null;
  last_payment_error: PaymentError | null;
  latest_charge: string | null;
  livemode: false;
  metadata: Metadata;
  next_action: null;
  payment_method: string | null;
  payment_method_types: string[];
  receipt_email: string | null;
  status: "requires_payment_method" | "succeeded" | "canceled";
}

export interface Refund {
  id: string;
  object: "refund";
  amount: number;
  balance_transaction: string;
  charge: string;
  created: number;
  currency: string;
  destination_details: { card: { reference_status: "pending"; reference_type: "acquirer_reference_number"; type: "refund" }; type: "card" };
  metadata: Metadata;
  payment_intent: string;
  reason: "duplicate" | "fraudulent" | "requested_by_customer" | null;
  receipt_number: null;
  source_transfer_reversal: null;
  status: "succeeded";
  transfer_reversal: null;
}

export interface Charge {
  id: string;
  object: "charge";
  amount: number;
  amount_captured: number;
  amount_refunded: number;
  balance_transaction: string | null;
  billing_details: { address: { city: null; country: null; line1: null; line2: null; postal_code: string | null; state: null }; email: string | null; name: null; phone: null };
  captured: boolean;
  created: number;
  currency: string;
  customer: null;
  description: string | null;
  failure_code: string | null;
  failure_message: string | null;
  livemode: false;
  metadata: Metadata;
  outcome: { network_status: string; reason: string | null; risk_level: "normal"; seller_message: string; type: string };
  paid: boolean;
  payment_intent: string;
  payment_method: string;
  payment_method_details: { card: CardDetails & { checks: { address_postal_code_check: "pass"; cvc_check: "pass" | "fail" } }; type: "card" };
  receipt_email: string | null;
  receipt_url: null;
  refunded: boolean;
  refunds: { object: "list"; data: Refund[]; has_more: false; total_count: number; url: string };
  status: "succeeded" | "failed";
}

export interface StripeEvent {
  id: string;
  object: "event";
  api_version: string;
  created: number;
  data: { object: unknown; previous_attributes?: Record<string, unknown> };
  livemode: false;
  pending_webhooks: number;
  request: { id: string | null; idempotency_key: string | null };
  type: string;
}

export interface DeliveryAttempt {
  at: string;
  /** HTTP status, or null when no answer came (connection refused, timeout). */
  status: number | null;
  error: string | null;
  durationMs: number;
  /** The first bytes of the answer, to help whoever reads the log. */
  body: string | null;
}

export interface Delivery {
  id: string;
  eventId: string;
  type: string;
  url: string;
  status: "pending" | "delivered" | "failed";
  attempts: DeliveryAttempt[];
  /** ISO time of the next try (pending only). */
  nextAttemptAt: string | null;
  createdAt: string;
  deliveredAt: string | null;
}

export interface IdempotencyRecord {
  /** `${key}` — the API scopes keys per account; the fake has one account. */
  id: string;
  method: string;
  path: string;
  paramsText: string;
  status: number;
  body: unknown;
  requestId: string;
  createdAt: number;
}

/** Strips the fields the fake keeps for itself (names starting with `_`). */
export function publicView<T extends object>(obj: T): T {
  const copy = structuredClone(obj) as Record<string, unknown>;
  for (const key of Object.keys(copy)) if (key.startsWith("_")) delete copy[key];
  return copy as T;
}

/** Currencies without minor units (amounts are whole units). */
export const ZERO_DECIMAL = new Set(["bif", "clp", "djf", "gnf", "jpy", "kmf", "krw", "mga", "pyg", "rwf", "ugx", "vnd", "vuv", "xaf", "xof", "xpf"]);

export function formatAmount(amount: number, currency: string): string {
  const zero = ZERO_DECIMAL.has(currency);
  try {
    return new Intl.NumberFormat("en-US", { style: "currency", currency: currency.toUpperCase() }).format(zero ? amount : amount / 100);
  } catch {
    return `${(zero ? amount : amount / 100).toFixed(zero ? 0 : 2)} ${currency.toUpperCase()}`;
  }
}
