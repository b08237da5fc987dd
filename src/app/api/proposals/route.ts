import { NextResponse } from "next/server";
import { sendProposalSchema } from "@/lib/schemas/proposal";
import { withDeal } from "@/server/deal-route";
import { listProposalsForDeal, sendProposal } from "@/server/proposals";
import { readJson, withMember } from "@/server/route";

/** Every version of a deal's proposal (?dealId=), newest first, with events. */
export const GET = withDeal("proposals:send", async ({ scope }) => NextResponse.json({ data: await listProposalsForDeal(scope) }), { from: "query" });

/**
 * Freezes the deal's offers into a new proposal version and e-mails its link (body:
 * { dealId, offerIds?, toEmail, message?, validDays?, inHomeSale? }). 201 even when the e-mail
 * failed: the proposal is saved, `mailSent` says so and the rep can re-send.
 */
export const POST = withMember("proposals:send", async ({ req, member }) => {
  const body = await readJson(req, sendProposalSchema);
  return NextResponse.json({ data: await sendProposal(member, body) }, { status: 201 });
});
