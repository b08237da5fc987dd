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
//
// Modules (src/fakes/payments/): context (shared state), params (reading parameters), sessions,
// paying (PaymentIntents and Charges), refunds, events, lists (lists and expand[]), api (routing,
// idempotency, keys), http (bodies and answers), hosted-page, dev-api; store, webhooks, form,
// cards, objects, errors and page hold the state file, deliveries, form decoding, test cards,
// object shapes, errors and the page's HTML.
import type { IncomingMessage, ServerResponse } from "node:http";
import { createServer } from "node:http";
import path from "node:path";
import { closeServer, listenOn } from "./listen";
import { handleApi } from "./payments/api";
import type { FakeContext } from "./payments/context";
import { handleDev } from "./payments/dev-api";
import { invalidRequest } from "./payments/errors";
import { handlePage } from "./payments/hosted-page";
import { send, sendHtml } from "./payments/http";
import type { Delivery } from "./payments/objects";
import { statusPage } from "./payments/page";
import { armExpiry, sweepExpired } from "./payments/sessions";
import { PaymentsStore } from "./payments/store";
import { WebhookSender, type RetryOptions } from "./payments/webhooks";

export { API_VERSION } from "./payments/context";

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


export async function startPaymentsFake(options: PaymentsFakeOptions): Promise<PaymentsFake> {
  const { port, host = "127.0.0.1", apiKey, webhookSecret } = options;
  if (!apiKey) throw new Error("startPaymentsFake: apiKey is required");
  if (options.webhookUrl && !webhookSecret) throw new Error("startPaymentsFake: webhookSecret is required with a webhookUrl");
  const dataDir = path.resolve(options.dataDir);
  const store = new PaymentsStore(dataDir);
  await store.load();
  const ctx: FakeContext = {
    store,
    sender: new WebhookSender(store, options.webhookUrl || null, webhookSecret, options.retry, options.log),
    webhookEvents: new Set(options.webhookEvents ?? DEFAULT_WEBHOOK_EVENTS),
    apiKey,
    baseUrl: "", // set once listening
    expiryTimer: null,
    closed: false,
  };

  const server = createServer((req, res) => {
    handle(ctx, req, res).catch((err: unknown) => {
      console.error("dev payments: unexpected error", err);
      if (!res.headersSent) send(res, 500, { error: { type: "api_error", message: "The dev payments server failed; see its log." } });
      else res.destroy();
    });
  });

  const url = await listenOn(server, port, host);
  ctx.baseUrl = (options.publicUrl ?? url).replace(/\/+$/, "");

  // Sessions made by an earlier run keep their own url; expire what ran out while stopped, and
  // resume the deliveries still pending.
  if (sweepExpired(ctx)) await store.save();
  armExpiry(ctx);
  ctx.sender.schedule();

  return {
    url,
    port: Number(new URL(url).port),
    dataDir,
    deliveries: () => structuredClone(store.deliveries.newestFirst()),
    flushDeliveries: () => {
      ctx.sender.flushNow();
      ctx.sender.schedule();
    },
    close: async () => {
      ctx.closed = true;
      if (ctx.expiryTimer) clearTimeout(ctx.expiryTimer);
      await ctx.sender.close();
      await closeServer(server);
      await store.flush();
    },
  };
}

/** One request: the API under /v1, the hosted page under /pay, the dev control API under /_dev. */
async function handle(ctx: FakeContext, req: IncomingMessage, res: ServerResponse): Promise<void> {
  const url = new URL(req.url ?? "/", "http://fake.invalid");
  let parts: string[];
  try {
    parts = url.pathname.split("/").filter(Boolean).map((p) => decodeURIComponent(p));
  } catch {
    return send(res, 400, invalidRequest("Invalid percent-encoding in the URL.").body());
  }
  if (url.pathname === "/health") return send(res, 200, { ok: true });
  if (parts[0] === "v1") return handleApi(ctx, req, res, url, parts);
  if (parts[0] === "pay" && parts.length === 2) return handlePage(ctx, req, res, parts[1]);
  if (parts[0] === "_dev") return handleDev(ctx, req, res, url, parts);
  if (url.pathname === "/") return sendHtml(res, 200, statusPage("Dev payments", "A local stand-in for Stripe's API used by Kilowright in demo and tests. Checkout pages live under /pay/.", null));
  return send(res, 404, invalidRequest(`Unrecognized request URL (${req.method}: ${url.pathname}).`, undefined, undefined, 404).body());
}
