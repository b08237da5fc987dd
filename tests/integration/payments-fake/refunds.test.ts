// Refunds on the dev payments server through the real SDK: partial then full, refusals worded
// like the service, charge.refunded events, and the list the reconciliation page reads.
import Stripe from "stripe";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { PaymentsFake } from "@/fakes/payments-server";
import { depositParams, devJson, removeDir, sdkFor, startFake, startReceiver, tempDir, verifiedEvents, waitFor, type Receiver } from "./support";

let dir: string;
let fake: PaymentsFake;
let stripe: Stripe;
let receiver: Receiver;

beforeAll(async () => {
  dir = await tempDir("payments-refunds");
  receiver = await startReceiver();
  fake = await startFake(dir, receiver.url);
  stripe = sdkFor(fake);
});

afterAll(async () => {
  await fake?.close();
  await receiver?.close();
  await removeDir(dir);
});

async function paidDeposit(amount = 50_000): Promise<{ session: Stripe.Checkout.Session; pi: Stripe.PaymentIntent }> {
  const s = await stripe.checkout.sessions.create(
    depositParams({ line_items: [{ quantity: 1, price_data: { currency: "usd", unit_amount: amount, product_data: { name: "Deposit" } } }] }),
  );
  const paid = await devJson(fake, "POST", `/_dev/sessions/${s.id}/pay`, { card: "4242424242424242" });
  expect(paid.status).toBe(200);
  const session = await stripe.checkout.sessions.retrieve(s.id, { expand: ["payment_intent"] });
  return { session, pi: session.payment_intent as Stripe.PaymentIntent };
}

function refundedEventsFor(chargeId: string): Stripe.Event[] {
  return verifiedEvents(receiver, stripe).filter((e) => e.type === "charge.refunded" && (e.data.object as Stripe.Charge).id === chargeId);
}

describe("refunds", () => {
  it("partial then full: amounts, charge state and charge.refunded events", async () => {
    const { pi } = await paidDeposit(50_000);
    const chargeId = pi.latest_charge as string;

    const partial = await stripe.refunds.create({ payment_intent: pi.id, amount: 20_000, reason: "requested_by_customer", metadata: { by: "office" } });
    expect(partial.id).toMatch(/^re_/);
    expect(partial).toMatchObject({
      object: "refund",
      amount: 20_000,
      currency: "usd",
      charge: chargeId,
      payment_intent: pi.id,
      status: "succeeded",
      reason: "requested_by_customer",
      metadata: { by: "office" },
    });
    let charge = await stripe.charges.retrieve(chargeId);
    expect(charge).toMatchObject({ amount_refunded: 20_000, refunded: false });

    const [first] = await waitFor("the first charge.refunded", () => (refundedEventsFor(chargeId).length === 1 ? refundedEventsFor(chargeId) : null));
    const firstCharge = first.data.object as Stripe.Charge;
    expect(firstCharge).toMatchObject({ amount: 50_000, amount_refunded: 20_000, refunded: false, payment_intent: pi.id });
    expect(firstCharge.refunds?.data.map((r) => r.id)).toEqual([partial.id]);
    expect(first.data.previous_attributes).toMatchObject({ amount_refunded: 0 });

    // No amount: the rest.
    const rest = await stripe.refunds.create({ charge: chargeId });
    expect(rest.amount).toBe(30_000);
    charge = await stripe.charges.retrieve(chargeId);
    expect(charge).toMatchObject({ amount_refunded: 50_000, refunded: true });
    const events = await waitFor("the second charge.refunded", () => (refundedEventsFor(chargeId).length === 2 ? refundedEventsFor(chargeId) : null));
    const last = events.map((e) => e.data.object as Stripe.Charge).find((c) => c.refunded)!;
    expect(last.amount_refunded).toBe(50_000);
    expect(last.refunds?.data.map((r) => r.id)).toEqual([rest.id, partial.id]);

    // Listed by payment intent, newest first.
    const listed = await stripe.refunds.list({ payment_intent: pi.id });
    expect(listed.data.map((r) => r.id)).toEqual([rest.id, partial.id]);
    expect((await stripe.refunds.retrieve(partial.id)).amount).toBe(20_000);

    // Nothing left to refund.
    const again = await stripe.refunds.create({ payment_intent: pi.id, amount: 1 }).catch((e: unknown) => e);
    expect(again).toBeInstanceOf(Stripe.errors.StripeInvalidRequestError);
    expect(again).toMatchObject({ statusCode: 400, code: "charge_already_refunded" });
  });

  it("more than what is left is refused with amount_too_large, naming both amounts", async () => {
    const { pi } = await paidDeposit(25_000);
    await stripe.refunds.create({ payment_intent: pi.id, amount: 10_000 });
    const err = await stripe.refunds.create({ payment_intent: pi.id, amount: 15_001 }).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(Stripe.errors.StripeInvalidRequestError);
    expect(err).toMatchObject({
      statusCode: 400,
      code: "amount_too_large",
      param: "amount",
      message: "Refund amount ($150.01) is greater than unrefunded amount on charge ($150.00)",
    });
    const ok = await stripe.refunds.create({ payment_intent: pi.id, amount: 15_000 });
    expect(ok.amount).toBe(15_000);
  });

  it("an idempotency key makes a retried refund one refund", async () => {
    const { pi } = await paidDeposit(30_000);
    const key = `refund-${pi.id}-1`;
    const a = await stripe.refunds.create({ payment_intent: pi.id, amount: 5_000 }, { idempotencyKey: key });
    const b = await stripe.refunds.create({ payment_intent: pi.id, amount: 5_000 }, { idempotencyKey: key });
    expect(b.id).toBe(a.id);
    expect((await stripe.refunds.list({ payment_intent: pi.id })).data).toHaveLength(1);
  });

  it("refusals for what cannot be refunded", async () => {
    const missing = await stripe.refunds.create({} as Stripe.RefundCreateParams).catch((e: unknown) => e);
    expect(missing).toMatchObject({ statusCode: 400, param: "payment_intent" });

    const unknown = await stripe.refunds.create({ payment_intent: "pi_unknown" }).catch((e: unknown) => e);
    expect(unknown).toMatchObject({ statusCode: 404, code: "resource_missing", param: "payment_intent" });

    const s = await stripe.checkout.sessions.create(depositParams());
    await devJson(fake, "POST", `/_dev/sessions/${s.id}/pay`, { card: "4000000000000002" });
    const declinedPi = (await stripe.checkout.sessions.retrieve(s.id)).payment_intent as string;
    const unpaid = await stripe.refunds.create({ payment_intent: declinedPi }).catch((e: unknown) => e);
    expect(unpaid).toMatchObject({ statusCode: 400, param: "payment_intent" });

    const { pi } = await paidDeposit();
    const zero = await stripe.refunds.create({ payment_intent: pi.id, amount: 0 }).catch((e: unknown) => e);
    expect(zero).toMatchObject({ statusCode: 400, param: "amount" });
    const badReason = await stripe.refunds.create({ payment_intent: pi.id, reason: "changed_mind" as "duplicate" }).catch((e: unknown) => e);
    expect(badReason).toMatchObject({ statusCode: 400, param: "reason" });
  });

  it("payment intents and charges are listed for reconciliation", async () => {
    const { pi } = await paidDeposit(40_000);
    const pis = await stripe.paymentIntents.list({ limit: 100 });
    expect(pis.data.some((p) => p.id === pi.id && p.status === "succeeded" && p.amount_received === 40_000)).toBe(true);
    const charges = await stripe.charges.list({ payment_intent: pi.id, expand: ["data.payment_intent"] });
    expect(charges.data).toHaveLength(1);
    expect((charges.data[0].payment_intent as Stripe.PaymentIntent).id).toBe(pi.id);
    const sessions = await stripe.checkout.sessions.list({ payment_intent: pi.id });
    expect(sessions.data).toHaveLength(1);
  });
});
