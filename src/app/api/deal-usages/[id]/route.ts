import { getDealUsageOrThrow } from "@/server/energy";
import { readById } from "@/server/route";

/** A deal's stored usage year by its id (reps: of their own deals only). */
export const GET = readById("deals:read-own", "Usage year", (member, id) => getDealUsageOrThrow(member, id));
