import { NextResponse } from "next/server";
import { notFound } from "@/server/errors";
import { resendProposal } from "@/server/proposals";
import { idSchema, withMember } from "@/server/route";

/** A new link for the same version, e-mailed to the same address; the old link stops working. */
export const POST = withMember<{ id: string }>("proposals:send", async ({ member, params }) => {
  if (!idSchema.safeParse(params.id).success) throw notFound("Proposal");
  return NextResponse.json({ data: await resendProposal(member, params.id) });
});
