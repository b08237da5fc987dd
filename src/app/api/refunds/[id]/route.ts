import { getRefundOrThrow } from "@/server/payments";
import { readById } from "@/server/route";

/** One refund of the member's company (reps: of their own deals). */
export const GET = readById("payments:read", "Refund", getRefundOrThrow);
