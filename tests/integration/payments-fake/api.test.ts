// The dev payments server's API through the real Stripe SDK: Checkout Sessions, errors,
// authentication, idempotency keys, lists and expansion.
import Stripe from "stripe";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { API_VERSION, type PaymentsFake } from "@/fakes/payments-server";
import { API_KEY, depositParams, devJson, removeDir, sdkFor, startFake, tempDir } from "./support";

let dir: string;
let fake: PaymentsFake;
let stripe: Stripe;

beforeAll(async () => {
  dir = await tempDir("payments-api");
  fake = await startFake(dir, null);
  stripe = sdkFor(fake);
});

afterAll(async () => {
  await fake?.close();
  await removeDir(dir);
});

async function rawApi(method: string, pathname: string, body: string | null, headers: Record<string, string> = {}) {
  const res = await fetch(`${fake.url}${pathname}`, {
    method,
    headers: { authorization: `Bearer ${API_KEY}`, "content-type": "application/x-www-form-urlencoded", ...headers },
    body,
  });
  return { status: res.status, headers: res.headers, body: (await res.json()) as Record<string, any> };
}

describe("Checkout Sessions", () => {
  it("creates a session in Stripe's shape, with the hosted page as its url", async () => {
    const before = Math.floor(Date.now() / 1000);
    const s = await stripe.checkout.sessions.create(depositParams({ client_reference_id: "proposal-601-v2" }));
    expect(s.id).toMatch(/^cs_test_[A-Za-z0-9]+$/);
    expect(s).toMatchObject({
      object: "checkout.session",
      mode: "payment",
      amount_total: 50_000,
      amount_subtotal: 50_000,
      currency: "usd",
      status: "open",
      payment_status: "unpaid",
      payment_intent: null,
      livemode: false,
      customer_email: "household@example.com",
      client_reference_id: "proposal-601-v2",
      metadata: { dealId: "7a11a55e-0000-4000-8000-000000000001", proposalId: "7a11a55e-0000-4000-8000-000000000601" },
      success_url: "http://localhost:3999/p/tok123?paid={CHECKOUT_SESSION_ID}",
      cancel_url: "http://localhost:3999/p/tok123",
    });
    expect(s.url).toBe(`${fake.url}/pay/${s.id}`);
    expect(s.created).toBeGreaterThanOrEqual(before);
    // Default expiry: 24 hours after creation, as the service.
    expect(s.expires_at - s.created).toBe(24 * 3600);
    expect(s).not.toHaveProperty("_line_items");
  });

  it("accepts line items given as amount and currency, and a chosen expiry", async () => {
    const expiresAt = Math.floor(Date.now() / 1000) + 3600;
    const s = await stripe.checkout.sessions.create({
      mode: "payment",
      // The older inline form is not in the SDK's types any more; the API read it as below.
      line_items: [{ amount: 12_345, currency: "USD", name: "Deposit", quantity: 2 } as unknown as Stripe.Checkout.SessionCreateParams.LineItem],
      expires_at: expiresAt,
      success_url: "http://localhost:3999/done",
    });
    expect(s.amount_total).toBe(24_690);
    expect(s.currency).toBe("usd");
    expect(s.expires_at).toBe(expiresAt);
    const items = await stripe.checkout.sessions.listLineItems(s.id);
    expect(items.data).toHaveLength(1);
    expect(items.data[0]).toMatchObject({ object: "item", description: "Deposit", quantity: 2, amount_total: 24_690, currency: "usd" });
  });

  it("retrieves a session, with line_items expanded on request", async () => {
    const created = await stripe.checkout.sessions.create(depositParams());
    const got = await stripe.checkout.sessions.retrieve(created.id, { expand: ["line_items"] });
    expect(got.id).toBe(created.id);
    expect(got.line_items?.data[0]).toMatchObject({ description: "Deposit for the Prairieline PL-410 system", amount_total: 50_000 });
  });

  it("expires an open session once, with checkout.session.expired in the events", async () => {
    const s = await stripe.checkout.sessions.create(depositParams());
    const expired = await stripe.checkout.sessions.expire(s.id);
    expect(expired).toMatchObject({ id: s.id, status: "expired", payment_status: "unpaid", url: null });
    const again = await stripe.checkout.sessions.expire(s.id).catch((e: unknown) => e);
    expect(again).toBeInstanceOf(Stripe.errors.StripeInvalidRequestError);
    const events = await stripe.events.list({ type: "checkout.session.expired", limit: 100 });
    const mine = events.data.filter((e) => (e.data.object as Stripe.Checkout.Session).id === s.id);
    expect(mine).toHaveLength(1);
    expect(mine[0]).toMatchObject({ object: "event", livemode: false, api_version: API_VERSION });
    // A paid-for page of an expired session says so.
    const page = await fetch(`${fake.url}/pay/${s.id}`);
    expect(page.status).toBe(410);
    expect(await page.text()).toContain("This checkout has expired");
  });

  it("answers resource_missing (404) for an unknown session", async () => {
    const err = await stripe.checkout.sessions.retrieve("cs_test_nope").catch((e: unknown) => e);
    expect(err).toBeInstanceOf(Stripe.errors.StripeInvalidRequestError);
    expect(err).toMatchObject({ statusCode: 404, code: "resource_missing", message: "No such checkout.session: 'cs_test_nope'" });
  });
});

describe("errors in Stripe's shape", () => {
  it("a missing parameter names it", async () => {
    const { line_items: _omit, ...params } = depositParams();
    const err = await stripe.checkout.sessions.create(params).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(Stripe.errors.StripeInvalidRequestError);
    expect(err).toMatchObject({ statusCode: 400, type: "StripeInvalidRequestError", code: "parameter_missing", param: "line_items" });

    const noName = depositParams({
      line_items: [{ quantity: 1, price_data: { currency: "usd", unit_amount: 100, product_data: { description: "no name" } as unknown as { name: string } } }],
    });
    const err2 = await stripe.checkout.sessions.create(noName).catch((e: unknown) => e);
    expect(err2).toMatchObject({ statusCode: 400, code: "parameter_missing", param: "line_items[0][price_data][product_data][name]" });
  });

  it("bad values and unknown parameters are 400 invalid_request_error", async () => {
    const raw = await rawApi("POST", "/v1/checkout/sessions", "mode=payment&line_items[0][quantity]=x");
    expect(raw.status).toBe(400);
    expect(raw.body.error).toMatchObject({ type: "invalid_request_error", code: "parameter_invalid_integer", param: "line_items[0][quantity]" });

    const unknown = await rawApi("POST", "/v1/checkout/sessions", "mode=payment&colour=copper");
    expect(unknown.body.error).toMatchObject({ type: "invalid_request_error", code: "parameter_unknown", param: "colour" });

    const tooSoon = await stripe.checkout.sessions.create(depositParams({ expires_at: Math.floor(Date.now() / 1000) + 60 })).catch((e: unknown) => e);
    expect(tooSoon).toMatchObject({ statusCode: 400, param: "expires_at" });

    const tooSmall = await stripe.checkout.sessions
      .create(depositParams({ line_items: [{ quantity: 1, price_data: { currency: "usd", unit_amount: 10, product_data: { name: "x" } } }] }))
      .catch((e: unknown) => e);
    expect(tooSmall).toMatchObject({ statusCode: 400, code: "amount_too_small" });
  });

  it("a wrong key is a StripeAuthenticationError (401); no key too", async () => {
    const wrong = sdkFor(fake, "sk_test_not_the_right_key_000");
    const err = await wrong.checkout.sessions.list().catch((e: unknown) => e);
    expect(err).toBeInstanceOf(Stripe.errors.StripeAuthenticationError);
    expect(err).toMatchObject({ statusCode: 401 });
    expect((err as Error).message).not.toContain("not_the_right_key"); // the key is masked

    const none = await fetch(`${fake.url}/v1/checkout/sessions`);
    expect(none.status).toBe(401);
    expect(((await none.json()) as { error: { type: string } }).error.type).toBe("invalid_request_error");
  });

  it("an unknown URL is a 404 invalid_request_error", async () => {
    const err = await rawApi("POST", "/v1/subscriptions", "");
    expect(err.status).toBe(404);
    expect(err.body.error.message).toMatch(/^Unrecognized request URL \(POST: \/v1\/subscriptions\)/);
  });

  it("agrees with the installed SDK's API version and sends a Request-Id", async () => {
    expect(API_VERSION).toBe(Stripe.API_VERSION);
    const res = await rawApi("GET", "/v1/events?limit=1", null);
    expect(res.headers.get("request-id")).toMatch(/^req_/);
  });
});

describe("Idempotency-Key", () => {
  it("the same key and parameters replay the first answer", async () => {
    const key = `deposit-proposal-601-v1-${Date.now()}`;
    const first = await stripe.checkout.sessions.create(depositParams(), { idempotencyKey: key });
    const second = await stripe.checkout.sessions.create(depositParams(), { idempotencyKey: key });
    expect(second.id).toBe(first.id);
    expect(second.lastResponse.headers["idempotent-replayed"]).toBe("true");
    expect(first.lastResponse.headers["idempotent-replayed"]).toBeUndefined();
    expect(second.lastResponse.requestId).toBe(first.lastResponse.requestId);
    const all = await stripe.checkout.sessions.list({ limit: 100 });
    expect(all.data.filter((s) => s.id === first.id)).toHaveLength(1);
  });

  it("five requests at once with one key make one session", async () => {
    const key = `deposit-double-click-${Date.now()}`;
    const results = await Promise.all(Array.from({ length: 5 }, () => stripe.checkout.sessions.create(depositParams(), { idempotencyKey: key })));
    expect(new Set(results.map((r) => r.id)).size).toBe(1);
    expect(results.filter((r) => r.lastResponse.headers["idempotent-replayed"] === "true")).toHaveLength(4);
  });

  it("the same key with other parameters is a 400 idempotency_error", async () => {
    const key = `deposit-conflict-${Date.now()}`;
    await stripe.checkout.sessions.create(depositParams(), { idempotencyKey: key });
    const err = await stripe.checkout.sessions
      .create(depositParams({ metadata: { dealId: "another" } }), { idempotencyKey: key })
      .catch((e: unknown) => e);
    expect(err).toBeInstanceOf(Stripe.errors.StripeIdempotencyError);
    expect(err).toMatchObject({ statusCode: 400, rawType: "idempotency_error" });
    expect((err as Error).message).toContain("same parameters");

    const otherEndpoint = await rawApi("POST", "/v1/refunds", "payment_intent=pi_x", { "idempotency-key": key });
    expect(otherEndpoint.status).toBe(400);
    expect(otherEndpoint.body.error).toMatchObject({ type: "idempotency_error" });
    expect(otherEndpoint.body.error.message).toContain("same endpoint");
  });

  it("a request refused for its parameters is not remembered under the key", async () => {
    const key = `deposit-bad-first-${Date.now()}`;
    const bad = await rawApi("POST", "/v1/checkout/sessions", "mode=payment", { "idempotency-key": key });
    expect(bad.status).toBe(400);
    const good = await stripe.checkout.sessions.create(depositParams(), { idempotencyKey: key });
    expect(good.status).toBe("open");
  });
});

describe("lists", () => {
  it("page newest first with limit, starting_after and has_more, and auto-pagination sees every one", async () => {
    const own = await tempDir("payments-list");
    const listFake = await startFake(own, null);
    const sdk = sdkFor(listFake);
    try {
      const ids: string[] = [];
      for (let i = 0; i < 7; i++) ids.push((await sdk.checkout.sessions.create(depositParams({ client_reference_id: `n${i}` }))).id);
      const newestFirst = [...ids].reverse();

      const page1 = await sdk.checkout.sessions.list({ limit: 3 });
      expect(page1).toMatchObject({ object: "list", has_more: true, url: "/v1/checkout/sessions" });
      expect(page1.data.map((s) => s.id)).toEqual(newestFirst.slice(0, 3));
      const page2 = await sdk.checkout.sessions.list({ limit: 3, starting_after: page1.data[2].id });
      expect(page2.data.map((s) => s.id)).toEqual(newestFirst.slice(3, 6));
      expect(page2.has_more).toBe(true);
      const page3 = await sdk.checkout.sessions.list({ limit: 3, starting_after: page2.data[2].id });
      expect(page3.data.map((s) => s.id)).toEqual(newestFirst.slice(6));
      expect(page3.has_more).toBe(false);
      const back = await sdk.checkout.sessions.list({ limit: 2, ending_before: page3.data[0].id });
      expect(back.data.map((s) => s.id)).toEqual(newestFirst.slice(4, 6));

      const seen: string[] = [];
      for await (const s of sdk.checkout.sessions.list({ limit: 2 })) seen.push(s.id);
      expect(seen).toEqual(newestFirst);

      const tooMany = await sdk.checkout.sessions.list({ limit: 101 }).catch((e: unknown) => e);
      expect(tooMany).toMatchObject({ statusCode: 400, param: "limit" });
      const unknownCursor = await sdk.checkout.sessions.list({ starting_after: "cs_test_gone" }).catch((e: unknown) => e);
      expect(unknownCursor).toMatchObject({ statusCode: 404, code: "resource_missing", param: "starting_after" });

      await sdk.checkout.sessions.expire(ids[0]);
      const open = await sdk.checkout.sessions.list({ status: "open", limit: 100 });
      expect(open.data).toHaveLength(6);
      const events = await sdk.events.list({ limit: 100 });
      expect(events.data.map((e) => e.type)).toEqual(["checkout.session.expired"]);
    } finally {
      await listFake.close();
      await removeDir(own);
    }
  });

  it("the dev control API is there without a key on loopback", async () => {
    const res = await devJson(fake, "GET", "/_dev/deliveries");
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ data: [] }); // this fake has no webhook URL
  });
});
