import { getPaymentOrThrow } from "@/server/payments";
import { readById } from "@/server/route";

/** One ledger payment of the member's company (reps: of their own deals). */
export const GET = readById("payments:read", "Payment", getPaymentOrThrow);
