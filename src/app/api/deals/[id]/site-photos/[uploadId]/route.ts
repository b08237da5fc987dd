import { notFound } from "@/server/errors";
import { storedFileResponse } from "@/server/file-response";
import { idSchema, withMember } from "@/server/route";
import { deleteSitePhoto, getSitePhotoFile } from "@/server/site-photos";

type Params = { id: string; uploadId: string };

const validIds = (params: Params) => idSchema.safeParse(params.id).success && idSchema.safeParse(params.uploadId).success;

/** The site photo itself: a JPEG we wrote (normalizePhoto re-encodes every photo), so it may show inline. */
export const GET = withMember<Params>("deals:read-own", async ({ member, params }) => {
  if (!validIds(params)) throw notFound("Site photo");
  const bytes = await getSitePhotoFile(member, params.id, params.uploadId);
  return storedFileResponse(bytes, { type: "image/jpeg", fileName: `site-photo-${params.uploadId}.jpg`, disposition: "inline", cache: "private, max-age=3600" });
});

export const DELETE = withMember<Params>("deals:write", async ({ member, params }) => {
  if (!validIds(params)) throw notFound("Site photo");
  await deleteSitePhoto(member, params.id, params.uploadId);
  return new Response(null, { status: 204 });
});
