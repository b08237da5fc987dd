import { notFound } from "@/server/errors";
import { getProposalOrThrow, pdfFileName, pdfResponse, readProposalPdf } from "@/server/proposals";
import { idSchema, withMember } from "@/server/route";

/** The signed PDF with its certificate page (404 before signing). */
export const GET = withMember<{ id: string }>("proposals:send", async ({ member, params }) => {
  if (!idSchema.safeParse(params.id).success) throw notFound("Proposal");
  const p = await getProposalOrThrow(member, params.id);
  return pdfResponse(await readProposalPdf(p, "signed"), pdfFileName(p, true));
});
