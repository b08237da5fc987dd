import { NextResponse } from "next/server";
import { z } from "zod";
import { BODY_CAPS } from "@/server/body-limit";
import { notFound } from "@/server/errors";
import { idSchema, readForm, validationError, withMember } from "@/server/route";
import { addSitePhoto, listSitePhotos } from "@/server/site-photos";

type Params = { id: string };

export const GET = withMember<Params>("deals:read-own", async ({ member, params }) => {
  if (!idSchema.safeParse(params.id).success) throw notFound("Deal");
  return NextResponse.json({ data: await listSitePhotos(member, params.id) });
});

const photoFormSchema = z.object({ file: z.instanceof(File, { message: "Choose or take a photo" }) });

/** A site photo from the rep's phone or camera (multipart field “file”); the crew sees it in the job packet. */
export const POST = withMember<Params>("deals:write", async ({ req, member, params }) => {
  if (!idSchema.safeParse(params.id).success) throw notFound("Deal");
  const form = await readForm(req, BODY_CAPS.photo, "the photo");
  const parsed = photoFormSchema.safeParse({ file: form.get("file") });
  if (!parsed.success) throw validationError(parsed.error);
  const photo = await addSitePhoto(member, params.id, { name: parsed.data.file.name, bytes: new Uint8Array(await parsed.data.file.arrayBuffer()) });
  return NextResponse.json({ data: photo }, { status: 201 });
});
