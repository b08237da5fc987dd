import { NextResponse } from "next/server";
import { withDeal } from "@/server/deal-route";

export const GET = withDeal("deals:read-own", async ({ scope }) => NextResponse.json({ data: scope.deal }));
