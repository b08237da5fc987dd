import { NextResponse } from "next/server";
import Stripe from "stripe";
import { BODY_CAPS, readCappedText } from "@/server/body-limit";
import { errorResponse, toErrorResponse } from "@/server/route";
import { isDatabaseDown } from "@/server/errors";
import { verifyWebhookSignature } from "@/server/stripe";
import { parseSignedEvent, processStripeEvent, recordRejectedEvent } from "@/server/webhooks";

export const dynamic = "force-dynamic";

/**
 * Stripe's webhook endpoint (public: the signature is the authentication). Reads the raw body
 * (at most BODY_CAPS.webhook: 413 past it), verifies Stripe-Signature (400 and nothing written
 * on a bad or stale one), records a signed but malformed body as rejected (2xx, so it is not
 * retried), processes the
 * event exactly once and answers 2xx only after the ledger write has committed; any failure
 * answers 5xx so the provider delivers the event again.
 */
export async function POST(req: Request): Promise<Response> {
  let raw: string;
  try {
    raw = await readCappedText(req, BODY_CAPS.webhook);
  } catch (err) {
    return toErrorResponse(err); // 413 past the cap, before the rest is read
  }
  try {
    verifyWebhookSignature(raw, req.headers.get("stripe-signature"));
  } catch (err) {
    if (err instanceof Stripe.errors.StripeSignatureVerificationError) {
      return errorResponse(400, "bad_signature", "The Stripe-Signature header does not match this body (or is too old).");
    }
    throw err;
  }
  const parsed = parseSignedEvent(raw);
  // Signed by the provider but not something we can act on: recorded as rejected, answered 2xx
  // so it is not delivered again (a retry would carry the same body).
  const eventId = parsed.ok ? parsed.event.id : parsed.id;
  const eventType = parsed.ok ? parsed.event.type : parsed.type;
  try {
    const result = parsed.ok ? await processStripeEvent(parsed.event) : await recordRejectedEvent(parsed.id, parsed.type, parsed.reason);
    return NextResponse.json({ received: true, ...result }, { headers: { "Cache-Control": "no-store" } });
  } catch (err) {
    console.error(`webhook ${eventId} (${eventType}) not processed; the provider will retry`, err);
    if (isDatabaseDown(err)) return errorResponse(503, "database_unavailable", "The database cannot be reached right now; deliver again later.");
    return errorResponse(500, "internal_error", "The event could not be processed; deliver again later.");
  }
}
