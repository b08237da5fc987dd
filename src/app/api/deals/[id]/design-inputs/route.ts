import { NextResponse } from "next/server";
import { withDeal } from "@/server/deal-route";
import { getDesignInputs } from "@/server/designs";

/** What the Design tab loads once: usage, the active catalog, stations with distances, the saved design. */
export const GET = withDeal("deals:read-own", async ({ scope }) => NextResponse.json({ data: await getDesignInputs(scope) }));
