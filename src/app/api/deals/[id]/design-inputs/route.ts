import { NextResponse } from "next/server";
import { getDesignInputs } from "@/server/designs";
import { openDeal } from "@/server/deal-scope";
import { notFound } from "@/server/errors";
import { idSchema, withMember } from "@/server/route";

/** What the Design tab loads once: usage, the active catalog, stations with distances, the saved design. */
export const GET = withMember<{ id: string }>("deals:read-own", async ({ member, params }) => {
  if (!idSchema.safeParse(params.id).success) throw notFound("Deal");
  return NextResponse.json({ data: await getDesignInputs(await openDeal(member, params.id)) });
});
