import { NextResponse } from "next/server";
import { ratePlanRecordSchema } from "@/lib/schemas/rate-plan";
import { createRatePlan, listRatePlans } from "@/server/rate-plans";
import { readJson, withMember } from "@/server/route";

export const GET = withMember("rates:read", async ({ member }) => {
  return NextResponse.json({ data: await listRatePlans(member.companyId) });
});

/** Creates a rate plan: { utilityName, active, plan } where plan is the engine's rate plan. */
export const POST = withMember("rates:manage", async ({ req, member }) => {
  const input = await readJson(req, ratePlanRecordSchema);
  return NextResponse.json({ data: await createRatePlan(member, input) }, { status: 201 });
});
