import { notFound } from "@/server/errors";
import { getJobSitePhotoFile } from "@/server/jobs";
import { storedFileResponse } from "@/server/file-response";
import { idSchema, withMember } from "@/server/route";

type Params = { id: string; uploadId: string };

/** A rep's site photo of the job's deal, for the crew's packet: a JPEG we wrote (normalizePhoto), so inline. */
export const GET = withMember<Params>("jobs:read", async ({ member, params }) => {
  if (!idSchema.safeParse(params.id).success || !idSchema.safeParse(params.uploadId).success) throw notFound("Site photo");
  const file = await getJobSitePhotoFile(member, params.id, params.uploadId);
  return storedFileResponse(file.bytes, { type: "image/jpeg", fileName: `site-photo-${params.uploadId}.jpg`, disposition: "inline", cache: "private, max-age=3600" });
});
