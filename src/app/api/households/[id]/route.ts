import { NextResponse } from "next/server";
import { getHouseholdOrThrow } from "@/server/deals";
import { notFound } from "@/server/errors";
import { idSchema, withMember } from "@/server/route";

export const GET = withMember<{ id: string }>("households:read", async ({ member, params }) => {
  if (!idSchema.safeParse(params.id).success) throw notFound("Household");
  return NextResponse.json({ data: await getHouseholdOrThrow(member, params.id) });
});
