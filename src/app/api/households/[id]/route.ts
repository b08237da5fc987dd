import { getHouseholdOrThrow } from "@/server/deals";
import { readById } from "@/server/route";

export const GET = readById("households:read", "Household", getHouseholdOrThrow);
