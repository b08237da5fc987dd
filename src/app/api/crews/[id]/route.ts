import { updateCrewSchema } from "@/lib/schemas/jobs";
import { getCrewOrThrow, updateCrew } from "@/server/crews";
import { readById, writeById } from "@/server/route";

export const GET = readById("crews:manage", "Crew", getCrewOrThrow);

/** Rename, and/or set exactly which installers are in the crew. */
export const PATCH = writeById("crews:manage", "Crew", updateCrewSchema, updateCrew);
