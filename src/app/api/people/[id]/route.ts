import { updatePersonSchema } from "@/lib/schemas/people";
import { getPersonOrThrow, updatePerson } from "@/server/people";
import { readById, writeById } from "@/server/route";

export const GET = readById("people:read", "Person", (member, id) => getPersonOrThrow(member.companyId, id));

/** Changes a person's role or status (deactivate / reactivate). */
export const PATCH = writeById("people:manage", "Person", updatePersonSchema, updatePerson);
