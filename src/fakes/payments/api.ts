import type { IncomingMessage, ServerResponse } from "node:http";
import { StripeApiError, invalidParam, invalidRequest, noSuch } from "./errors";
import { canonicalParams } from "./form";
import { newId, nowSeconds, publicView } from "./objects";
import { API_VERSION, type ApiResult, type FakeContext, type RequestInfo } from "./context";
import { checkAuth, parseParams, readBody, send } from "./http";
import { listOf, one } from "./lists";
import { list, LIST_PARAMS, onlyKnown, type Params, str } from "./params";
import { createRefund } from "./refunds";
import { armExpiry, createSession, expireSession, sessionOrThrow, sweepExpired } from "./sessions";

// ── The API: routing, idempotency, authentication ──────────────────────────────────────────────

const IDEMPOTENCY_WINDOW_S = 24 * 3600;
const MAX_IDEMPOTENCY_KEY = 255;

function routeApi(ctx: FakeContext, method: string, parts: string[], params: Params, request: RequestInfo): ApiResult {
  const ok = (body: unknown): ApiResult => ({ status: 200, body });
  const pathText = `/${parts.join("/")}`;
  const unrecognized = () =>
    invalidRequest(
      `Unrecognized request URL (${method}: ${pathText}). The dev payments server implements only the Checkout Session, PaymentIntent, Charge, Refund and Event calls Kilowright uses (see src/fakes/payments-server.ts).`,
      undefined,
      undefined,
      404,
    );
  const [, resource, a, b, c] = parts; // parts[0] === "v1"

  if (resource === "checkout" && a === "sessions") {
    if (b === undefined) {
      if (method === "POST") return ok(one(ctx, "checkout.session", createSession(ctx, params), params));
      if (method === "GET") {
        onlyKnown(params, [...LIST_PARAMS, "status", "payment_intent", "customer_details", "payment_link", "customer", "subscription"]);
        const status = str(params, "status");
        const piFilter = str(params, "payment_intent");
        return ok(
          listOf(ctx, "checkout.session", ctx.store.sessions.newestFirst(), params, "/v1/checkout/sessions", (s) => (status === null || s.status === status) && (piFilter === null || s.payment_intent === piFilter)),
        );
      }
      throw unrecognized();
    }
    const session = sessionOrThrow(ctx, b);
    if (c === undefined && method === "GET") {
      onlyKnown(params, ["expand"]);
      return ok(one(ctx, "checkout.session", session, params));
    }
    if (c === "expire" && method === "POST" && parts.length === 5) {
      onlyKnown(params, ["expand"]);
      if (session.status !== "open") {
        throw invalidRequest(`Only Checkout Sessions with a status in ["open"] can be expired. This Checkout Session has a status of "${session.status}".`, "session");
      }
      expireSession(ctx, session, request);
      armExpiry(ctx);
      return ok(one(ctx, "checkout.session", session, params));
    }
    if (c === "line_items" && method === "GET" && parts.length === 5) {
      onlyKnown(params, LIST_PARAMS);
      const items = [...session._line_items].map((li) => ({ ...li, created: 0 }));
      const listed = listOf(ctx, "item", items, params, `/v1/checkout/sessions/${session.id}/line_items`);
      return ok({ ...listed, data: (listed.data as Record<string, unknown>[]).map(({ created: _created, ...li }) => li) });
    }
    throw unrecognized();
  }

  if (resource === "payment_intents" && method === "GET" && b === undefined) {
    if (a === undefined) {
      onlyKnown(params, [...LIST_PARAMS, "customer"]);
      return ok(listOf(ctx, "payment_intent", ctx.store.paymentIntents.newestFirst(), params, "/v1/payment_intents"));
    }
    onlyKnown(params, ["expand", "client_secret"]);
    const pi = ctx.store.paymentIntents.get(a);
    if (!pi) throw noSuch("payment_intent", a, "intent");
    return ok(one(ctx, "payment_intent", pi, params));
  }

  if (resource === "charges" && method === "GET" && b === undefined) {
    if (a === undefined) {
      onlyKnown(params, [...LIST_PARAMS, "payment_intent", "customer", "transfer_group"]);
      const piFilter = str(params, "payment_intent");
      return ok(listOf(ctx, "charge", ctx.store.charges.newestFirst(), params, "/v1/charges", (ch) => piFilter === null || ch.payment_intent === piFilter));
    }
    onlyKnown(params, ["expand"]);
    const charge = ctx.store.charges.get(a);
    if (!charge) throw noSuch("charge", a, "charge");
    return ok(one(ctx, "charge", charge, params));
  }

  if (resource === "refunds" && b === undefined) {
    if (a === undefined && method === "POST") return ok(one(ctx, "refund", createRefund(ctx, params, request), params));
    if (a === undefined && method === "GET") {
      onlyKnown(params, [...LIST_PARAMS, "payment_intent", "charge"]);
      const piFilter = str(params, "payment_intent");
      const chargeFilter = str(params, "charge");
      return ok(
        listOf(ctx, "refund", ctx.store.refunds.newestFirst(), params, "/v1/refunds", (r) => (piFilter === null || r.payment_intent === piFilter) && (chargeFilter === null || r.charge === chargeFilter)),
      );
    }
    if (a !== undefined && method === "GET") {
      onlyKnown(params, ["expand"]);
      const refund = ctx.store.refunds.get(a);
      if (!refund) throw noSuch("refund", a, "refund");
      return ok(one(ctx, "refund", refund, params));
    }
    throw unrecognized();
  }

  if (resource === "events" && method === "GET" && b === undefined) {
    if (a === undefined) {
      onlyKnown(params, [...LIST_PARAMS, "type", "types", "delivery_success"]);
      const type = str(params, "type");
      const typesRaw = list(params, "types");
      const types = typesRaw ? typesRaw.map((t, i) => (typeof t === "string" ? t : (() => { throw invalidParam(`types[${i}]`, "Invalid string"); })())) : null;
      if (type !== null && types !== null) throw invalidRequest("You may only specify one of these parameters: type, types.", "type");
      const matches = (pattern: string, t: string) => (pattern.endsWith(".*") ? t.startsWith(pattern.slice(0, -1)) : pattern === t);
      const successRaw = str(params, "delivery_success");
      const deliveredFilter = successRaw === null ? null : successRaw === "true";
      return ok(
        listOf(ctx, "event", ctx.store.events.newestFirst(), params, "/v1/events", (e) => {
          if (type !== null && !matches(type, e.type)) return false;
          if (types !== null && !types.some((t) => matches(t, e.type))) return false;
          if (deliveredFilter !== null) {
            const ds = ctx.store.deliveries.all().filter((d) => d.eventId === e.id);
            const delivered = ds.length > 0 && ds.every((d) => d.status === "delivered");
            if (delivered !== deliveredFilter) return false;
          }
          return true;
        }),
      );
    }
    onlyKnown(params, ["expand"]);
    const event = ctx.store.events.get(a);
    if (!event) throw noSuch("event", a, "id");
    return ok(publicView(event));
  }

  throw unrecognized();
}

function pruneIdempotency(ctx: FakeContext): void {
  const cutoff = nowSeconds() - IDEMPOTENCY_WINDOW_S;
  for (const r of ctx.store.idempotency.all()) if (r.createdAt < cutoff) ctx.store.idempotency.delete(r.id);
}


export async function handleApi(ctx: FakeContext, req: IncomingMessage, res: ServerResponse, url: URL, parts: string[]): Promise<void> {
  const requestId = newId("req_", 14);
  const baseHeaders: Record<string, string> = {
    "request-id": requestId,
    "stripe-version": String(req.headers["stripe-version"] ?? API_VERSION),
  };
  const method = req.method ?? "GET";
  try {
    checkAuth(ctx, req);
    const rawKey = req.headers["idempotency-key"];
    const key = method === "POST" && rawKey !== undefined ? (Array.isArray(rawKey) ? rawKey[0] : rawKey) : null;
    if (key !== null) {
      if (key.length === 0 || key.length > MAX_IDEMPOTENCY_KEY) {
        throw invalidRequest(`Invalid idempotency key: keys must be between 1 and ${MAX_IDEMPOTENCY_KEY} characters long.`, undefined, "idempotency_key_invalid");
      }
      baseHeaders["idempotency-key"] = key;
    }
    const params = method === "GET" || method === "DELETE" ? parseParams(url.search.slice(1)) : parseParams(await readBody(req));
    const pathText = url.pathname.replace(/\/+$/, "");
    const paramsText = canonicalParams(params);

    if (sweepExpired(ctx)) {
      armExpiry(ctx);
      await ctx.store.save();
      ctx.sender.schedule();
    }
    if (key !== null) {
      pruneIdempotency(ctx);
      const existing = ctx.store.idempotency.get(key);
      if (existing) {
        if (existing.method !== method || existing.path !== pathText) {
          throw new StripeApiError(400, {
            type: "idempotency_error",
            message: `Keys for idempotent requests can only be used for the same endpoint they were first used for ('${existing.method} ${existing.path}' vs '${method} ${pathText}'). Try using a key other than '${key}' if you meant to execute a different request.`,
          });
        }
        if (existing.paramsText !== paramsText) {
          throw new StripeApiError(400, {
            type: "idempotency_error",
            message: `Keys for idempotent requests can only be used with the same parameters they were first used with. Try using a key other than '${key}' if you meant to execute a different request.`,
          });
        }
        return send(res, existing.status, existing.body, { ...baseHeaders, "request-id": existing.requestId, "idempotent-replayed": "true" });
      }
    }

    const info: RequestInfo = { id: requestId, idempotencyKey: key };
    let result: ApiResult;
    // From the idempotency check to recording the result nothing awaits, so two requests
    // with one key cannot both run.
    try {
      result = routeApi(ctx, method, parts, params, info);
    } catch (err) {
      // Errors raised once the call started executing (not bad parameters) are kept for the
      // key like results: a retry sees the same answer. The fake's only such error is a
      // refund refused for the amount; validation errors are not saved, as with the service.
      if (key !== null && err instanceof StripeApiError && err.error.code === "amount_too_large") {
        ctx.store.idempotency.add({ id: key, method, path: pathText, paramsText, status: err.status, body: err.body(), requestId, createdAt: nowSeconds() });
        await ctx.store.save();
      }
      throw err;
    }
    if (method === "POST") {
      if (key !== null) {
        ctx.store.idempotency.add({ id: key, method, path: pathText, paramsText, status: result.status, body: result.body, requestId, createdAt: nowSeconds() });
      }
      await ctx.store.save();
      ctx.sender.schedule();
    }
    return send(res, result.status, result.body, baseHeaders);
  } catch (err) {
    if (err instanceof StripeApiError) return send(res, err.status, err.body(), baseHeaders);
    throw err;
  }
}
