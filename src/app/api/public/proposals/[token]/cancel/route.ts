import { NextResponse } from "next/server";
import { cancelSignedProposal, withProposalToken } from "@/server/proposals";

/** The buyer cancels a signed in-home sale inside the 3-business-day window (16 CFR 429); 409 after it. */
export const POST = withProposalToken(async ({ proposal, client }) => {
  const outcome = await cancelSignedProposal(proposal, client);
  return NextResponse.json({ data: { cancelledAt: outcome.cancelledAt } });
});
