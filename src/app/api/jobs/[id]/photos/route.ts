import { NextResponse } from "next/server";
import { z } from "zod";
import { jobPhotoCaptionSchema } from "@/lib/schemas/jobs";
import { BODY_CAPS } from "@/server/body-limit";
import { notFound } from "@/server/errors";
import { addJobPhoto, listJobPhotos } from "@/server/jobs";
import { idSchema, readForm, validationError, withMember } from "@/server/route";

type Params = { id: string };

export const GET = withMember<Params>("jobs:read", async ({ member, params }) => {
  if (!idSchema.safeParse(params.id).success) throw notFound("Job");
  return NextResponse.json({ data: await listJobPhotos(member, params.id) });
});

const photoFormSchema = z.object({
  file: z.instanceof(File, { message: "Choose or take a photo" }),
  caption: jobPhotoCaptionSchema,
});

/** A photo from the phone's camera (multipart field “file”, optional “caption”). */
export const POST = withMember<Params>("jobs:work", async ({ req, member, params }) => {
  if (!idSchema.safeParse(params.id).success) throw notFound("Job");
  const form = await readForm(req, BODY_CAPS.photo, "the photo");
  const caption = form.get("caption");
  const parsed = photoFormSchema.safeParse({ file: form.get("file"), caption: typeof caption === "string" ? caption : undefined });
  if (!parsed.success) throw validationError(parsed.error);
  const photo = await addJobPhoto(member, params.id, { bytes: new Uint8Array(await parsed.data.file.arrayBuffer()), caption: parsed.data.caption });
  return NextResponse.json({ data: photo }, { status: 201 });
});
