import { inverterPatchSchema } from "@/lib/schemas/catalog";
import { getInverterOrThrow, patchInverter, setInverterActive } from "@/server/catalog";
import { deleteById, readById, writeById } from "@/server/route";

export const GET = readById("catalog:read", "Inverter", (member, id) => getInverterOrThrow(member.companyId, id));

/** Changes some fields (the result is checked as a whole) and/or `active`. */
export const PATCH = writeById("catalog:manage", "Inverter", inverterPatchSchema, patchInverter);

/** Equipment is never deleted (designs keep their datasheets): DELETE deactivates. */
export const DELETE = deleteById("catalog:manage", "Inverter", (member, id) => setInverterActive(member, id, false));
