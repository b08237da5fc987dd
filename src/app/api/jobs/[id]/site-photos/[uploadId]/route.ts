import { notFound } from "@/server/errors";
import { getJobSitePhotoFile } from "@/server/jobs";
import { idSchema, withMember } from "@/server/route";

type Params = { id: string; uploadId: string };

/** A rep's site photo of the job's deal, for the crew's packet. */
export const GET = withMember<Params>("jobs:read", async ({ member, params }) => {
  if (!idSchema.safeParse(params.id).success || !idSchema.safeParse(params.uploadId).success) throw notFound("Site photo");
  const file = await getJobSitePhotoFile(member, params.id, params.uploadId);
  return new Response(Buffer.from(file.bytes), {
    headers: { "Content-Type": file.mimeType, "Cache-Control": "private, max-age=3600", "X-Content-Type-Options": "nosniff" },
  });
});
