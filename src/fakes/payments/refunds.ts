import { invalidParam, invalidRequest, noSuch } from "./errors";
import { formatAmount, newId, nowSeconds, publicView, type Charge, type PaymentIntent, type Refund } from "./objects";
import { type ApiCall, type ApiResult, type FakeContext, ok, type RequestInfo } from "./context";
import { emit } from "./events";
import { int, LIST_PARAMS, metadataOf, onlyKnown, type Params, str } from "./params";
import { one, listOf } from "./lists";

// ── Refunds ──────────────────────────────────────────────

const REFUND_CREATE_PARAMS = ["payment_intent", "charge", "amount", "reason", "metadata", "expand", "instructions_email", "refund_application_fee", "reverse_transfer", "currency", "origin", "customer"];

export function createRefund(ctx: FakeContext, params: Params, request: RequestInfo): Refund {
  onlyKnown(params, REFUND_CREATE_PARAMS);
  const piId = str(params, "payment_intent");
  const chargeId = str(params, "charge");
  if (piId === null && chargeId === null) throw invalidRequest("One of the following params should be provided for this request: payment_intent or charge.", "payment_intent", "parameter_missing");
  let charge: Charge | undefined;
  let pi: PaymentIntent | undefined;
  if (piId !== null) {
    pi = ctx.store.paymentIntents.get(piId);
    if (!pi) throw noSuch("payment_intent", piId, "payment_intent");
    const latest = pi.latest_charge ? ctx.store.charges.get(pi.latest_charge) : undefined;
    if (pi.status !== "succeeded" || !latest || latest.status !== "succeeded") {
      throw invalidRequest(`This PaymentIntent (${piId}) does not have a successful charge to refund.`, "payment_intent");
    }
    charge = latest;
  }
  if (chargeId !== null) {
    const byCharge = ctx.store.charges.get(chargeId);
    if (!byCharge) throw noSuch("charge", chargeId, "charge");
    if (charge && charge.id !== byCharge.id) throw invalidRequest(`Charge ${chargeId} does not belong to PaymentIntent ${piId}.`, "charge");
    if (byCharge.status !== "succeeded") throw invalidRequest(`Charge ${chargeId} has not succeeded, so it cannot be refunded.`, "charge");
    charge = byCharge;
    pi = ctx.store.paymentIntents.get(byCharge.payment_intent);
  }
  if (!charge || !pi) throw invalidRequest("No charge to refund.", "charge");
  const remaining = charge.amount - charge.amount_refunded;
  if (remaining <= 0) throw invalidRequest(`Charge ${charge.id} has already been refunded.`, undefined, "charge_already_refunded");
  const amount = int(params, "amount", { min: 1 }) ?? remaining;
  if (amount > remaining) {
    throw invalidRequest(
      `Refund amount (${formatAmount(amount, charge.currency)}) is greater than unrefunded amount on charge (${formatAmount(remaining, charge.currency)})`,
      "amount",
      "amount_too_large",
    );
  }
  const reason = str(params, "reason");
  if (reason !== null && !["duplicate", "fraudulent", "requested_by_customer"].includes(reason)) {
    throw invalidParam("reason", `Invalid reason: must be one of duplicate, fraudulent, or requested_by_customer`);
  }
  const refund: Refund = {
    id: newId("re_"),
    object: "refund",
    amount,
    balance_transaction: newId("txn_"),
    charge: charge.id,
    created: nowSeconds(),
    currency: charge.currency,
    destination_details: { card: { reference_status: "pending", reference_type: "acquirer_reference_number", type: "refund" }, type: "card" },
    metadata: metadataOf(params, "metadata"),
    payment_intent: pi.id,
    reason: reason as Refund["reason"],
    receipt_number: null,
    source_transfer_reversal: null,
    status: "succeeded",
    transfer_reversal: null,
  };
  ctx.store.refunds.add(refund);
  const previous = { amount_refunded: charge.amount_refunded, refunded: charge.refunded, refunds: publicView(charge.refunds) };
  charge.amount_refunded += amount;
  charge.refunded = charge.amount_refunded >= charge.amount;
  charge.refunds.data.unshift(refund);
  charge.refunds.total_count = charge.refunds.data.length;
  emit(ctx, "refund.created", refund, request);
  emit(ctx, "charge.refunded", charge, request, charge.refunded ? previous : { amount_refunded: previous.amount_refunded, refunds: previous.refunds });
  return refund;
}

/** /v1/refunds[/:id] */
export function routeRefunds(ctx: FakeContext, call: ApiCall): ApiResult {
  const { parts, method, params, request, unrecognized } = call;
  const [, , a] = parts; // parts[0] === "v1"
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
