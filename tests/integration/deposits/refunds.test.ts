// Refunds through the route handlers (the signed-in person is set through a stand-in session
// module, so withMember's permission check runs for real), the provider's charge.refunded
// webhooks flowing back at the same time, refunds on cancellation, the read-by-id routes and
// the reconciliation against the provider's lists.
import { and, eq } from "drizzle-orm";
import { NextRequest } from "next/server";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { payment, proposal, refund } from "@/db/schema";
import type { Member } from "@/server/session";
import { addMember, newCompany } from "../support/fixtures";
import { ledgerOf, outboxTo, payWithCard, signedProposal, startHarness, startReceiver, waitFor, type Harness, type Receiver } from "./support";

const session = vi.hoisted(() => ({ member: null as Member | null }));
vi.mock("@/server/session", async () => {
  const { can } = await import("@/lib/permissions");
  const { forbidden, unauthorized } = await import("@/server/errors");
  return {
    getSession: async () => null,
    getMember: async () => session.member,
    requireMember: async (permission: Parameters<typeof can>[1]) => {
      if (!session.member) throw unauthorized();
      if (!can(session.member.role, permission)) throw forbidden();
      return session.member;
    },
  };
});

let h: Harness;
let receiver: Receiver;
let owner: Member;
let office: Member;
let rep: Member;
let crew: Member;
let stranger: Member;
let payments: typeof import("@/server/payments");
let dbm: typeof import("@/server/db");
let refundsRoute: typeof import("@/app/api/payments/[id]/refunds/route");
let paymentRoute: typeof import("@/app/api/payments/[id]/route");
let refundRoute: typeof import("@/app/api/refunds/[id]/route");

const params = (id: string) => ({ params: Promise.resolve({ id }) });
async function asMember<T>(m: Member, fn: () => Promise<Response>): Promise<{ status: number; body: T }> {
  session.member = m;
  try {
    const res = await fn();
    return { status: res.status, body: (await res.json()) as T };
  } finally {
    session.member = null;
  }
}
const postRefund = (m: Member, paymentId: string, body: unknown) =>
  asMember<{ data?: { id: string; amountCents: number; stripeRefundId: string }; error?: { code: string; message: string; fields?: Record<string, string[]> } }>(m, () =>
    refundsRoute.POST(new NextRequest(`http://127.0.0.1/api/payments/${paymentId}/refunds`, { method: "POST", body: JSON.stringify(body) }), params(paymentId)),
  );

/** Waits until the provider has no webhook delivery left to make. */
async function settled(): Promise<void> {
  await waitFor("webhook deliveries", async () => {
    const res = await fetch(`${h.fake.url}/_dev/deliveries?status=pending`);
    return ((await res.json()) as { data: unknown[] }).data.length === 0;
  });
}

/** A deal with a paid, booked deposit (the webhook delivered by the fake). */
async function paidDeposit(depositCents = 100_000) {
  const p = await signedProposal(owner, { depositCents, rep });
  const { paymentId } = await payments.startDepositCheckout(p.token);
  const [row] = await dbm.db().select().from(payment).where(eq(payment.id, paymentId));
  expect((await payWithCard(h.fake, row.checkoutSessionId)).status).toBe(200);
  await waitFor("the payment booked", async () => {
    const [r] = await dbm.db().select().from(payment).where(eq(payment.id, paymentId));
    return r.status === "paid" && r.chargeId ? r : null;
  });
  await settled();
  return { ...p, paymentId };
}

beforeAll(async () => {
  receiver = await startReceiver();
  h = await startHarness(receiver.url);
  payments = await import("@/server/payments");
  dbm = await import("@/server/db");
  refundsRoute = await import("@/app/api/payments/[id]/refunds/route");
  paymentRoute = await import("@/app/api/payments/[id]/route");
  refundRoute = await import("@/app/api/refunds/[id]/route");
  owner = await newCompany("Refund Test Solar");
  office = await addMember(owner, "office_manager", "Orla Office");
  rep = await addMember(owner, "sales_rep", "Remy Rep");
  crew = await addMember(owner, "crew", "Cass Crew");
  stranger = await newCompany("Elsewhere Solar");
});

afterAll(async () => {
  await h?.stop();
  await receiver?.close();
});

describe("POST /api/payments/[id]/refunds", () => {
  it("lets an office manager refund part, then the rest, with reasons; the webhooks add nothing twice", async () => {
    const d = await paidDeposit();
    const part = await postRefund(office, d.paymentId, { amountCents: 25_000, reason: "Smaller system after the site survey" });
    expect(part.status).toBe(201);
    expect(part.body.data).toMatchObject({ amountCents: 25_000 });
    expect(part.body.data?.stripeRefundId).toMatch(/^re_/);
    let l = await ledgerOf(owner.companyId, d.dealId);
    expect(l.payments[0]).toMatchObject({ status: "partially_refunded", refundedCents: 25_000 });

    const tooMuch = await postRefund(office, d.paymentId, { amountCents: 75_001, reason: "More than is left" });
    expect(tooMuch.status).toBe(422);
    expect(tooMuch.body.error?.fields?.amountCents?.[0]).toContain("$750.00");

    const rest = await postRefund(office, d.paymentId, { amountCents: 75_000, reason: "Customer withdrew" });
    expect(rest.status).toBe(201);
    await settled();
    l = await ledgerOf(owner.companyId, d.dealId);
    expect(l.payments[0]).toMatchObject({ status: "refunded", paidCents: 100_000, refundedCents: 100_000 });
    expect(l.refunds.map((r) => [r.amountCents, r.reason, r.requestedByUserId, r.status]).sort()).toEqual(
      [
        [25_000, "Smaller system after the site survey", office.userId, "succeeded"],
        [75_000, "Customer withdrew", office.userId, "succeeded"],
      ].sort(),
    );
    expect(l.refundEvents).toBe(2);

    const none = await postRefund(office, d.paymentId, { amountCents: 100, reason: "Nothing left" });
    expect(none.status).toBe(409);
    expect(none.body.error?.code).toBe("not_refundable");
    // The provider agrees.
    const pi = (await dbm.db().select().from(payment).where(eq(payment.id, d.paymentId)))[0].paymentIntentId as string;
    const atProvider = await h.sdk.refunds.list({ payment_intent: pi });
    expect(atProvider.data.map((r) => r.amount).sort()).toEqual([25_000, 75_000]);
    // The customer was told each time.
    const mails = await waitFor("refund notices", async () => {
      const m = (await outboxTo(h.mailUrl, d.email)).filter((x) => /^Refund of/.test(x.subject));
      return m.length === 2 ? m : null;
    });
    expect(mails.map((m) => m.subject).sort()).toEqual(["Refund of $250.00 — Refund Test Solar", "Refund of $750.00 — Refund Test Solar"]);
  });

  it("refuses sales reps and installer crews (403) and moves no money", async () => {
    const d = await paidDeposit();
    for (const m of [rep, crew]) {
      const res = await postRefund(m, d.paymentId, { amountCents: 10_000, reason: "Trying without the role" });
      expect(res.status).toBe(403);
      expect(res.body.error?.code).toBe("forbidden");
      await expect(payments.refundPayment(m, d.paymentId, { amountCents: 10_000, reason: "Directly" })).rejects.toMatchObject({ status: 403 });
    }
    const l = await ledgerOf(owner.companyId, d.dealId);
    expect(l.refunds).toHaveLength(0);
    expect(l.payments[0]).toMatchObject({ status: "paid", refundedCents: 0 });
    const pi = l.payments[0].paymentIntentId as string;
    expect((await h.sdk.refunds.list({ payment_intent: pi })).data).toHaveLength(0);
  });

  it("validates the body (422 naming the field) and hides other companies' payments (404)", async () => {
    const d = await paidDeposit();
    const bad = await postRefund(office, d.paymentId, { amountCents: 12.5, reason: "" });
    expect(bad.status).toBe(422);
    expect(Object.keys(bad.body.error?.fields ?? {}).sort()).toEqual(["amountCents", "reason"]);
    const strangerOffice = await addMember(stranger, "office_manager", "Other Office");
    expect((await postRefund(strangerOffice, d.paymentId, { amountCents: 100, reason: "Not ours" })).status).toBe(404);
    expect((await postRefund(office, "not-a-uuid", { amountCents: 100, reason: "Bad id" })).status).toBe(404);
  });

  it("records a refund made at the provider once, by its id, from charge.refunded", async () => {
    const d = await paidDeposit();
    const [row] = await dbm.db().select().from(payment).where(eq(payment.id, d.paymentId));
    await h.sdk.refunds.create({ payment_intent: row.paymentIntentId as string, amount: 40_000 }, { idempotencyKey: `elsewhere-${d.paymentId}` });
    await settled();
    const l = await ledgerOf(owner.companyId, d.dealId);
    expect(l.refunds).toHaveLength(1);
    expect(l.refunds[0]).toMatchObject({ amountCents: 40_000, reason: "Refunded at the payment provider", requestedByUserId: null });
    expect(l.payments[0]).toMatchObject({ status: "partially_refunded", refundedCents: 40_000 });
    // The event again: nothing new.
    const ev = (await h.sdk.events.list({ type: "charge.refunded", limit: 1 })).data[0];
    await fetch(`${h.fake.url}/_dev/events/${ev.id}/redeliver`, { method: "POST" });
    await settled();
    expect((await ledgerOf(owner.companyId, d.dealId)).refunds).toHaveLength(1);
  });
});

describe("refundOnCancellation", () => {
  it("refunds what is left of every paid deposit of the deal, once", async () => {
    const d = await paidDeposit(80_000);
    await payments.refundPayment(office, d.paymentId, { amountCents: 5_000, reason: "Goodwill" });
    await payments.refundOnCancellation(owner.companyId, d.dealId, "Cancelled within the 3-business-day window");
    await payments.refundOnCancellation(owner.companyId, d.dealId, "Cancelled within the 3-business-day window");
    await settled();
    const l = await ledgerOf(owner.companyId, d.dealId);
    expect(l.payments[0]).toMatchObject({ status: "refunded", refundedCents: 80_000 });
    expect(l.refunds.map((r) => r.amountCents).sort((a, b) => a - b)).toEqual([5_000, 75_000]);
    expect(l.refunds.find((r) => r.amountCents === 75_000)?.reason).toBe("Cancelled within the 3-business-day window");
  });

  it("closes a checkout still open, and refunds by itself a payment that lands after the cancellation", async () => {
    const cancel = async (proposalId: string) =>
      dbm.db().update(proposal).set({ status: "cancelled", cancelledAt: new Date() }).where(and(eq(proposal.id, proposalId), eq(proposal.companyId, owner.companyId)));

    const open = await signedProposal(owner);
    const first = await payments.startDepositCheckout(open.token);
    await cancel(open.proposalId);
    await payments.refundOnCancellation(owner.companyId, open.dealId, "Cancelled within the 3-business-day window");
    const [row] = await dbm.db().select().from(payment).where(eq(payment.id, first.paymentId));
    expect((await h.sdk.checkout.sessions.retrieve(row.checkoutSessionId)).status).toBe("expired");
    await settled();
    expect((await ledgerOf(owner.companyId, open.dealId)).payments[0].status).toBe("expired");

    const late = await signedProposal(owner);
    const second = await payments.startDepositCheckout(late.token);
    const [row2] = await dbm.db().select().from(payment).where(eq(payment.id, second.paymentId));
    await cancel(late.proposalId);
    expect((await payWithCard(h.fake, row2.checkoutSessionId)).status).toBe(200);
    await waitFor("the automatic refund", async () => {
      const [r] = await dbm.db().select().from(payment).where(eq(payment.id, second.paymentId));
      return r.status === "refunded" ? r : null;
    });
    await settled();
    const l = await ledgerOf(owner.companyId, late.dealId);
    expect(l.payments[0]).toMatchObject({ status: "refunded", paidCents: 100_000, refundedCents: 100_000 });
    expect(l.refunds).toHaveLength(1);
    expect(l.refunds[0].reason).toBe("The agreement was cancelled before this payment arrived");
    expect(l.stage).toBe("signed");
    expect(l.jobs).toBe(0);
    expect(await payments.getDepositForCustomer(late.token)).toMatchObject({ status: "refunded", canPay: false });
  });

  it("does nothing for a deal without a paid deposit, and nothing across companies", async () => {
    const p = await signedProposal(owner);
    await payments.startDepositCheckout(p.token);
    await payments.refundOnCancellation(owner.companyId, p.dealId, "No money yet");
    const d = await paidDeposit();
    await payments.refundOnCancellation(stranger.companyId, d.dealId, "Wrong company");
    expect((await ledgerOf(owner.companyId, d.dealId)).payments[0]).toMatchObject({ status: "paid", refundedCents: 0 });
  });
});

describe("GET /api/payments/[id] and /api/refunds/[id]", () => {
  it("answers {data} within the company (reps: their own deals) and 404 elsewhere", async () => {
    const d = await paidDeposit();
    const r = await payments.refundPayment(office, d.paymentId, { amountCents: 1_000, reason: "Rounding" });
    const strangerOwner = stranger;
    const otherRep = await addMember(owner, "sales_rep", "Other Rep");
    for (const [m, expected] of [
      [office, 200],
      [rep, 200],
      [owner, 200],
      [strangerOwner, 404],
      [otherRep, 404],
    ] as const) {
      const p = await asMember<{ data?: { id: string } }>(m, () => paymentRoute.GET(new NextRequest(`http://127.0.0.1/api/payments/${d.paymentId}`), params(d.paymentId)));
      expect(p.status, `${m.name} payment`).toBe(expected);
      if (expected === 200) expect(p.body.data?.id).toBe(d.paymentId);
      const f = await asMember<{ data?: { id: string } }>(m, () => refundRoute.GET(new NextRequest(`http://127.0.0.1/api/refunds/${r.id}`), params(r.id)));
      expect(f.status, `${m.name} refund`).toBe(expected);
    }
    const crewRead = await asMember(crew, () => paymentRoute.GET(new NextRequest(`http://127.0.0.1/api/payments/${d.paymentId}`), params(d.paymentId)));
    expect(crewRead.status).toBe(403);
  });
});

describe("reconcileLedger", () => {
  it("finds no difference when the ledger matches, and names each kind of difference", async () => {
    const own = await newCompany("Reconcile Test Solar");
    const ownOffice = await addMember(own, "office_manager", "Rhoda Reconcile");
    await settled();
    const d = await (async () => {
      const p = await signedProposal(own);
      const { paymentId } = await payments.startDepositCheckout(p.token);
      const [row] = await dbm.db().select().from(payment).where(eq(payment.id, paymentId));
      await payWithCard(h.fake, row.checkoutSessionId);
      await waitFor("booked", async () => ((await dbm.db().select().from(payment).where(eq(payment.id, paymentId)))[0].chargeId ? true : null));
      await payments.refundPayment(ownOffice, paymentId, { amountCents: 10_000, reason: "Part" });
      await settled();
      return { ...p, paymentId, sessionId: row.checkoutSessionId };
    })();
    const open = await signedProposal(own);
    await payments.startDepositCheckout(open.token);

    const clean = await payments.reconcileLedger(ownOffice);
    expect(clean.differences).toEqual([]);
    expect(clean.counts).toEqual({ ledgerPayments: 2, providerSessions: 2, ledgerRefunds: 1, providerRefunds: 1 });
    await expect(payments.reconcileLedger(await addMember(own, "sales_rep", "No Reconcile"))).rejects.toMatchObject({ status: 403 });

    // A session the ledger never saw, a ledger row the provider never saw, a lost refund, a changed amount.
    const stray = await h.sdk.checkout.sessions.create({
      mode: "payment",
      line_items: [{ quantity: 1, price_data: { currency: "usd", unit_amount: 4_200, product_data: { name: "Stray" } } }],
      metadata: { companyId: own.companyId, dealId: d.dealId },
      success_url: "http://127.0.0.1/ok",
    });
    const nowhere = `cs_test_nowhere_${crypto.randomUUID().replaceAll("-", "")}`;
    await dbm.db().insert(payment).values({
      id: crypto.randomUUID(),
      companyId: own.companyId,
      dealId: d.dealId,
      proposalId: d.proposalId,
      checkoutSessionId: nowhere,
      amountCents: 100,
      status: "open",
    });
    await dbm.db().delete(refund).where(and(eq(refund.companyId, own.companyId), eq(refund.paymentId, d.paymentId)));
    await dbm.db().update(payment).set({ amountCents: 99_999 }).where(eq(payment.id, d.paymentId));

    const diff = await payments.reconcileLedger(ownOffice);
    const kinds = diff.differences.map((x) => `${x.object}:${x.kind}:${x.providerId}`).sort();
    expect(kinds).toEqual(
      [
        `payment:missing_in_ledger:${stray.id}`,
        `payment:missing_at_provider:${nowhere}`,
        `payment:amount:${d.sessionId}`,
        `refund:missing_in_ledger:${(await h.sdk.refunds.list({ limit: 1 })).data[0].id}`,
      ].sort(),
    );
    // Other companies' sessions never show.
    expect(diff.differences.every((x) => x.dealId === null || x.dealId === d.dealId)).toBe(true);
  });
});
