import { ratePlanRecordSchema } from "@/lib/schemas/rate-plan";
import { getRatePlanOrThrow, updateRatePlan } from "@/server/rate-plans";
import { readById, writeById } from "@/server/route";

export const GET = readById("rates:read", "Rate plan", (member, id) => getRatePlanOrThrow(member.companyId, id));

/** Replaces the plan's content (same body as POST). */
export const PUT = writeById("rates:manage", "Rate plan", ratePlanRecordSchema, updateRatePlan);
