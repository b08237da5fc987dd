// Webhook delivery: each event is POSTed to the endpoint with a `Stripe-Signature` header
// (t=<unix seconds>,v1=<hex HMAC-SHA256 of "<t>.<payload>" keyed with the signing secret>,
// as documented at https://docs.stripe.com/webhooks#verify-manually), signed afresh on every
// attempt. Anything but a 2xx answer (including no answer at all) is retried with doubling
// delays up to a cap; the queue lives in the store, so a restart resumes it.
import { createHmac } from "node:crypto";
import type { Delivery, DeliveryAttempt, StripeEvent } from "./objects";
import { newId } from "./objects";
import type { PaymentsStore } from "./store";

export interface RetryOptions {
  /** Delay before the second attempt; each further delay doubles. Default 1000 ms. */
  initialDelayMs?: number;
  /** The longest delay between attempts. Default 60 000 ms. */
  maxDelayMs?: number;
  /** Stop retrying an event this long after it was created. Default 3 days (as the service). */
  giveUpAfterMs?: number;
  /** How long one attempt waits for an answer. Default 10 000 ms. */
  attemptTimeoutMs?: number;
}

export function signatureHeader(payload: string, secret: string, timestamp = Math.floor(Date.now() / 1000)): string {
  const v1 = createHmac("sha256", secret).update(`${timestamp}.${payload}`, "utf8").digest("hex");
  return `t=${timestamp},v1=${v1}`;
}

/** The payload as the service sends it: the event object, pretty-printed JSON. */
export function eventPayload(event: StripeEvent): string {
  return JSON.stringify(event, null, 2);
}

const MAX_CONCURRENT = 8;
const BODY_EXCERPT = 300;

export class WebhookSender {
  private timer: NodeJS.Timeout | null = null;
  private readonly inFlight = new Map<string, AbortController>();
  private closed = false;
  private readonly initialDelayMs: number;
  private readonly maxDelayMs: number;
  private readonly giveUpAfterMs: number;
  private readonly attemptTimeoutMs: number;

  constructor(
    private readonly store: PaymentsStore,
    private readonly url: string | null,
    private readonly secret: string,
    retry: RetryOptions = {},
    private readonly log: (line: string) => void = () => undefined,
  ) {
    this.initialDelayMs = retry.initialDelayMs ?? 1000;
    this.maxDelayMs = retry.maxDelayMs ?? 60_000;
    this.giveUpAfterMs = retry.giveUpAfterMs ?? 3 * 24 * 3600 * 1000;
    this.attemptTimeoutMs = retry.attemptTimeoutMs ?? 10_000;
  }

  get enabled(): boolean {
    return this.url !== null;
  }

  /** Queues one delivery of the event (the caller saves the store). */
  enqueue(event: StripeEvent): Delivery | null {
    if (!this.url) return null;
    const now = new Date().toISOString();
    const delivery: Delivery = {
      id: newId("whd_"),
      eventId: event.id,
      type: event.type,
      url: this.url,
      status: "pending",
      attempts: [],
      nextAttemptAt: now,
      createdAt: now,
      deliveredAt: null,
    };
    this.store.deliveries.add(delivery);
    this.refreshPending(event.id);
    return delivery;
  }

  /** Makes every pending delivery due now (dev API: skip the back-off). */
  flushNow(): number {
    let n = 0;
    const now = new Date().toISOString();
    for (const d of this.store.deliveries.all()) {
      if (d.status === "pending" && !this.inFlight.has(d.id)) {
        d.nextAttemptAt = now;
        n++;
      }
    }
    return n;
  }

  /** The number of endpoints still to acknowledge the event, as in `pending_webhooks`. */
  private refreshPending(eventId: string): void {
    const event = this.store.events.get(eventId);
    if (!event) return;
    event.pending_webhooks = this.store.deliveries.all().some((d) => d.eventId === eventId && d.status === "pending") ? 1 : 0;
  }

  delayAfter(attempts: number): number {
    return Math.min(this.initialDelayMs * 2 ** Math.max(0, attempts - 1), this.maxDelayMs);
  }

  /** Arms the timer for the next due delivery. Call after any change to the queue. */
  schedule(): void {
    if (this.closed) return;
    if (this.timer) clearTimeout(this.timer);
    this.timer = null;
    let next = Infinity;
    for (const d of this.store.deliveries.all()) {
      if (d.status !== "pending" || this.inFlight.has(d.id) || !d.nextAttemptAt) continue;
      next = Math.min(next, Date.parse(d.nextAttemptAt));
    }
    if (next === Infinity) return;
    const wait = Math.max(0, Math.min(next - Date.now(), 2 ** 31 - 1));
    this.timer = setTimeout(() => {
      this.timer = null;
      this.runDue();
    }, wait);
    this.timer.unref?.();
  }

  private runDue(): void {
    if (this.closed) return;
    const now = Date.now();
    const due = this.store.deliveries
      .all()
      .filter((d) => d.status === "pending" && !this.inFlight.has(d.id) && d.nextAttemptAt && Date.parse(d.nextAttemptAt) <= now)
      .sort((a, b) => Date.parse(a.nextAttemptAt ?? "") - Date.parse(b.nextAttemptAt ?? ""));
    for (const d of due) {
      if (this.inFlight.size >= MAX_CONCURRENT) break;
      void this.attempt(d);
    }
    this.schedule();
  }

  private async attempt(delivery: Delivery): Promise<void> {
    const event = this.store.events.get(delivery.eventId);
    if (!event) {
      delivery.status = "failed";
      delivery.nextAttemptAt = null;
      await this.store.save();
      return;
    }
    const controller = new AbortController();
    this.inFlight.set(delivery.id, controller);
    const timeout = setTimeout(() => controller.abort(new Error(`no answer within ${this.attemptTimeoutMs} ms`)), this.attemptTimeoutMs);
    const payload = eventPayload(event);
    const started = Date.now();
    const record: DeliveryAttempt = { at: new Date(started).toISOString(), status: null, error: null, durationMs: 0, body: null };
    try {
      const res = await fetch(delivery.url, {
        method: "POST",
        headers: {
          "content-type": "application/json; charset=utf-8",
          "user-agent": "Kilowright-DevPayments/1.0 (webhooks)",
          "stripe-signature": signatureHeader(payload, this.secret),
        },
        body: payload,
        signal: controller.signal,
        redirect: "manual",
      });
      record.status = res.status;
      const text = await res.text().catch(() => "");
      record.body = text.slice(0, BODY_EXCERPT);
    } catch (err) {
      record.error = describe(err);
    } finally {
      clearTimeout(timeout);
      this.inFlight.delete(delivery.id);
    }
    if (this.closed && record.status === null) return; // aborted by close(): the next start retries it
    record.durationMs = Date.now() - started;
    delivery.attempts.push(record);
    if (record.status !== null && record.status >= 200 && record.status < 300) {
      delivery.status = "delivered";
      delivery.deliveredAt = new Date().toISOString();
      delivery.nextAttemptAt = null;
    } else if (Date.now() - event.created * 1000 > this.giveUpAfterMs) {
      delivery.status = "failed";
      delivery.nextAttemptAt = null;
    } else {
      delivery.nextAttemptAt = new Date(Date.now() + this.delayAfter(delivery.attempts.length)).toISOString();
    }
    const outcome = record.status !== null ? `HTTP ${record.status}` : (record.error ?? "no answer");
    const next = delivery.status === "pending" && delivery.nextAttemptAt ? `, next try in ${Math.round((Date.parse(delivery.nextAttemptAt) - Date.now()) / 100) / 10} s` : "";
    this.log(`webhook ${event.id} ${event.type} attempt ${delivery.attempts.length}: ${outcome} → ${delivery.status}${next}`);
    this.refreshPending(event.id);
    await this.store.save().catch((err: unknown) => console.error("dev payments: could not save the delivery state", err));
    this.schedule();
  }

  async close(): Promise<void> {
    this.closed = true;
    if (this.timer) clearTimeout(this.timer);
    this.timer = null;
    for (const controller of this.inFlight.values()) controller.abort(new Error("dev payments server closing"));
    // Let the aborted attempts settle.
    const deadline = Date.now() + 2000;
    while (this.inFlight.size > 0 && Date.now() < deadline) await new Promise((r) => setTimeout(r, 10));
  }
}

function describe(err: unknown): string {
  if (!(err instanceof Error)) return String(err);
  const cause = (err as { cause?: unknown }).cause;
  if (cause instanceof Error) {
    const code = (cause as { code?: string }).code;
    return code ? `${code}: ${cause.message}` : cause.message;
  }
  return err.message;
}
