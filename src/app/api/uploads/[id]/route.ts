import { NextResponse } from "next/server";
import { notFound } from "@/server/errors";
import { idSchema, withMember } from "@/server/route";
import { getUploadMetadataOrThrow } from "@/server/weather-stations";

type Params = { id: string };

/** One upload's metadata (name, type, size, SHA-256), never its bytes; other companies' uploads are not found. */
export const GET = withMember<Params>("deals:read-own", async ({ member, params }) => {
  if (!idSchema.safeParse(params.id).success) throw notFound("Upload");
  return NextResponse.json({ data: await getUploadMetadataOrThrow(member, params.id) });
});
