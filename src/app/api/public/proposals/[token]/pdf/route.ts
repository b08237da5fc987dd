import { HttpError } from "@/server/errors";
import { pdfFileName, pdfResponse, readProposalPdf, withProposalToken } from "@/server/proposals";
import { proposalLinkState } from "@/lib/proposal-snapshot";

/** The proposal's PDF, for a live link or a signed or cancelled record (never for a replaced, revoked or expired link). */
export const GET = withProposalToken(async ({ proposal }) => {
  const state = proposalLinkState(proposal);
  if (state !== "live" && state !== "signed" && state !== "cancelled") throw new HttpError(410, state, "This link no longer serves the proposal. Use the link in the newest e-mail.");
  return pdfResponse(await readProposalPdf(proposal, "unsigned"), pdfFileName(proposal, false));
});
