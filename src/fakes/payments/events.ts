import { newId, nowSeconds, publicView, type StripeEvent } from "./objects";
import { API_VERSION, type FakeContext, type RequestInfo } from "./context";

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
