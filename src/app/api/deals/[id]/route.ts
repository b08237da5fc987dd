import { NextResponse } from "next/server";
import { openDeal } from "@/server/deal-scope";
import { notFound } from "@/server/errors";
import { idSchema, withMember } from "@/server/route";

export const GET = withMember<{ id: string }>("deals:read-own", async ({ member, params }) => {
  if (!idSchema.safeParse(params.id).success) throw notFound("Deal");
  return NextResponse.json({ data: (await openDeal(member, params.id)).deal });
});
