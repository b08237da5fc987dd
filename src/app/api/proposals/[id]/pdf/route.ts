import { notFound } from "@/server/errors";
import { getProposalOrThrow, pdfFileName, pdfResponse, readProposalPdf } from "@/server/proposals";
import { idSchema, withMember } from "@/server/route";

/** The unsigned PDF as sent. */
export const GET = withMember<{ id: string }>("proposals:send", async ({ member, params }) => {
  if (!idSchema.safeParse(params.id).success) throw notFound("Proposal");
  const p = await getProposalOrThrow(member, params.id);
  return pdfResponse(await readProposalPdf(p, "unsigned"), pdfFileName(p, false));
});
