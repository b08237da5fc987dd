import { NextResponse } from "next/server";
import { withProposalToken } from "@/server/proposals";
import { sendSigningCode } from "@/server/signing";

/** E-mails a new 6-digit code to the address the proposal went to (a new code resets the tries). */
export const POST = withProposalToken(async ({ proposal, token, client }) => {
  return NextResponse.json({ data: await sendSigningCode(proposal, token, client) }, { status: 201 });
});
