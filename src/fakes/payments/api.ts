import type { IncomingMessage, ServerResponse } from "node:http";
import { StripeApiError, invalidRequest } from "./errors";
import { canonicalParams } from "./form";
import { newId, nowSeconds } from "./objects";
import { API_VERSION, ApiCall, type ApiResult, type FakeContext, type RequestInfo } from "./context";
import { checkAuth, parseParams, readBody, send } from "./http";
import { type Params } from "./params";
import { routeRefunds } from "./refunds";
import { armExpiry, routeSessions, sweepExpired } from "./sessions";
import { routeEvents } from "./events";
import { routePaymentIntents, routeCharges } from "./paying";

// ── The API: routing, idempotency, authentication ──────────────────────────────────────────────

const IDEMPOTENCY_WINDOW_S = 24 * 3600;
const MAX_IDEMPOTENCY_KEY = 255;

function routeApi(ctx: FakeContext, method: string, parts: string[], params: Params, request: RequestInfo): ApiResult {
  const pathText = `/${parts.join("/")}`;
  const unrecognized = () =>
    invalidRequest(
      `Unrecognized request URL (${method}: ${pathText}). The dev payments server implements only the Checkout Session, PaymentIntent, Charge, Refund and Event calls Kilowright uses (see src/fakes/payments-server.ts).`,
      undefined,
      undefined,
      404,
    );
  const call: ApiCall = { method, parts, params, request, unrecognized };
  const [, resource, a, b] = parts; // parts[0] === "v1"
  if (resource === "checkout" && a === "sessions") return routeSessions(ctx, call);
  if (resource === "payment_intents" && method === "GET" && b === undefined) return routePaymentIntents(ctx, call);
  if (resource === "charges" && method === "GET" && b === undefined) return routeCharges(ctx, call);
  if (resource === "refunds" && b === undefined) return routeRefunds(ctx, call);
  if (resource === "events" && method === "GET" && b === undefined) return routeEvents(ctx, call);
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
