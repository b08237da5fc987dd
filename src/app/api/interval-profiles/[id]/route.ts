import { getIntervalProfileOrThrow } from "@/server/energy";
import { readById } from "@/server/route";

export const GET = readById("deals:read-own", "Interval profile", getIntervalProfileOrThrow);
