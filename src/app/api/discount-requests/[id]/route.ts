import { getDiscountRequestOrThrow } from "@/server/offers";
import { readById } from "@/server/route";

export const GET = readById("deals:read-own", "Discount request", getDiscountRequestOrThrow);
