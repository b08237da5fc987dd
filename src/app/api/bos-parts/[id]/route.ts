import { bosPatchSchema } from "@/lib/schemas/bos";
import { getBosPartOrThrow, setBosPartActive } from "@/server/bos-catalog";
import { deleteById, readById, writeById } from "@/server/route";

export const GET = readById("catalog:read", "Part", (member, id) => getBosPartOrThrow(member.companyId, id));

/** Reactivates or deactivates a part (its fields change through the CSV import). */
export const PATCH = writeById("catalog:manage", "Part", bosPatchSchema, (member, id, input) => setBosPartActive(member, id, input.active));

/** Parts are never deleted (bills of materials name them): DELETE deactivates. */
export const DELETE = deleteById("catalog:manage", "Part", (member, id) => setBosPartActive(member, id, false));
