import { notFound } from "@/server/errors";
import { getJobPacketPdf } from "@/server/jobs";
import { storedFileResponse } from "@/server/file-response";
import { idSchema, withMember } from "@/server/route";

type Params = { id: string };

/** The job packet as a PDF (printed now: dates and checklist as they stand). */
export const GET = withMember<Params>("jobs:read", async ({ member, params }) => {
  if (!idSchema.safeParse(params.id).success) throw notFound("Job");
  const { bytes, fileName } = await getJobPacketPdf(member, params.id);
  // Our own PDF, printed now: it may open inline.
  return storedFileResponse(bytes, { type: "application/pdf", fileName, disposition: "inline", cache: "private, no-store" });
});
