import { NextResponse } from "next/server";
import { getDealUsage } from "@/server/energy";
import { openDeal } from "@/server/deal-scope";
import { notFound } from "@/server/errors";
import { idSchema, withMember } from "@/server/route";

/** The household's stored usage year (12 months, measured or estimated, and 8760 hours) with its version. */
export const GET = withMember<{ id: string }>("deals:read-own", async ({ member, params }) => {
  if (!idSchema.safeParse(params.id).success) throw notFound("Deal");
  return NextResponse.json({ data: await getDealUsage(await openDeal(member, params.id)) });
});
