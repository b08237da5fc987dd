import type { IncomingMessage, ServerResponse } from "node:http";
import { StripeApiError, invalidRequest, noSuch } from "./errors";
import { newId, publicView } from "./objects";
import type { FakeContext } from "./context";
import { attemptFromFields } from "./hosted-page";
import { parseParams, readBody, send } from "./http";
import type { Params } from "./params";
import { armExpiry, sessionOrThrow, sweepExpired } from "./sessions";

// ── Dev control API ──────────────────────────────────────────────

const DEV_API = [
  "GET  /_dev/deliveries[?event=evt_…&type=…&status=pending|delivered|failed]  every webhook delivery and its attempts, newest first",
  "POST /_dev/deliveries/flush  makes every pending delivery due now",
  "POST /_dev/events/:id/redeliver  queues one more delivery of an event",
  'POST /_dev/sessions/:id/pay  {"card":"4242424242424242","exp?":"12/30","cvc?":"123","postal_code?":"10001","email?":"…"}  pays without a browser',
];

function isLoopback(req: IncomingMessage): boolean {
  const a = req.socket.remoteAddress ?? "";
  return a === "127.0.0.1" || a === "::1" || a === "::ffff:127.0.0.1" || a.startsWith("127.");
}

async function readDevParams(req: IncomingMessage): Promise<Params> {
  const text = await readBody(req);
  if (text.trim() === "") return {};
  if (String(req.headers["content-type"] ?? "").includes("application/json")) {
    let parsed: unknown;
    try {
      parsed = JSON.parse(text);
    } catch {
      throw invalidRequest("The request body must be valid JSON.");
    }
    if (typeof parsed !== "object" || parsed === null || Array.isArray(parsed)) throw invalidRequest("The request body must be a JSON object.");
    const out: Params = {};
    for (const [k, v] of Object.entries(parsed)) if (v !== null && v !== undefined) out[k] = String(v);
    return out;
  }
  return parseParams(text);
}

export async function handleDev(ctx: FakeContext, req: IncomingMessage, res: ServerResponse, url: URL, parts: string[]): Promise<void> {
  const method = req.method ?? "GET";
  try {
    if (!isLoopback(req)) throw invalidRequest("The dev control API answers only on loopback.", undefined, undefined, 403);
    const [, a, b, c] = parts;
    if (a === undefined && method === "GET") return send(res, 200, { data: DEV_API });
    if (a === "deliveries" && b === undefined && method === "GET") {
      const event = url.searchParams.get("event");
      const type = url.searchParams.get("type");
      const status = url.searchParams.get("status");
      const data = ctx.store.deliveries
        .newestFirst()
        .filter((d) => (!event || d.eventId === event) && (!type || d.type === type) && (!status || d.status === status));
      return send(res, 200, { data: structuredClone(data) });
    }
    if (a === "deliveries" && b === "flush" && c === undefined && method === "POST") {
      const due = ctx.sender.flushNow();
      ctx.sender.schedule();
      return send(res, 200, { data: { due } });
    }
    if (a === "events" && b && c === "redeliver" && method === "POST") {
      const event = ctx.store.events.get(b);
      if (!event) throw noSuch("event", b, "id");
      const delivery = ctx.sender.enqueue(event);
      if (!delivery) throw invalidRequest("This dev payments server has no webhook URL, so nothing can be delivered.");
      const queued = structuredClone(delivery); // as queued: it may be sent before this answer
      await ctx.store.save();
      ctx.sender.schedule();
      return send(res, 200, { data: queued });
    }
    if (a === "sessions" && b && c === "pay" && method === "POST") {
      const params = await readDevParams(req);
      const session = sessionOrThrow(ctx, b);
      if (sweepExpired(ctx)) armExpiry(ctx);
      if (session.status !== "open") throw invalidRequest(`This Checkout Session is ${session.status}, so it cannot be paid.`, "session", "checkout_session_not_open");
      const year = new Date().getUTCFullYear() + 5;
      const number = (params.card ?? params.number ?? "4242424242424242") as string;
      const digits = number.replace(/\D/g, "");
      const attempt = attemptFromFields(ctx, 
        session,
        {
          number,
          exp: (params.exp as string | undefined) ?? `12/${String(year).slice(-2)}`,
          cvc: (params.cvc as string | undefined) ?? (/^3[47]/.test(digits) ? "1234" : "123"),
          postal: (params.postal_code as string | undefined) ?? "10001",
          email: (params.email as string | undefined) ?? (session.customer_email ? null : "payer@example.com"),
        },
        { id: newId("req_", 14), idempotencyKey: null },
      );
      if (attempt.kind === "field") throw invalidRequest(attempt.message, attempt.field);
      await ctx.store.save();
      ctx.sender.schedule();
      const pi = session.payment_intent ? ctx.store.paymentIntents.get(session.payment_intent) : undefined;
      const data = { session: publicView(session), payment_intent: pi ? publicView(pi) : null };
      if (attempt.kind === "declined") {
        const d = attempt.decline;
        const err = new StripeApiError(402, {
          type: "card_error",
          code: d.code,
          ...(d.declineCode ? { decline_code: d.declineCode } : {}),
          message: d.message,
          payment_intent: data.payment_intent,
        });
        return send(res, 402, { ...err.body(), data });
      }
      return send(res, 200, { data });
    }
    throw invalidRequest(`Unrecognized dev control URL (${method}: ${url.pathname}).`, undefined, undefined, 404);
  } catch (err) {
    if (err instanceof StripeApiError) return send(res, err.status, err.body());
    throw err;
  }
}
