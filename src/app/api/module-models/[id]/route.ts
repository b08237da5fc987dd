import { modulePatchSchema } from "@/lib/schemas/catalog";
import { getModuleOrThrow, patchModule, setModuleActive } from "@/server/catalog";
import { deleteById, readById, writeById } from "@/server/route";

export const GET = readById("catalog:read", "Module", (member, id) => getModuleOrThrow(member.companyId, id));

/** Changes some fields (the result is checked as a whole) and/or `active`. */
export const PATCH = writeById("catalog:manage", "Module", modulePatchSchema, patchModule);

/** Equipment is never deleted (designs keep their datasheets): DELETE deactivates. */
export const DELETE = deleteById("catalog:manage", "Module", (member, id) => setModuleActive(member, id, false));
