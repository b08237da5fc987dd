import { NextResponse } from "next/server";
import { notFound } from "@/server/errors";
import { getJobPhotoOrThrow } from "@/server/jobs";
import { idSchema, withMember } from "@/server/route";

type Params = { id: string };

/** One job photo's metadata (the image itself: ./file). */
export const GET = withMember<Params>("jobs:read", async ({ member, params }) => {
  if (!idSchema.safeParse(params.id).success) throw notFound("Photo");
  return NextResponse.json({ data: await getJobPhotoOrThrow(member, params.id) });
});
