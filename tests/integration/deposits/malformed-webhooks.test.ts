// Signed but malformed webhook events (issue #14, item 10): the provider signed the body, so
// delivering it again will not make it better. Each is recorded as rejected with the reason,
// answered 2xx (the provider stops retrying) and books nothing; a redelivery is a duplicate.
import { eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { payment, webhookEvent } from "@/db/schema";
import type { Member } from "@/server/session";
import { newCompany } from "../support/fixtures";
import { deliver, eventFor, ledgerOf, payload, payWithCard, signedProposal, startHarness, type Harness } from "./support";

let h: Harness;
let owner: Member;
let payments: typeof import("@/server/payments");
let dbm: typeof import("@/server/db");

beforeAll(async () => {
  h = await startHarness(null);
  payments = await import("@/server/payments");
  dbm = await import("@/server/db");
  owner = await newCompany("Malformed Webhook Solar");
});

afterAll(async () => {
  await h?.stop();
});

async function paidSession() {
  const p = await signedProposal(owner, { depositCents: 100_000 });
  const { paymentId } = await payments.startDepositCheckout(p.token);
  const [row] = await dbm.db().select().from(payment).where(eq(payment.id, paymentId));
  await payWithCard(h.fake, row.checkoutSessionId, "4242424242424242");
  return { ...p, sessionId: row.checkoutSessionId };
}

const recorded = async (id: string) => (await dbm.db().select().from(webhookEvent).where(eq(webhookEvent.id, id)))[0];

describe("signed but malformed webhook events", () => {
  it("records an allow-listed event whose object lacks what its handler needs as rejected, answers 200 and books nothing", async () => {
    const s = await paidSession();
    const completed = await eventFor(h.sdk, "checkout.session.completed", s.sessionId);
    // The provider's event with the amount gone and the currency a number, signed as sent.
    const broken = JSON.parse(payload(completed)) as { id: string; data: { object: Record<string, unknown> } };
    broken.id = `${completed.id}_broken`;
    delete broken.data.object.amount_total;
    broken.data.object.currency = 840;
    const res = await deliver(JSON.stringify(broken));
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ received: true, status: "rejected" });
    const row = await recorded(broken.id);
    expect(row).toMatchObject({ type: "checkout.session.completed", outcome: "rejected" });
    expect(row.note).toMatch(/data\.object\.(amount_total|currency)/);

    const l = await ledgerOf(owner.companyId, s.dealId);
    expect(l.payments[0]).toMatchObject({ status: "open", paidCents: null });
    expect(l.stage).toBe("signed");
    expect(l.jobs).toBe(0);

    // Delivered again: the same row, a duplicate, still 200.
    const again = await deliver(JSON.stringify(broken));
    expect(again.status).toBe(200);
    expect(again.body).toMatchObject({ status: "duplicate" });
    expect((await dbm.db().select().from(webhookEvent).where(eq(webhookEvent.id, broken.id))).length).toBe(1);
  });

  it("records a signed body that is not JSON, or not an event, under an id of its own", async () => {
    const notJson = `not json ${Date.now()}`;
    const res = await deliver(notJson);
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ status: "rejected", note: "the body is not JSON" });
    const rows = await dbm.db().select().from(webhookEvent).where(eq(webhookEvent.outcome, "rejected"));
    expect(rows.some((r) => r.id.startsWith("malformed_") && r.note === "the body is not JSON")).toBe(true);
    expect((await deliver(notJson)).body).toMatchObject({ status: "duplicate" });

    const noType = { id: `evt_no_type_${Date.now()}`, created: Math.floor(Date.now() / 1000), data: { object: {} } };
    const r2 = await deliver(JSON.stringify(noType));
    expect(r2.status).toBe(200);
    expect(r2.body).toMatchObject({ status: "rejected" });
    expect((await recorded(noType.id))?.note).toMatch(/^not an event: type/);
  });

  it("still answers 400 and records nothing when the signature is wrong", async () => {
    const body = JSON.stringify({ id: `evt_forged_${Date.now()}`, type: "checkout.session.completed", created: 1, data: { object: {} } });
    const res = await deliver(body, { secret: "whsec_not_the_endpoint_secret" });
    expect(res.status).toBe(400);
    expect(await recorded(JSON.parse(body).id)).toBeUndefined();
  });
});

describe("refunds of payments the ledger does not know", () => {
  const refundEvent = (charge: Record<string, unknown>) => ({
    id: `evt_unknown_refund_${Date.now()}_${Math.random().toString(36).slice(2, 7)}`,
    object: "event",
    type: "charge.refunded",
    created: Math.floor(Date.now() / 1000),
    data: { object: { object: "charge", payment_intent: null, amount: 40_000, ...charge } },
  });

  it("flags one for the office of the company our metadata names, and only that company sees it", async () => {
    const other = await newCompany("Other Webhook Solar");
    const chargeId = `ch_unknown_${Date.now()}`;
    const event = refundEvent({ id: chargeId, amount_refunded: 40_000, metadata: { companyId: owner.companyId, paymentId: crypto.randomUUID() } });
    const res = await deliver(JSON.stringify(event));
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ status: "processed", outcome: "flagged" });
    expect((await recorded(event.id))?.outcome).toBe("flagged");

    const alerts = await payments.listPaymentAlerts(owner);
    const alert = alerts.find((a) => a.chargeId === chargeId);
    expect(alert).toMatchObject({ kind: "unknown_refund", amountCents: 40_000, webhookEventId: event.id });
    expect(alert?.detail).toContain(chargeId);
    expect((await payments.listPaymentAlerts(other)).some((a) => a.chargeId === chargeId)).toBe(false);
    await expect(payments.getPaymentAlertOrThrow(other, alert!.id)).rejects.toMatchObject({ status: 404 });

    // A redelivery adds nothing.
    expect((await deliver(JSON.stringify(event))).body).toMatchObject({ status: "duplicate" });
    expect((await payments.listPaymentAlerts(owner)).filter((a) => a.chargeId === chargeId)).toHaveLength(1);
  });

  it("keeps one that names no company of ours in the event log only", async () => {
    const event = refundEvent({ id: `ch_nobody_${Date.now()}`, amount_refunded: 500, metadata: {} });
    const res = await deliver(JSON.stringify(event));
    expect(res.status).toBe(200);
    expect((await recorded(event.id))).toMatchObject({ outcome: "flagged" });
    expect((await recorded(event.id))?.note).toMatch(/no company named/);
    expect((await payments.listPaymentAlerts(owner)).some((a) => a.webhookEventId === event.id)).toBe(false);
  });
});
