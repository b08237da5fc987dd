// Paying on the dev payments server's hosted page with Stripe's documented test cards, and the
// signed webhook events that follow, verified with the SDK as the app's route verifies them.
import Stripe from "stripe";
import { afterAll, beforeAll, beforeEach, describe, expect, it } from "vitest";
import type { PaymentsFake } from "@/fakes/payments-server";
import { depositParams, devJson, removeDir, sdkFor, startFake, startReceiver, submitCard, tempDir, verifiedEvents, waitFor, WEBHOOK_SECRET, type Receiver } from "./support";

let dir: string;
let fake: PaymentsFake;
let stripe: Stripe;
let receiver: Receiver;

beforeAll(async () => {
  dir = await tempDir("payments-page");
  receiver = await startReceiver();
  fake = await startFake(dir, receiver.url);
  stripe = sdkFor(fake);
});

afterAll(async () => {
  await fake?.close();
  await receiver?.close();
  await removeDir(dir);
});

beforeEach(() => {
  receiver.received.length = 0;
});

/** Events for one session's payment, once every queued delivery has landed. */
async function eventsFor(sessionId: string, paymentIntentId: string | null, count: number): Promise<Stripe.Event[]> {
  return waitFor(`${count} events for ${sessionId}`, () => {
    const mine = verifiedEvents(receiver, stripe).filter((e) => {
      const o = e.data.object as { id: string; object: string; payment_intent?: string };
      return o.id === sessionId || (paymentIntentId !== null && (o.id === paymentIntentId || o.payment_intent === paymentIntentId));
    });
    return mine.length >= count ? mine : null;
  });
}

describe("the hosted checkout page", () => {
  it("shows the amount, the description and a labelled card form, phone-sized", async () => {
    const s = await stripe.checkout.sessions.create(depositParams());
    const res = await fetch(s.url!);
    expect(res.status).toBe(200);
    expect(res.headers.get("content-type")).toContain("text/html");
    const html = await res.text();
    expect(html).toContain('name="viewport"');
    expect(html).toContain("$500.00");
    expect(html).toContain("Deposit for the Prairieline PL-410 system");
    expect(html).toContain("household@example.com");
    for (const label of ["Card number", "Expiry (MM / YY)", "Security code (CVC)", "ZIP / postal code"]) expect(html).toContain(`>${label}</label>`);
    expect(html).toContain(`href="http://localhost:3999/p/tok123"`); // cancel link
    expect(html).not.toContain('role="alert"');
  });

  it("4242… pays: 303 to success_url with the session id, session complete, events signed and verifiable", async () => {
    const s = await stripe.checkout.sessions.create(depositParams());
    const res = await submitCard(s.url!, { number: "4242 4242 4242 4242" });
    expect(res.status).toBe(303);
    expect(res.headers.get("location")).toBe(`http://localhost:3999/p/tok123?paid=${s.id}`);

    const paid = await stripe.checkout.sessions.retrieve(s.id, { expand: ["payment_intent"] });
    expect(paid).toMatchObject({ status: "complete", payment_status: "paid", url: null });
    const pi = paid.payment_intent as Stripe.PaymentIntent;
    expect(pi.id).toMatch(/^pi_/);
    expect(pi).toMatchObject({ object: "payment_intent", status: "succeeded", amount: 50_000, amount_received: 50_000, currency: "usd", last_payment_error: null });
    expect(pi.metadata).toEqual({ dealId: "7a11a55e-0000-4000-8000-000000000001" });
    expect(pi.latest_charge).toMatch(/^ch_/);
    const samePi = await stripe.paymentIntents.retrieve(pi.id, { expand: ["latest_charge"] });
    expect((samePi.latest_charge as Stripe.Charge).payment_method_details?.card?.last4).toBe("4242");

    const events = await eventsFor(s.id, pi.id, 2);
    expect(events.map((e) => e.type).sort()).toEqual(["checkout.session.completed", "payment_intent.succeeded"]);
    const completed = events.find((e) => e.type === "checkout.session.completed")!;
    expect(completed.id).toMatch(/^evt_/);
    expect(completed).toMatchObject({ object: "event", livemode: false, pending_webhooks: 1 });
    const session = completed.data.object as Stripe.Checkout.Session;
    expect(session).toMatchObject({ id: s.id, payment_status: "paid", status: "complete", payment_intent: pi.id, amount_total: 50_000, metadata: s.metadata });

    // The header is the documented scheme; a wrong secret or a changed body fails verification.
    const delivery = receiver.received.find((r) => r.body.includes(completed.id))!;
    expect(String(delivery.headers["stripe-signature"])).toMatch(/^t=\d+,v1=[0-9a-f]{64}$/);
    expect(() => stripe.webhooks.constructEvent(delivery.body, String(delivery.headers["stripe-signature"]), "whsec_wrong", 300)).toThrow(
      Stripe.errors.StripeSignatureVerificationError,
    );
    expect(() => stripe.webhooks.constructEvent(delivery.body.replace("50000", "5000"), String(delivery.headers["stripe-signature"]), WEBHOOK_SECRET, 300)).toThrow();

    // The event is listed and retrievable through the API, no longer pending once acknowledged.
    await waitFor("the event's delivery to be recorded", async () => (await stripe.events.retrieve(completed.id)).pending_webhooks === 0);
    const listed = await stripe.events.list({ type: "checkout.session.*", limit: 100 });
    expect(listed.data.some((e) => e.id === completed.id)).toBe(true);

    // Pressing Pay again on the old page does not charge twice.
    const again = await submitCard(s.url!, { number: "4242424242424242" });
    expect(again.status).toBe(303);
    const charges = await stripe.charges.list({ payment_intent: pi.id });
    expect(charges.data).toHaveLength(1);
    const page = await fetch(s.url!);
    expect(await page.text()).toContain("This payment is complete");
  });

  it("4000…0002 is declined with a clear alert and payment_intent.payment_failed; another card then pays", async () => {
    const s = await stripe.checkout.sessions.create(depositParams());
    const declined = await submitCard(s.url!, { number: "4000 0000 0000 0002" });
    expect(declined.status).toBe(402);
    const html = await declined.text();
    expect(html).toMatch(/<p class="alert" id="pay-error" role="alert">Your card was declined.<\/p>/);
    expect(html).toContain('value="4000 0000 0000 0002"'); // the form comes back filled in

    const open = await stripe.checkout.sessions.retrieve(s.id);
    expect(open).toMatchObject({ status: "open", payment_status: "unpaid" });
    const piId = open.payment_intent as string;
    const pi = await stripe.paymentIntents.retrieve(piId);
    expect(pi.status).toBe("requires_payment_method");
    expect(pi.last_payment_error).toMatchObject({ type: "card_error", code: "card_declined", decline_code: "generic_decline", message: "Your card was declined." });

    const failed = await eventsFor(s.id, piId, 1);
    expect(failed.map((e) => e.type)).toEqual(["payment_intent.payment_failed"]);
    expect((failed[0].data.object as Stripe.PaymentIntent).last_payment_error?.decline_code).toBe("generic_decline");

    const retry = await submitCard(s.url!, { number: "4242424242424242" });
    expect(retry.status).toBe(303);
    const all = await eventsFor(s.id, piId, 3);
    expect(all.map((e) => e.type).sort()).toEqual(["checkout.session.completed", "payment_intent.payment_failed", "payment_intent.succeeded"]);
    const paidPi = await stripe.paymentIntents.retrieve(piId);
    expect(paidPi).toMatchObject({ id: piId, status: "succeeded", last_payment_error: null });
  });

  it("4000…9995 fails for insufficient funds", async () => {
    const s = await stripe.checkout.sessions.create(depositParams());
    const res = await submitCard(s.url!, { number: "4000000000009995" });
    expect(res.status).toBe(402);
    expect(await res.text()).toContain('role="alert">Your card has insufficient funds.</p>');
    const pi = await stripe.paymentIntents.retrieve((await stripe.checkout.sessions.retrieve(s.id)).payment_intent as string);
    expect(pi.last_payment_error).toMatchObject({ code: "card_declined", decline_code: "insufficient_funds" });
  });

  it("an unknown but well-formed number is incorrect_number; a mistyped one is caught by the form without an attempt", async () => {
    const s = await stripe.checkout.sessions.create(depositParams());
    const typo = await submitCard(s.url!, { number: "4242 4242 4242 4241" });
    expect(typo.status).toBe(400);
    expect(await typo.text()).toContain('role="alert">Your card number is incorrect.</p>');
    expect((await stripe.checkout.sessions.retrieve(s.id)).payment_intent).toBeNull();

    const past = await submitCard(s.url!, { number: "4242424242424242", exp: "01 / 20" });
    expect(past.status).toBe(400);
    expect(await past.text()).toContain("expiry date is in the past");

    const unknown = await submitCard(s.url!, { number: "4111 1111 1111 1111" });
    expect(unknown.status).toBe(402);
    expect(await unknown.text()).toContain('role="alert">Your card number is incorrect.</p>');
    const piId = (await stripe.checkout.sessions.retrieve(s.id)).payment_intent as string;
    expect((await stripe.paymentIntents.retrieve(piId)).last_payment_error?.code).toBe("incorrect_number");
  });

  it("asks for an e-mail when the session has none, and keeps it on the session", async () => {
    const s = await stripe.checkout.sessions.create(depositParams({ customer_email: undefined }));
    const html = await (await fetch(s.url!)).text();
    expect(html).toContain("E-mail for the receipt");
    const missing = await submitCard(s.url!, { number: "4242424242424242" });
    expect(missing.status).toBe(400);
    const ok = await submitCard(s.url!, { number: "4242424242424242", email: "payer@example.com" });
    expect(ok.status).toBe(303);
    expect((await stripe.checkout.sessions.retrieve(s.id)).customer_details?.email).toBe("payer@example.com");
  });

  it("an unknown session's page is a 404 page", async () => {
    const res = await fetch(`${fake.url}/pay/cs_test_unknown`);
    expect(res.status).toBe(404);
    expect(await res.text()).toContain("Payment link not found");
  });
});

describe("paying through the dev control API", () => {
  it("POST /_dev/sessions/:id/pay pays or declines without a browser", async () => {
    const s = await stripe.checkout.sessions.create(depositParams());
    const declined = await devJson(fake, "POST", `/_dev/sessions/${s.id}/pay`, { card: "4000000000000002" });
    expect(declined.status).toBe(402);
    expect(declined.body.error).toMatchObject({ type: "card_error", code: "card_declined", decline_code: "generic_decline" });
    expect(declined.body.data.session.status).toBe("open");

    const paid = await devJson(fake, "POST", `/_dev/sessions/${s.id}/pay`, { card: "4242 4242 4242 4242" });
    expect(paid.status).toBe(200);
    expect(paid.body.data.session).toMatchObject({ id: s.id, status: "complete", payment_status: "paid" });
    expect(paid.body.data.payment_intent).toMatchObject({ status: "succeeded", amount_received: 50_000 });

    const twice = await devJson(fake, "POST", `/_dev/sessions/${s.id}/pay`, { card: "4242 4242 4242 4242" });
    expect(twice.status).toBe(400);
    const missing = await devJson(fake, "POST", `/_dev/sessions/cs_test_missing/pay`, {});
    expect(missing.status).toBe(404);
  });
});
