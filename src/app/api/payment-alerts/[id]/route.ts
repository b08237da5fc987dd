import { getPaymentAlertOrThrow } from "@/server/payments";
import { readById } from "@/server/route";

/** One payment alert of the member's company (the office's reconciliation roles). */
export const GET = readById("payments:reconcile", "Payment alert", getPaymentAlertOrThrow);
