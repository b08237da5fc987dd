import { NextResponse } from "next/server";
import { notFound } from "@/server/errors";
import { publicView, revokeProposal } from "@/server/proposals";
import { idSchema, withMember } from "@/server/route";

/** Stops the version's link working (reps on their own deals, the office on all). */
export const POST = withMember<{ id: string }>("proposals:send", async ({ member, params }) => {
  if (!idSchema.safeParse(params.id).success) throw notFound("Proposal");
  return NextResponse.json({ data: publicView(await revokeProposal(member, params.id)) });
});
