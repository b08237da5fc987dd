import { utilitySchema } from "@/lib/schemas/utility";
import { readById, writeById } from "@/server/route";
import { getUtilityOrThrow, updateUtility } from "@/server/utilities";

export const GET = readById("rates:read", "Utility", (member, id) => getUtilityOrThrow(member.companyId, id));

/** Replaces the utility's name, time zone and territory notes (same body as POST). */
export const PUT = writeById("rates:manage", "Utility", utilitySchema, updateUtility);
