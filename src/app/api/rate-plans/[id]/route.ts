import { NextResponse } from "next/server";
import { ratePlanRecordSchema } from "@/lib/schemas/rate-plan";
import { notFound } from "@/server/errors";
import { getRatePlanOrThrow, updateRatePlan } from "@/server/rate-plans";
import { idSchema, readJson, withMember } from "@/server/route";

type Params = { id: string };

export const GET = withMember<Params>("rates:read", async ({ member, params }) => {
  if (!idSchema.safeParse(params.id).success) throw notFound("Rate plan");
  return NextResponse.json({ data: await getRatePlanOrThrow(member.companyId, params.id) });
});

/** Replaces the plan's content (same body as POST). */
export const PUT = withMember<Params>("rates:manage", async ({ req, member, params }) => {
  if (!idSchema.safeParse(params.id).success) throw notFound("Rate plan");
  const input = await readJson(req, ratePlanRecordSchema);
  return NextResponse.json({ data: await updateRatePlan(member, params.id, input) });
});
