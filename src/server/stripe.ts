import "server-only";
// The one Stripe client. With STRIPE_API_BASE set (demo and test instances) the official SDK
// talks to the dev payments server on loopback (src/fakes/payments-server.ts) through its
// host/port/protocol options; without it, to Stripe itself with the configured key.
import Stripe from "stripe";
import { env } from "@/env";

let client: Stripe | undefined;

export function stripe(): Stripe {
  if (!client) {
    const { STRIPE_SECRET_KEY, STRIPE_API_BASE } = env();
    const base = STRIPE_API_BASE ? new URL(STRIPE_API_BASE) : null;
    client = new Stripe(STRIPE_SECRET_KEY, {
      telemetry: false,
      // The app retries through its own idempotency keys; the SDK's retries would hide errors from the person.
      maxNetworkRetries: 1,
      timeout: 20_000,
      ...(base
        ? {
            host: base.hostname,
            port: Number(base.port || (base.protocol === "https:" ? 443 : 80)),
            protocol: base.protocol === "https:" ? ("https" as const) : ("http" as const),
          }
        : {}),
    });
  }
  return client;
}

/**
 * Checks only the Stripe-Signature over the raw body (tolerance 300 s); throws on a bad or stale
 * one. The body is read afterwards (parseSignedEvent), so a signed but malformed body is told
 * apart from a forged one.
 */
export function verifyWebhookSignature(rawBody: string, signature: string | null): void {
  if (!signature) throw new Stripe.errors.StripeSignatureVerificationError("", rawBody, { message: "No Stripe-Signature header" });
  const verifier = stripe().webhooks.signature;
  if (!verifier) throw new Error("This Stripe SDK build cannot verify webhook signatures.");
  verifier.verifyHeader(rawBody, signature, env().STRIPE_WEBHOOK_SECRET, 300);
}
