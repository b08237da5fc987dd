import { NextResponse } from "next/server";
import { listDeals } from "@/server/deals";
import { withMember } from "@/server/route";

/** The caller's visible deals: all of the company's for office roles, their own for reps. */
export const GET = withMember("deals:read-own", async ({ member }) => NextResponse.json({ data: await listDeals(member) }));
