import { notFound } from "@/server/errors";
import { getJobPhotoFile } from "@/server/jobs";
import { idSchema, withMember } from "@/server/route";

type Params = { id: string };

/** The stored image (JPEG, at most 2048 px on its long side). */
export const GET = withMember<Params>("jobs:read", async ({ member, params }) => {
  if (!idSchema.safeParse(params.id).success) throw notFound("Photo");
  const file = await getJobPhotoFile(member, params.id);
  return new Response(Buffer.from(file.bytes), {
    headers: { "Content-Type": file.mimeType, "Cache-Control": "private, max-age=86400, immutable", "X-Content-Type-Options": "nosniff" },
  });
});
