import { NextResponse } from "next/server";
import { withDeal } from "@/server/deal-route";
import { getDealUsage } from "@/server/energy";

/** The household's stored usage year (12 months, measured or estimated, and 8760 hours) with its version. */
export const GET = withDeal("deals:read-own", async ({ scope }) => NextResponse.json({ data: await getDealUsage(scope) }));
