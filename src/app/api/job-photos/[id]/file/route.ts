import { notFound } from "@/server/errors";
import { getJobPhotoFile } from "@/server/jobs";
import { storedFileResponse } from "@/server/file-response";
import { idSchema, withMember } from "@/server/route";

type Params = { id: string };

/** The stored image: a JPEG we wrote (normalizePhoto: at most 2048 px on its long side), so inline. */
export const GET = withMember<Params>("jobs:read", async ({ member, params }) => {
  if (!idSchema.safeParse(params.id).success) throw notFound("Photo");
  const file = await getJobPhotoFile(member, params.id);
  return storedFileResponse(file.bytes, { type: "image/jpeg", fileName: `job-photo-${params.id}.jpg`, disposition: "inline", cache: "private, max-age=86400, immutable" });
});
