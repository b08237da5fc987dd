// Set-up for the deposits tests: a private dev payments server (src/fakes/payments-server.ts)
// and dev outbox on free ports, the app's configuration pointed at them before any server
// module reads it, a tiny HTTP receiver that hands deliveries to the real webhook route
// handler, and a signed proposal written straight to the database.
import { mkdtemp, rm } from "node:fs/promises";
import { createServer, type Server } from "node:http";
import type { AddressInfo } from "node:net";
import { tmpdir } from "node:os";
import path from "node:path";
import { and, eq } from "drizzle-orm";
import Stripe from "stripe";
import { deal, household, job, payment, proposal, refund, timelineEvent, webhookEvent, type Stage } from "@/db/schema";
import { startMailFake, type MailFake } from "@/fakes/mail-server";
import { startPaymentsFake, type PaymentsFake } from "@/fakes/payments-server";
import type { ProposalSnapshot } from "@/lib/schemas/proposal";
import type { Member } from "@/server/session";

const ENV_KEYS = ["STRIPE_API_BASE", "RESEND_BASE_URL", "KW_TEST_MAIL_URL"] as const;

export type Harness = {
  fake: PaymentsFake;
  mailUrl: string;
  /** A Stripe client of the test's own (the app's is src/server/stripe.ts). */
  sdk: Stripe;
  stop(): Promise<void>;
};

/**
 * Starts the fakes and points the configuration at them. Call it before importing any server
 * module (they read the configuration once). `webhookUrl` null: the fake keeps its events
 * and delivers nothing (the test delivers them itself).
 */
export async function startHarness(webhookUrl: string | null): Promise<Harness> {
  const saved = Object.fromEntries(ENV_KEYS.map((k) => [k, process.env[k]]));
  const dirs: string[] = [];
  const apiKey = requiredEnv("STRIPE_SECRET_KEY");
  const dataDir = await mkdtemp(path.join(tmpdir(), "kw-deposits-pay-"));
  dirs.push(dataDir);
  const fake = await startPaymentsFake({
    port: 0,
    dataDir,
    apiKey,
    webhookUrl,
    webhookSecret: requiredEnv("STRIPE_WEBHOOK_SECRET"),
    retry: { initialDelayMs: 150, maxDelayMs: 600, attemptTimeoutMs: 5_000 },
  });
  process.env.STRIPE_API_BASE = fake.url;
  let mail: MailFake | null = null;
  let mailUrl = process.env.KW_TEST_MAIL_URL;
  if (!mailUrl) {
    const mailDir = await mkdtemp(path.join(tmpdir(), "kw-deposits-mail-"));
    dirs.push(mailDir);
    mail = await startMailFake({ port: 0, dataDir: mailDir, apiKey: requiredEnv("RESEND_API_KEY") });
    mailUrl = mail.url;
    process.env.KW_TEST_MAIL_URL = mail.url;
    process.env.RESEND_BASE_URL = mail.url;
  }
  const base = new URL(fake.url);
  const sdk = new Stripe(apiKey, { host: base.hostname, port: Number(base.port), protocol: "http", maxNetworkRetries: 0, telemetry: false });
  return {
    fake,
    mailUrl,
    sdk,
    async stop() {
      await fake.close();
      await mail?.close();
      for (const k of ENV_KEYS) {
        if (saved[k] === undefined) delete process.env[k];
        else process.env[k] = saved[k];
      }
      await Promise.all(dirs.map((d) => rm(d, { recursive: true, force: true })));
    },
  };
}

function requiredEnv(name: string): string {
  const v = process.env[name];
  if (!v) throw new Error(`${name} must be set for the deposits tests (run them through scripts/test.ts, which sets it for the test instance in scripts/lib/instance.ts)`);
  return v;
}

/** A free loopback port (listen on 0, note it, close). */
export async function freePort(): Promise<number> {
  const s = createServer();
  await new Promise<void>((r) => s.listen(0, "127.0.0.1", r));
  const { port } = s.address() as AddressInfo;
  await new Promise<void>((r) => s.close(() => r()));
  return port;
}

export type Receiver = { url: string; port: number; statuses: number[]; close(): Promise<void> };

/** A small HTTP server that hands each POST to the app's webhook route handler, as Next would. */
export async function startReceiver(port = 0): Promise<Receiver> {
  const { POST } = await import("@/app/api/webhooks/stripe/route");
  const statuses: number[] = [];
  const server: Server = createServer((req, res) => {
    const chunks: Buffer[] = [];
    req.on("data", (c: Buffer) => chunks.push(c));
    req.on("end", () => {
      const headers = new Headers();
      for (const [k, v] of Object.entries(req.headers)) if (typeof v === "string") headers.set(k, v);
      const request = new Request(`http://127.0.0.1${req.url ?? "/"}`, { method: req.method, headers, body: Buffer.concat(chunks).toString("utf8") });
      POST(request)
        .then(async (response) => {
          statuses.push(response.status);
          res.writeHead(response.status, { "content-type": "application/json" });
          res.end(await response.text());
        })
        .catch((err: unknown) => {
          statuses.push(500);
          res.writeHead(500);
          res.end(String(err));
        });
    });
  });
  await new Promise<void>((r) => server.listen(port, "127.0.0.1", r));
  const actual = (server.address() as AddressInfo).port;
  return {
    url: `http://127.0.0.1:${actual}/api/webhooks/stripe`,
    port: actual,
    statuses,
    close: () =>
      new Promise<void>((r) => {
        server.close(() => r());
        server.closeAllConnections();
      }),
  };
}

/** Signs a payload as the provider does (or with another secret / an old timestamp) and posts it to the route handler. */
export async function deliver(payload: string, opts: { secret?: string; timestamp?: number; signature?: string | null } = {}): Promise<{ status: number; body: unknown }> {
  const { POST } = await import("@/app/api/webhooks/stripe/route");
  const sdk = Stripe.webhooks;
  const header =
    opts.signature === undefined
      ? sdk.generateTestHeaderString({ payload, secret: opts.secret ?? requiredEnv("STRIPE_WEBHOOK_SECRET"), timestamp: opts.timestamp })
      : opts.signature;
  const headers = new Headers({ "content-type": "application/json" });
  if (header !== null) headers.set("stripe-signature", header);
  const res = await POST(new Request("http://127.0.0.1/api/webhooks/stripe", { method: "POST", headers, body: payload }));
  return { status: res.status, body: await res.json() };
}

/** The newest event of a type about an object, from the provider's own list. */
export async function eventFor(sdk: Stripe, type: string, objectId: string): Promise<Stripe.Event> {
  for await (const e of sdk.events.list({ type, limit: 100 })) {
    const obj = e.data.object as { id?: string };
    if (obj.id === objectId) return e;
  }
  throw new Error(`no ${type} event for ${objectId}`);
}

export const payload = (event: unknown) => JSON.stringify(event, null, 2);

/** Pays an open session through the dev API (no browser); returns the PaymentIntent id. */
export async function payWithCard(fake: PaymentsFake, sessionId: string, card = "4242424242424242"): Promise<{ status: number; paymentIntentId: string | null }> {
  const res = await fetch(`${fake.url}/_dev/sessions/${sessionId}/pay`, {
    method: "POST",
    headers: { "content-type": "application/json" },
    body: JSON.stringify({ card }),
  });
  const body = (await res.json()) as { data?: { payment_intent?: { id: string } | null } };
  return { status: res.status, paymentIntentId: body.data?.payment_intent?.id ?? null };
}

export async function waitFor<T>(what: string, probe: () => Promise<T | null | undefined | false>, timeoutMs = 15_000): Promise<T> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const v = await probe();
    if (v) return v;
    if (Date.now() > deadline) throw new Error(`timed out waiting for ${what}`);
    await new Promise((r) => setTimeout(r, 100));
  }
}

export type SignedProposal = { token: string; proposalId: string; dealId: string; number: number; email: string };

/** A deal at Signed with a signed proposal whose chosen offer asks `depositCents`. */
export async function signedProposal(
  owner: Member,
  opts: { depositCents?: number; stage?: Stage; status?: "signed" | "sent" | "cancelled"; rep?: Member; locale?: "en" | "es" } = {},
): Promise<SignedProposal> {
  const { db } = await import("@/server/db");
  const { newLinkToken } = await import("@/server/tokens");
  const rep = opts.rep ?? owner;
  const householdId = crypto.randomUUID();
  const dealId = crypto.randomUUID();
  const proposalId = crypto.randomUUID();
  const number = 1000 + Math.floor(Math.random() * 8_000_000);
  const email = `customer-${number}@deposits-test.example`;
  await db().insert(household).values({
    id: householdId,
    companyId: owner.companyId,
    name: `Testfield ${number} household`,
    contactName: "Wren Testfield",
    email,
    street: "8 Ledger Lane",
    city: "Testville",
    region: "NC",
    postalCode: "27000",
    latitude: 36,
    longitude: -80,
  });
  await db().insert(deal).values({ id: dealId, companyId: owner.companyId, householdId, ownerUserId: rep.userId, stage: opts.stage ?? "signed", source: "Referral" });
  const snapshot = {
    version: 1,
    takenAt: new Date().toISOString(),
    company: { name: owner.companyName, licenseNumber: "NC-TEST-1" },
    rep: { name: rep.name, email: rep.email },
    household: { name: `Testfield ${number} household`, contactName: "Wren Testfield", email, phone: null, street: "8 Ledger Lane", city: "Testville", region: "NC", postalCode: "27000", latitude: 36, longitude: -80 },
    utilityName: null,
    usage: { monthlyKwh: Array(12).fill(900), source: "bills" },
    assumptions: [],
    offers: [
      {
        position: 1,
        name: "Whole roof, cash",
        inputs: {},
        figures: { summary: { contractCents: 2_400_000 } },
        equipment: {},
        depositCents: opts.depositCents ?? 100_000,
      },
    ],
    cautions: [],
  } as unknown as ProposalSnapshot;
  const { token, hash } = newLinkToken();
  const status = opts.status ?? "signed";
  await db().insert(proposal).values({
    id: proposalId,
    companyId: owner.companyId,
    dealId,
    number,
    version: 1,
    status,
    snapshot,
    pdfStorageKey: `test/${proposalId}.pdf`,
    pdfSha256: "0".repeat(64),
    tokenHash: hash,
    expiresAt: new Date(Date.now() + 30 * 86_400_000),
    sentToEmail: email,
    inHomeSale: true,
    locale: opts.locale ?? "en",
    chosenPosition: status === "sent" ? null : 1,
    signedAt: status === "sent" ? null : new Date(),
    signerName: status === "sent" ? null : "Wren Testfield",
    signerEmail: status === "sent" ? null : email,
    cancelDeadline: status === "sent" ? null : "2099-12-31",
    cancelledAt: status === "cancelled" ? new Date() : null,
  });
  return { token, proposalId, dealId, number, email };
}

/** Everything the ledger holds about a deal, for before/after comparisons. */
export async function ledgerOf(companyId: string, dealId: string) {
  const { db } = await import("@/server/db");
  const payments = await db().select().from(payment).where(and(eq(payment.companyId, companyId), eq(payment.dealId, dealId)));
  const refunds = await db().select().from(refund).where(and(eq(refund.companyId, companyId), eq(refund.dealId, dealId)));
  const [d] = await db().select({ stage: deal.stage }).from(deal).where(eq(deal.id, dealId));
  const jobs = await db().select({ id: job.id }).from(job).where(and(eq(job.companyId, companyId), eq(job.dealId, dealId)));
  const events = await db().select({ kind: timelineEvent.kind, data: timelineEvent.data }).from(timelineEvent).where(and(eq(timelineEvent.companyId, companyId), eq(timelineEvent.dealId, dealId)));
  return {
    payments,
    refunds,
    stage: d.stage,
    jobs: jobs.length,
    paidEvents: events.filter((e) => e.kind === "deposit.paid").length,
    stageMoves: events.filter((e) => e.kind === "stage.moved").length,
    refundEvents: events.filter((e) => e.kind === "deposit.refunded").length,
  };
}

export async function webhookEventCount(id: string): Promise<number> {
  const { db } = await import("@/server/db");
  return (await db().select().from(webhookEvent).where(eq(webhookEvent.id, id))).length;
}

/** Messages in the dev outbox addressed to one address. */
export async function outboxTo(mailUrl: string, to: string): Promise<{ subject: string; text: string | null }[]> {
  const res = await fetch(`${mailUrl}/dev/messages?to=${encodeURIComponent(to)}&limit=50`, { headers: { Authorization: `Bearer ${requiredEnv("RESEND_API_KEY")}` } });
  const body = (await res.json()) as { data: { subject: string; text: string | null }[] };
  return body.data;
}
