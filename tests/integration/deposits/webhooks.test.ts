// The webhook route handler against a real MariaDB and the dev payments server: events paid
// through the fake are delivered by the test itself (the fake sends nothing here), signed as
// the provider signs them, replayed, reordered, tampered with.
import { eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { payment, webhookEvent } from "@/db/schema";
import type { Member } from "@/server/session";
import { newCompany } from "../support/fixtures";
import {
  deliver,
  eventFor,
  ledgerOf,
  outboxTo,
  payload,
  payWithCard,
  signedProposal,
  startHarness,
  waitFor,
  webhookEventCount,
  type Harness,
} from "./support";

let h: Harness;
let owner: Member;
let payments: typeof import("@/server/payments");
let dbm: typeof import("@/server/db");

beforeAll(async () => {
  h = await startHarness(null);
  payments = await import("@/server/payments");
  dbm = await import("@/server/db");
  owner = await newCompany("Webhook Test Solar");
});

afterAll(async () => {
  await h?.stop();
});

/** A signed proposal, its checkout session, paid with a card at the fake (no webhook sent). */
async function paidSession(card = "4242424242424242", depositCents = 100_000) {
  const p = await signedProposal(owner, { depositCents });
  const { paymentId } = await payments.startDepositCheckout(p.token);
  const [row] = await dbm.db().select().from(payment).where(eq(payment.id, paymentId));
  const paid = await payWithCard(h.fake, row.checkoutSessionId, card);
  return { ...p, paymentId, sessionId: row.checkoutSessionId, paymentIntentId: paid.paymentIntentId as string, payStatus: paid.status };
}

describe("POST /api/webhooks/stripe", () => {
  it("books one payment when the same signed event arrives 20 times (in a row and at once)", async () => {
    const s = await paidSession();
    const completed = await eventFor(h.sdk, "checkout.session.completed", s.sessionId);
    const body = payload(completed);

    const first = await deliver(body);
    expect(first.status).toBe(200);
    expect(first.body).toMatchObject({ received: true, status: "processed", outcome: "booked" });
    for (let i = 0; i < 9; i++) expect((await deliver(body)).status).toBe(200);
    const concurrent = await Promise.all(Array.from({ length: 10 }, () => deliver(body)));
    expect(concurrent.map((r) => r.status)).toEqual(Array(10).fill(200));
    expect(concurrent.every((r) => (r.body as { status: string }).status === "duplicate")).toBe(true);

    // The provider's other event about the same payment books nothing more either.
    const succeeded = await eventFor(h.sdk, "payment_intent.succeeded", s.paymentIntentId);
    for (let i = 0; i < 3; i++) expect((await deliver(payload(succeeded))).status).toBe(200);

    const l = await ledgerOf(owner.companyId, s.dealId);
    expect(l.payments).toHaveLength(1);
    expect(l.payments[0]).toMatchObject({ status: "paid", paidCents: 100_000, refundedCents: 0, paymentIntentId: s.paymentIntentId });
    expect(l.payments[0].chargeId).toMatch(/^ch_/);
    expect(l.payments[0].paidAt).toBeInstanceOf(Date);
    expect(l.stage).toBe("deposit_paid");
    expect(l.paidEvents).toBe(1);
    expect(l.stageMoves).toBe(1);
    expect(l.jobs).toBe(1);
    expect(await webhookEventCount(completed.id)).toBe(1);
    // One receipt, sent after the commit.
    const mails = await waitFor("the receipt", async () => {
      const m = (await outboxTo(h.mailUrl, s.email)).filter((x) => /^Deposit received/.test(x.subject));
      return m.length ? m : null;
    });
    expect(mails).toHaveLength(1);
    expect(mails[0].subject).toContain("$1,000.00");
  });

  it("answers 400 and writes nothing for a bad, stale, missing or tampered signature", async () => {
    const s = await paidSession();
    const completed = await eventFor(h.sdk, "checkout.session.completed", s.sessionId);
    const body = payload(completed);

    const wrongSecret = await deliver(body, { secret: "whsec_not_the_endpoint_secret" });
    expect(wrongSecret.status).toBe(400);
    expect(wrongSecret.body).toMatchObject({ error: { code: "bad_signature" } });
    const stale = await deliver(body, { timestamp: Math.floor(Date.now() / 1000) - 10 * 60 });
    expect(stale.status).toBe(400);
    expect((await deliver(body, { signature: null })).status).toBe(400);
    expect((await deliver(body, { signature: "t=1,v1=deadbeef" })).status).toBe(400);
    // A valid signature over the original body, sent with one amount changed.
    const { POST } = await import("@/app/api/webhooks/stripe/route");
    const { default: Stripe } = await import("stripe");
    const header = Stripe.webhooks.generateTestHeaderString({ payload: body, secret: process.env.STRIPE_WEBHOOK_SECRET as string });
    const tampered = body.replace(/"amount_total": 100000/, '"amount_total": 1');
    expect(tampered).not.toBe(body);
    const res = await POST(new Request("http://127.0.0.1/api/webhooks/stripe", { method: "POST", headers: { "stripe-signature": header }, body: tampered }));
    expect(res.status).toBe(400);

    expect(await webhookEventCount(completed.id)).toBe(0);
    const l = await ledgerOf(owner.companyId, s.dealId);
    expect(l.payments[0]).toMatchObject({ status: "open", paidCents: null });
    expect(l.stage).toBe("signed");
    expect(l.jobs).toBe(0);
  });

  it("answers 200 to event types outside the allow-list and records nothing", async () => {
    const s = await paidSession();
    const charge = await eventFor(h.sdk, "charge.succeeded", (await h.sdk.paymentIntents.retrieve(s.paymentIntentId)).latest_charge as string);
    const res = await deliver(payload(charge));
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ status: "ignored" });
    expect(await webhookEventCount(charge.id)).toBe(0);
  });

  it("ends consistent when the refund event arrives before the payment's events", async () => {
    // Two identical payments, each refunded in part at the provider; one delivered in order, one reversed.
    const inOrder = await paidSession();
    const reversed = await paidSession();
    for (const s of [inOrder, reversed]) await h.sdk.refunds.create({ payment_intent: s.paymentIntentId, amount: 30_000, metadata: { reason: "Partial refund at the provider" } });

    const eventsOf = async (s: typeof inOrder) => {
      const pi = await h.sdk.paymentIntents.retrieve(s.paymentIntentId);
      return {
        succeeded: await eventFor(h.sdk, "payment_intent.succeeded", s.paymentIntentId),
        completed: await eventFor(h.sdk, "checkout.session.completed", s.sessionId),
        refunded: await eventFor(h.sdk, "charge.refunded", pi.latest_charge as string),
      };
    };
    const a = await eventsOf(inOrder);
    for (const e of [a.succeeded, a.completed, a.refunded]) expect((await deliver(payload(e))).status).toBe(200);

    const b = await eventsOf(reversed);
    const early = await deliver(payload(b.refunded));
    expect(early.status).toBe(200);
    const afterRefundOnly = await ledgerOf(owner.companyId, reversed.dealId);
    expect(afterRefundOnly.payments[0]).toMatchObject({ status: "partially_refunded", paidCents: 100_000, refundedCents: 30_000 });
    for (const e of [b.completed, b.succeeded]) expect((await deliver(payload(e))).status).toBe(200);

    const x = await ledgerOf(owner.companyId, inOrder.dealId);
    const y = await ledgerOf(owner.companyId, reversed.dealId);
    for (const l of [x, y]) {
      expect(l.payments).toHaveLength(1);
      expect(l.payments[0]).toMatchObject({ status: "partially_refunded", paidCents: 100_000, refundedCents: 30_000 });
      expect(l.payments[0].chargeId).toMatch(/^ch_/);
      expect(l.refunds).toHaveLength(1);
      expect(l.refunds[0]).toMatchObject({ amountCents: 30_000, status: "succeeded", reason: "Partial refund at the provider" });
      expect(l.stage).toBe("deposit_paid");
      expect(l.jobs).toBe(1);
      expect(l.paidEvents).toBe(1);
      expect(l.refundEvents).toBe(1);
    }
  });

  it("flags an amount mismatch for the office and books nothing", async () => {
    const s = await paidSession();
    const completed = await eventFor(h.sdk, "checkout.session.completed", s.sessionId);
    // The provider reports a different amount than the deposit asked (e.g. an edited session).
    const odd = structuredClone(completed) as unknown as { id: string; data: { object: { amount_total: number } } };
    odd.id = `${completed.id}_short`;
    odd.data.object.amount_total = 50_000;
    const res = await deliver(payload(odd));
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ outcome: "flagged" });

    // The true event afterwards changes nothing: the office decides.
    const succeeded = await eventFor(h.sdk, "payment_intent.succeeded", s.paymentIntentId);
    expect((await deliver(payload(succeeded))).status).toBe(200);

    const l = await ledgerOf(owner.companyId, s.dealId);
    expect(l.payments[0].status).toBe("flagged");
    expect(l.payments[0].flagReason).toMatch(/\$500\.00.*\$1,000\.00/);
    expect(l.stage).toBe("signed");
    expect(l.jobs).toBe(0);
    expect(l.paidEvents).toBe(0);
    const [rec] = await dbm.db().select().from(webhookEvent).where(eq(webhookEvent.id, odd.id));
    expect(rec.outcome).toBe("flagged");
    expect((await outboxTo(h.mailUrl, s.email)).filter((m) => /^Deposit received/.test(m.subject))).toHaveLength(0);

    // The customer's page says the office is checking it.
    const view = await payments.getDepositForCustomer(s.token);
    expect(view).toMatchObject({ status: "flagged", canPay: false });
  });

  it("records a declined card as failed, and books the later good card on the same session", async () => {
    const p = await signedProposal(owner);
    const { paymentId } = await payments.startDepositCheckout(p.token);
    const [row] = await dbm.db().select().from(payment).where(eq(payment.id, paymentId));
    const declined = await payWithCard(h.fake, row.checkoutSessionId, "4000000000000002");
    expect(declined.status).toBe(402);
    const failed = await eventFor(h.sdk, "payment_intent.payment_failed", declined.paymentIntentId as string);
    expect((await deliver(payload(failed))).status).toBe(200);
    const view = await payments.getDepositForCustomer(p.token);
    expect(view).toMatchObject({ status: "failed", canPay: true });
    expect(view?.failureMessage).toMatch(/declined/i);

    // Retry reuses the still-open session; the good card books it.
    const again = await payments.startDepositCheckout(p.token);
    expect(again).toMatchObject({ paymentId, reused: true });
    const ok = await payWithCard(h.fake, row.checkoutSessionId);
    expect(ok.status).toBe(200);
    const completed = await eventFor(h.sdk, "checkout.session.completed", row.checkoutSessionId);
    expect((await deliver(payload(completed))).status).toBe(200);
    // A late duplicate of the failure does not undo the payment.
    expect((await deliver(payload(failed))).status).toBe(200);
    const l = await ledgerOf(owner.companyId, p.dealId);
    expect(l.payments).toHaveLength(1);
    expect(l.payments[0]).toMatchObject({ status: "paid", failureMessage: null });
    expect(l.stage).toBe("deposit_paid");
  });

  it("marks an expired session and lets the customer start a new one", async () => {
    const p = await signedProposal(owner);
    const first = await payments.startDepositCheckout(p.token);
    const [row] = await dbm.db().select().from(payment).where(eq(payment.id, first.paymentId));
    await h.sdk.checkout.sessions.expire(row.checkoutSessionId);
    const expired = await eventFor(h.sdk, "checkout.session.expired", row.checkoutSessionId);
    expect((await deliver(payload(expired))).status).toBe(200);
    expect((await payments.getDepositForCustomer(p.token))?.status).toBe("expired");
    const second = await payments.startDepositCheckout(p.token);
    expect(second.reused).toBe(false);
    expect(second.paymentId).not.toBe(first.paymentId);
    expect(second.url).not.toBe(first.url);
  });

  it("answers 500 (so the provider retries) when the ledger write fails, and books on the retry", async () => {
    const s = await paidSession();
    const completed = await eventFor(h.sdk, "checkout.session.completed", s.sessionId);
    // Make the ledger write fail for a moment: the Timeline table is away.
    await dbm.pool().query("RENAME TABLE timeline_event TO timeline_event_away");
    const logged = vi.spyOn(console, "error").mockImplementation(() => undefined);
    try {
      const failed = await deliver(payload(completed));
      expect(failed.status).toBe(500);
      expect(await webhookEventCount(completed.id)).toBe(0);
      const [row] = await dbm.db().select().from(payment).where(eq(payment.id, s.paymentId));
      expect(row.status).toBe("open");
      expect(logged).toHaveBeenCalled();
    } finally {
      logged.mockRestore();
      await dbm.pool().query("RENAME TABLE timeline_event_away TO timeline_event");
    }
    const retry = await deliver(payload(completed));
    expect(retry.status).toBe(200);
    const l = await ledgerOf(owner.companyId, s.dealId);
    expect(l.payments[0].status).toBe("paid");
    expect(l.paidEvents).toBe(1);
  });
});
