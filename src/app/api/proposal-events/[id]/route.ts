import { NextResponse } from "next/server";
import { notFound } from "@/server/errors";
import { getProposalEventOrThrow } from "@/server/proposals";
import { idSchema, withMember } from "@/server/route";

/** One event of a proposal (sent, opened, code sent, question…); reps only on their own deals. */
export const GET = withMember<{ id: string }>("proposals:send", async ({ member, params }) => {
  if (!idSchema.safeParse(params.id).success) throw notFound("Proposal event");
  return NextResponse.json({ data: await getProposalEventOrThrow(member, params.id) });
});
