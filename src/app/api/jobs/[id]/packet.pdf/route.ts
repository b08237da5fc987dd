import { notFound } from "@/server/errors";
import { getJobPacketPdf } from "@/server/jobs";
import { idSchema, withMember } from "@/server/route";

type Params = { id: string };

/** The job packet as a PDF (printed now: dates and checklist as they stand). */
export const GET = withMember<Params>("jobs:read", async ({ member, params }) => {
  if (!idSchema.safeParse(params.id).success) throw notFound("Job");
  const { bytes, fileName } = await getJobPacketPdf(member, params.id);
  return new Response(Buffer.from(bytes), {
    headers: {
      "Content-Type": "application/pdf",
      "Content-Disposition": `inline; filename="${fileName}"`,
      "Cache-Control": "private, no-store",
      "X-Content-Type-Options": "nosniff",
    },
  });
});
