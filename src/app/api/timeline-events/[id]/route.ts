import { NextResponse } from "next/server";
import { openDealOf } from "@/server/deal-scope";
import { notFound } from "@/server/errors";
import { idSchema, withMember } from "@/server/route";
import { getTimelineEventOrThrow } from "@/server/timeline";

export const GET = withMember<{ id: string }>("deals:read-own", async ({ member, params }) => {
  if (!idSchema.safeParse(params.id).success) throw notFound("Timeline event");
  const event = await getTimelineEventOrThrow(member, params.id);
  await openDealOf(member, event.dealId, "Timeline event"); // a rep reads only their own deals' events
  return NextResponse.json({ data: event });
});
