import { NextResponse } from "next/server";
import { notFound } from "@/server/errors";
import { getOutboundMailOrThrow } from "@/server/outbound-mail";
import { idSchema, withMember } from "@/server/route";

/** One queued or sent e-mail of the member's company: who, what and its delivery state, never its body. */
export const GET = withMember<{ id: string }>("company:manage", async ({ member, params }) => {
  if (!idSchema.safeParse(params.id).success) throw notFound("E-mail");
  return NextResponse.json({ data: await getOutboundMailOrThrow(member.companyId, params.id) });
});
