// Helpers for the dev payments server's tests: a fake in a temporary folder, the real Stripe
// SDK pointed at it, and a webhook receiver whose answers a test chooses.
import { mkdtemp, rm } from "node:fs/promises";
import { createServer, type IncomingHttpHeaders, type Server } from "node:http";
import type { AddressInfo } from "node:net";
import { tmpdir } from "node:os";
import path from "node:path";
import Stripe from "stripe";
import { startPaymentsFake, type PaymentsFake, type PaymentsFakeOptions } from "@/fakes/payments-server";

export const API_KEY = "sk_test_fakepay_0123456789abcdef";
export const WEBHOOK_SECRET = "whsec_fakepay_0123456789abcdef";

export async function tempDir(prefix: string): Promise<string> {
  return mkdtemp(path.join(tmpdir(), `kilowright-${prefix}-`));
}

export async function removeDir(dir: string): Promise<void> {
  await rm(dir, { recursive: true, force: true });
}

export function startFake(dataDir: string, webhookUrl: string | null, extra: Partial<PaymentsFakeOptions> = {}): Promise<PaymentsFake> {
  return startPaymentsFake({
    port: 0,
    dataDir,
    apiKey: API_KEY,
    webhookUrl,
    webhookSecret: WEBHOOK_SECRET,
    retry: { initialDelayMs: 50, maxDelayMs: 200, attemptTimeoutMs: 2000 },
    ...extra,
  });
}

/** The official SDK configured as the app configures it for the dev payments server. */
export function sdkFor(fake: { url: string }, key = API_KEY): Stripe {
  const u = new URL(fake.url);
  return new Stripe(key, { host: u.hostname, port: Number(u.port), protocol: "http", maxNetworkRetries: 0, telemetry: false });
}

export interface Received {
  headers: IncomingHttpHeaders;
  body: string;
  at: number;
}

export interface Receiver {
  url: string;
  port: number;
  received: Received[];
  /** Status codes to answer, in order; once used up, defaultStatus. */
  answers: number[];
  defaultStatus: number;
  close(): Promise<void>;
}

/** A webhook endpoint on loopback; `port` reuses a given port (for "the app comes back up"). */
export async function startReceiver(port = 0): Promise<Receiver> {
  const received: Received[] = [];
  const receiver: Receiver = { url: "", port: 0, received, answers: [], defaultStatus: 200, close: async () => undefined };
  const server: Server = createServer((req, res) => {
    const chunks: Buffer[] = [];
    req.on("data", (c: Buffer) => chunks.push(c));
    req.on("end", () => {
      received.push({ headers: req.headers, body: Buffer.concat(chunks).toString("utf8"), at: Date.now() });
      const status = receiver.answers.shift() ?? receiver.defaultStatus;
      res.writeHead(status, { "content-type": "application/json" });
      res.end(JSON.stringify({ received: status < 300 }));
    });
  });
  await new Promise<void>((resolve, reject) => {
    server.once("error", reject);
    server.listen(port, "127.0.0.1", () => resolve());
  });
  receiver.port = (server.address() as AddressInfo).port;
  receiver.url = `http://127.0.0.1:${receiver.port}/api/webhooks/stripe`;
  receiver.close = () =>
    new Promise<void>((resolve) => {
      server.close(() => resolve());
      server.closeAllConnections();
    });
  return receiver;
}

/** A loopback port nobody listens on (for a while): connections to it are refused. */
export async function freePort(): Promise<number> {
  const server = createServer();
  await new Promise<void>((resolve) => server.listen(0, "127.0.0.1", () => resolve()));
  const { port } = server.address() as AddressInfo;
  await new Promise<void>((resolve) => server.close(() => resolve()));
  return port;
}

export async function waitFor<T>(what: string, probe: () => T | undefined | null | false | Promise<T | undefined | null | false>, timeoutMs = 10_000): Promise<T> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const value = await probe();
    if (value) return value;
    if (Date.now() > deadline) throw new Error(`timed out waiting for ${what}`);
    await new Promise((r) => setTimeout(r, 25));
  }
}

/** Verified events a receiver got, parsed by the SDK as the app's webhook route does. */
export function verifiedEvents(receiver: Receiver, stripe: Stripe): Stripe.Event[] {
  return receiver.received.map((r) => stripe.webhooks.constructEvent(r.body, String(r.headers["stripe-signature"]), WEBHOOK_SECRET, 300));
}

export function depositParams(extra: Partial<Stripe.Checkout.SessionCreateParams> = {}): Stripe.Checkout.SessionCreateParams {
  return {
    mode: "payment",
    line_items: [{ quantity: 1, price_data: { currency: "usd", unit_amount: 50_000, product_data: { name: "Deposit for the Prairieline PL-410 system" } } }],
    metadata: { dealId: "7a11a55e-0000-4000-8000-000000000001", proposalId: "7a11a55e-0000-4000-8000-000000000601" },
    payment_intent_data: { metadata: { dealId: "7a11a55e-0000-4000-8000-000000000001" } },
    customer_email: "household@example.com",
    success_url: "http://localhost:3999/p/tok123?paid={CHECKOUT_SESSION_ID}",
    cancel_url: "http://localhost:3999/p/tok123",
    ...extra,
  };
}

/** Posts the hosted page's form as a browser would (no redirect following). */
export async function submitCard(sessionUrl: string, fields: { number: string; exp?: string; cvc?: string; postal?: string; email?: string }): Promise<Response> {
  const year = (new Date().getUTCFullYear() + 3) % 100;
  const form = new URLSearchParams({ exp: `12 / ${year}`, cvc: "123", postal: "68508", ...fields });
  return fetch(sessionUrl, {
    method: "POST",
    headers: { "content-type": "application/x-www-form-urlencoded" },
    body: form.toString(),
    redirect: "manual",
  });
}

export async function devJson(fake: { url: string }, method: string, pathname: string, body?: unknown): Promise<{ status: number; body: any }> {
  const res = await fetch(`${fake.url}${pathname}`, {
    method,
    headers: body === undefined ? {} : { "content-type": "application/json" },
    body: body === undefined ? undefined : JSON.stringify(body),
  });
  return { status: res.status, body: await res.json() };
}
