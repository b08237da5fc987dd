import { NextResponse } from "next/server";
import { notFound } from "@/server/errors";
import { getProposalOrThrow, publicView } from "@/server/proposals";
import { idSchema, withMember } from "@/server/route";

/** One proposal version (no token or code hashes); reps only on their own deals. */
export const GET = withMember<{ id: string }>("proposals:send", async ({ member, params }) => {
  if (!idSchema.safeParse(params.id).success) throw notFound("Proposal");
  return NextResponse.json({ data: publicView(await getProposalOrThrow(member, params.id)) });
});
