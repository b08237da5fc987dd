// The customer's Pay button against a real MariaDB and the dev payments server: one Checkout
// Session however often Pay is pressed, the session's contents, and the refusals.
import { and, eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { payment } from "@/db/schema";
import type { Member } from "@/server/session";
import { newCompany } from "../support/fixtures";
import { ledgerOf, payWithCard, signedProposal, startHarness, startReceiver, waitFor, type Harness, type Receiver } from "./support";

let h: Harness;
let receiver: Receiver;
let owner: Member;
let payments: typeof import("@/server/payments");
let dbm: typeof import("@/server/db");
let route: typeof import("@/app/api/public/proposals/[token]/deposit/route");

const ctx = (token: string) => ({ params: Promise.resolve({ token }) });
const post = async (token: string) => {
  const res = await route.POST(new Request(`http://127.0.0.1/api/public/proposals/${token}/deposit`, { method: "POST", headers: { Origin: process.env.APP_URL ?? "" } }), ctx(token));
  return { status: res.status, body: (await res.json()) as { data?: { url: string; reused: boolean }; error?: { code: string; message: string } } };
};
const get = async (token: string) => {
  const res = await route.GET(new Request(`http://127.0.0.1/api/public/proposals/${token}/deposit`), ctx(token));
  return { status: res.status, body: (await res.json()) as { data?: Record<string, unknown>; error?: { code: string } } };
};

async function providerSessionsFor(proposalId: string) {
  const found = [];
  for await (const s of h.sdk.checkout.sessions.list({ limit: 100 })) if (s.metadata?.proposalId === proposalId) found.push(s);
  return found;
}

beforeAll(async () => {
  receiver = await startReceiver();
  h = await startHarness(receiver.url);
  payments = await import("@/server/payments");
  dbm = await import("@/server/db");
  route = await import("@/app/api/public/proposals/[token]/deposit/route");
  owner = await newCompany("Checkout Test Solar");
});

afterAll(async () => {
  await h?.stop();
  await receiver?.close();
});

describe("POST /api/public/proposals/[token]/deposit", () => {
  it("creates one session however many times Pay is pressed at once", async () => {
    const p = await signedProposal(owner, { depositCents: 125_050 });
    const answers = await Promise.all(Array.from({ length: 6 }, () => post(p.token)));
    expect(answers.map((a) => a.status)).toEqual(Array(6).fill(200));
    const urls = new Set(answers.map((a) => a.body.data?.url));
    expect(urls.size).toBe(1);
    expect(answers.filter((a) => a.body.data?.reused === false)).toHaveLength(1);

    const rows = await dbm.db().select().from(payment).where(and(eq(payment.companyId, owner.companyId), eq(payment.proposalId, p.proposalId)));
    expect(rows).toHaveLength(1);
    expect(rows[0]).toMatchObject({ status: "open", amountCents: 125_050, currency: "usd", dealId: p.dealId });
    const sessions = await providerSessionsFor(p.proposalId);
    expect(sessions).toHaveLength(1);
    const s = sessions[0];
    expect(s.id).toBe(rows[0].checkoutSessionId);
    expect(s).toMatchObject({ mode: "payment", amount_total: 125_050, currency: "usd", customer_email: p.email, status: "open" });
    expect(s.metadata).toEqual({ dealId: p.dealId, proposalId: p.proposalId, companyId: owner.companyId, paymentId: rows[0].id });
    expect(s.success_url).toBe(`${process.env.APP_URL}/p/${p.token}?deposit=returned`);
    expect(s.cancel_url).toBe(`${process.env.APP_URL}/p/${p.token}?deposit=cancelled`);
    const hoursLeft = ((s.expires_at as number) * 1000 - Date.now()) / 3_600_000;
    expect(hoursLeft).toBeGreaterThan(21.9);
    expect(hoursLeft).toBeLessThanOrEqual(23);
    const items = await h.sdk.checkout.sessions.listLineItems(s.id);
    expect(items.data[0].description).toBe(`Deposit — proposal P-${p.number} v1`);
    const pi = await payWithCard(h.fake, s.id);
    expect((await h.sdk.paymentIntents.retrieve(pi.paymentIntentId as string)).metadata).toMatchObject({ dealId: p.dealId, proposalId: p.proposalId, companyId: owner.companyId });
  });

  it("sends the same idempotency key again when the ledger write was lost, and gets the same session back", async () => {
    const p = await signedProposal(owner);
    const first = await payments.startDepositCheckout(p.token);
    // As if the transaction had rolled back after the provider created the session.
    await dbm.db().delete(payment).where(and(eq(payment.id, first.paymentId), eq(payment.companyId, owner.companyId)));
    const second = await payments.startDepositCheckout(p.token);
    expect(second.paymentId).toBe(first.paymentId);
    expect(second.url).toBe(first.url);
    expect(await providerSessionsFor(p.proposalId)).toHaveLength(1);
  });

  it("shows the state the webhook set, never the redirect's word", async () => {
    const p = await signedProposal(owner, { depositCents: 90_000 });
    const due = await get(p.token);
    expect(due.status).toBe(200);
    expect(due.body.data).toMatchObject({ status: "due", amountCents: 90_000, amountText: "$900.00", canPay: true });
    const { body } = await post(p.token);
    expect((await get(p.token)).body.data).toMatchObject({ status: "open" });
    const sessionId = (body.data?.url as string).split("/pay/")[1];
    expect((await payWithCard(h.fake, sessionId)).status).toBe(200);
    const paid = await waitFor("the webhook", async () => {
      const v = await get(p.token);
      return v.body.data?.status === "paid" ? v.body.data : null;
    });
    expect(paid).toMatchObject({ paidCents: 90_000, paidText: "$900.00", canPay: false });
    expect(typeof paid.paidOnText).toBe("string");
    const l = await ledgerOf(owner.companyId, p.dealId);
    expect(l.stage).toBe("deposit_paid");
    expect(l.jobs).toBe(1);

    const again = await post(p.token);
    expect(again.status).toBe(409);
    expect(again.body.error?.code).toBe("already_paid");
  });

  it("refuses a proposal that is not signed, was cancelled, asks no deposit, or does not exist", async () => {
    const sent = await signedProposal(owner, { status: "sent" });
    expect((await post(sent.token)).body.error?.code).toBe("not_signed");
    expect((await get(sent.token)).status).toBe(404);
    const cancelled = await signedProposal(owner, { status: "cancelled" });
    const c = await post(cancelled.token);
    expect(c.status).toBe(409);
    expect(c.body.error?.code).toBe("proposal_cancelled");
    const none = await signedProposal(owner, { depositCents: 0 });
    expect((await post(none.token)).body.error?.code).toBe("no_deposit");
    expect((await post("x".repeat(43))).status).toBe(404);
    expect((await post("not a token")).status).toBe(404);
    for (const t of [sent, cancelled, none]) expect(await providerSessionsFor(t.proposalId)).toHaveLength(0);
  });
});
