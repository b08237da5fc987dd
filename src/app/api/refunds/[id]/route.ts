import { NextResponse } from "next/server";
import { notFound } from "@/server/errors";
import { getRefundOrThrow } from "@/server/payments";
import { idSchema, withMember } from "@/server/route";

/** One refund of the member's company (reps: of their own deals). */
export const GET = withMember<{ id: string }>("payments:read", async ({ member, params }) => {
  if (!idSchema.safeParse(params.id).success) throw notFound("Refund");
  return NextResponse.json({ data: await getRefundOrThrow(member, params.id) });
});
