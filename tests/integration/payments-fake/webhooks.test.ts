// Webhook delivery by the dev payments server: retries with back-off until a 2xx answer, the
// app being down, a restart of the fake in the middle of the retries, redelivery, and the
// state kept on disk across restarts.
import { readFile, writeFile } from "node:fs/promises";
import path from "node:path";
import Stripe from "stripe";
import { afterEach, describe, expect, it } from "vitest";
import type { Delivery, PaymentsFake } from "@/fakes/payments-server";
import { depositParams, devJson, freePort, removeDir, sdkFor, startFake, startReceiver, tempDir, verifiedEvents, waitFor, type Receiver } from "./support";

const cleanups: (() => Promise<void>)[] = [];
afterEach(async () => {
  while (cleanups.length > 0) await cleanups.pop()!().catch(() => undefined);
});

async function setup() {
  const dir = await tempDir("payments-hooks");
  cleanups.push(() => removeDir(dir));
  return dir;
}

async function fakeAt(dir: string, url: string | null, retry?: { initialDelayMs?: number; maxDelayMs?: number; attemptTimeoutMs?: number }): Promise<PaymentsFake> {
  const fake = await startFake(dir, url, retry ? { retry: { attemptTimeoutMs: 2000, ...retry } } : {});
  cleanups.push(() => fake.close());
  return fake;
}

async function receiverAt(port = 0): Promise<Receiver> {
  const r = await startReceiver(port);
  cleanups.push(() => r.close());
  return r;
}

async function deliveriesOf(fake: PaymentsFake, eventId?: string): Promise<Delivery[]> {
  const res = await devJson(fake, "GET", `/_dev/deliveries${eventId ? `?event=${eventId}` : ""}`);
  expect(res.status).toBe(200);
  return res.body.data as Delivery[];
}

describe("webhook delivery", () => {
  it("a receiver answering 500 twice then 200 gets the same event three times, with growing delays", async () => {
    const dir = await setup();
    const receiver = await receiverAt();
    receiver.answers = [500, 500];
    const fake = await fakeAt(dir, receiver.url, { initialDelayMs: 100, maxDelayMs: 1000 });
    const stripe = sdkFor(fake);
    const s = await stripe.checkout.sessions.create(depositParams());
    await stripe.checkout.sessions.expire(s.id); // one event: checkout.session.expired

    const [delivery] = await waitFor("the delivery to succeed", async () => {
      const ds = await deliveriesOf(fake);
      return ds.length === 1 && ds[0].status === "delivered" ? ds : null;
    });
    expect(delivery.type).toBe("checkout.session.expired");
    expect(delivery.attempts.map((a) => a.status)).toEqual([500, 500, 200]);
    expect(receiver.received).toHaveLength(3);
    const events = verifiedEvents(receiver, stripe); // each attempt is signed and verifies
    expect(new Set(events.map((e) => e.id))).toEqual(new Set([delivery.eventId]));
    // Back-off: 100 ms then 200 ms (doubling).
    const [t0, t1, t2] = receiver.received.map((r) => r.at);
    expect(t1 - t0).toBeGreaterThanOrEqual(90);
    expect(t2 - t1).toBeGreaterThanOrEqual(180);
    expect((await stripe.events.retrieve(delivery.eventId)).pending_webhooks).toBe(0);
  });

  it("the app being down (connection refused) is retried until it answers", async () => {
    const dir = await setup();
    const port = await freePort();
    const fake = await fakeAt(dir, `http://127.0.0.1:${port}/api/webhooks/stripe`, { initialDelayMs: 50, maxDelayMs: 150 });
    const stripe = sdkFor(fake);
    const s = await stripe.checkout.sessions.create(depositParams());
    const paid = await devJson(fake, "POST", `/_dev/sessions/${s.id}/pay`, { card: "4242424242424242" });
    expect(paid.status).toBe(200);

    await waitFor("refused attempts", async () => (await deliveriesOf(fake)).every((d) => d.attempts.length >= 2));
    const refused = await deliveriesOf(fake);
    expect(refused.map((d) => d.type).sort()).toEqual(["checkout.session.completed", "payment_intent.succeeded"]);
    expect(refused.every((d) => d.status === "pending")).toBe(true);
    expect(refused[0].attempts[0]).toMatchObject({ status: null });
    expect(refused[0].attempts[0].error).toMatch(/ECONNREFUSED/);
    const pending = await stripe.events.list({ type: "checkout.session.completed" });
    expect(pending.data[0].pending_webhooks).toBe(1);

    const receiver = await receiverAt(port); // the app comes up
    await waitFor("both deliveries", async () => (await deliveriesOf(fake)).every((d) => d.status === "delivered"));
    const events = verifiedEvents(receiver, stripe);
    expect(events.map((e) => e.type).sort()).toEqual(["checkout.session.completed", "payment_intent.succeeded"]);
  });

  it("a restart of the fake in the middle of the retries resumes them from its data folder", async () => {
    const dir = await setup();
    const receiver = await receiverAt();
    receiver.defaultStatus = 503;
    const first = await startFake(dir, receiver.url, { retry: { initialDelayMs: 100, maxDelayMs: 300, attemptTimeoutMs: 2000 } });
    cleanups.push(() => first.close());
    const stripe1 = sdkFor(first);
    const s = await stripe1.checkout.sessions.create(depositParams(), { idempotencyKey: "restart-key" });
    await stripe1.checkout.sessions.expire(s.id);
    await waitFor("a failed attempt", () => first.deliveries()[0]?.attempts.length >= 1);
    await first.close();
    const seenBeforeRestart = receiver.received.length;
    expect(seenBeforeRestart).toBeGreaterThanOrEqual(1);

    receiver.defaultStatus = 200;
    const second = await fakeAt(dir, receiver.url, { initialDelayMs: 100, maxDelayMs: 300 });
    const stripe2 = sdkFor(second);
    const [delivered] = await waitFor("the resumed delivery", () => {
      const ds = second.deliveries();
      return ds.length === 1 && ds[0].status === "delivered" ? ds : null;
    });
    expect(delivered.attempts.length).toBe(seenBeforeRestart + 1);
    expect(delivered.attempts.at(-1)!.status).toBe(200);
    expect(delivered.attempts[0].status).toBe(503);
    const ids = new Set(verifiedEvents(receiver, stripe2).map((e) => e.id));
    expect(ids).toEqual(new Set([delivered.eventId]));

    // Sessions, events and idempotency keys came back too.
    const again = await stripe2.checkout.sessions.retrieve(s.id);
    expect(again.status).toBe("expired");
    const replay = await stripe2.checkout.sessions.create(depositParams(), { idempotencyKey: "restart-key" });
    expect(replay.id).toBe(s.id);
    expect(replay.lastResponse.headers["idempotent-replayed"]).toBe("true");
    expect((await stripe2.events.retrieve(delivered.eventId)).type).toBe("checkout.session.expired");
  });

  it("redelivers an event on request, and flush skips the back-off", async () => {
    const dir = await setup();
    const receiver = await receiverAt();
    receiver.answers = [500];
    const fake = await fakeAt(dir, receiver.url, { initialDelayMs: 60_000, maxDelayMs: 60_000 });
    const stripe = sdkFor(fake);
    const s = await stripe.checkout.sessions.create(depositParams());
    await stripe.checkout.sessions.expire(s.id);
    await waitFor("the first attempt", async () => (await deliveriesOf(fake))[0]?.attempts.length === 1);
    const [waiting] = await deliveriesOf(fake);
    expect(waiting.status).toBe("pending");
    expect(Date.parse(waiting.nextAttemptAt!) - Date.now()).toBeGreaterThan(30_000);

    const flushed = await devJson(fake, "POST", "/_dev/deliveries/flush");
    expect(flushed.body.data.due).toBe(1);
    await waitFor("the flushed delivery", async () => (await deliveriesOf(fake))[0]?.status === "delivered");

    const again = await devJson(fake, "POST", `/_dev/events/${waiting.eventId}/redeliver`);
    expect(again.status).toBe(200);
    expect(again.body.data).toMatchObject({ eventId: waiting.eventId, status: "pending" });
    await waitFor("the redelivery", async () => (await deliveriesOf(fake, waiting.eventId)).every((d) => d.status === "delivered"));
    expect(await deliveriesOf(fake, waiting.eventId)).toHaveLength(2);
    expect(verifiedEvents(receiver, stripe).map((e) => e.id)).toEqual([waiting.eventId, waiting.eventId, waiting.eventId]);

    const unknown = await devJson(fake, "POST", "/_dev/events/evt_unknown/redeliver");
    expect(unknown.status).toBe(404);
  });

  it("only the subscribed event types are sent; the others are listed", async () => {
    const dir = await setup();
    const receiver = await receiverAt();
    const fake = await fakeAt(dir, receiver.url, { initialDelayMs: 50 });
    const stripe = sdkFor(fake);
    const s = await stripe.checkout.sessions.create(depositParams());
    await devJson(fake, "POST", `/_dev/sessions/${s.id}/pay`, { card: "4242424242424242" });
    await waitFor("two deliveries", async () => (await deliveriesOf(fake)).filter((d) => d.status === "delivered").length === 2);
    const all = await stripe.events.list({ limit: 100 });
    expect(all.data.map((e) => e.type).sort()).toEqual(
      ["charge.succeeded", "checkout.session.completed", "payment_intent.created", "payment_intent.succeeded"].sort(),
    );
    const sent = verifiedEvents(receiver, stripe).map((e) => e.type).sort();
    expect(sent).toEqual(["checkout.session.completed", "payment_intent.succeeded"]);
    const undelivered = all.data.filter((e) => !sent.includes(e.type));
    expect(undelivered.every((e) => e.pending_webhooks === 0)).toBe(true);
  });

  it("a session whose expiry passed while the fake was stopped expires when it starts", async () => {
    const dir = await setup();
    const receiver = await receiverAt();
    const first = await startFake(dir, receiver.url);
    cleanups.push(() => first.close());
    const stripe1 = sdkFor(first);
    const s = await stripe1.checkout.sessions.create(depositParams());
    await first.close();
    // Move the expiry into the past in the state file, as if a day went by.
    const file = path.join(dir, "state.json");
    const state = JSON.parse(await readFile(file, "utf8")) as { sessions: { id: string; expires_at: number }[] };
    state.sessions.find((x) => x.id === s.id)!.expires_at = Math.floor(Date.now() / 1000) - 10;
    await writeFile(file, JSON.stringify(state));

    const second = await fakeAt(dir, receiver.url, { initialDelayMs: 50 });
    const stripe2 = sdkFor(second);
    expect((await stripe2.checkout.sessions.retrieve(s.id)).status).toBe("expired");
    await waitFor("the expired event", () => receiver.received.length === 1);
    const [event] = verifiedEvents(receiver, stripe2);
    expect(event.type).toBe("checkout.session.expired");
    expect((event.data.object as Stripe.Checkout.Session).id).toBe(s.id);
  });
});
