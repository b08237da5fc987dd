import { utilitySchema } from "@/lib/schemas/utility";
import { deleteById, readById, writeById } from "@/server/route";
import { deleteUtility, getUtilityOrThrow, updateUtility } from "@/server/utilities";

export const GET = readById("rates:read", "Utility", (member, id) => getUtilityOrThrow(member.companyId, id));

/** Replaces the utility's name, time zone and territory notes (same body as POST). */
export const PUT = writeById("rates:manage", "Utility", utilitySchema, updateUtility);

/** Deletes a utility nothing uses; 409 naming the households, rate plans and incentives that use it. */
export const DELETE = deleteById("rates:manage", "Utility", deleteUtility);
