import { pdfFileName, pdfResponse, readProposalPdf, withProposalToken } from "@/server/proposals";

/** The signed PDF with its certificate page: the customer's copy, kept for as long as the record is. */
export const GET = withProposalToken(async ({ proposal }) => pdfResponse(await readProposalPdf(proposal, "signed"), pdfFileName(proposal, true)));
