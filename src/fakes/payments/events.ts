import { newId, nowSeconds, publicView, type StripeEvent } from "./objects";
import { API_VERSION, type ApiCall, type ApiResult, type FakeContext, ok, type RequestInfo } from "./context";
import { invalidParam, invalidRequest, noSuch } from "./errors";
import { listOf } from "./lists";
import { list, LIST_PARAMS, onlyKnown, str } from "./params";

// ── Events ──────────────────────────────────────────────

export function emit(ctx: FakeContext, type: string, object: unknown, request: RequestInfo, previous?: Record<string, unknown>): StripeEvent {
  const event: StripeEvent = {
    id: newId("evt_"),
    object: "event",
    api_version: API_VERSION,
    created: nowSeconds(),
    data: { object: publicView(object as object), ...(previous ? { previous_attributes: previous } : {}) },
    livemode: false,
    pending_webhooks: 0,
    request: { id: request.id, idempotency_key: request.idempotencyKey },
    type,
  };
  ctx.store.events.add(event);
  if (ctx.webhookEvents.has(type)) ctx.sender.enqueue(event);
  return event;
}

/** GET /v1/events[/:id] */
export function routeEvents(ctx: FakeContext, call: ApiCall): ApiResult {
  const { parts, params } = call;
  const [, , a] = parts; // parts[0] === "v1"
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
