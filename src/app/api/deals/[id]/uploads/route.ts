import { NextResponse } from "next/server";
import { z } from "zod";
import { acceptDealUpload, listDealUploads } from "@/server/energy";
import { BODY_CAPS } from "@/server/body-limit";
import { openDeal } from "@/server/deal-scope";
import { HttpError, notFound } from "@/server/errors";
import { idSchema, readForm, withMember } from "@/server/route";

type Params = { id: string };

export const GET = withMember<Params>("deals:read-own", async ({ member, params }) => {
  if (!idSchema.safeParse(params.id).success) throw notFound("Deal");
  return NextResponse.json({ data: await listDealUploads(await openDeal(member, params.id)) });
});

const uploadFormSchema = z.object({ file: z.instanceof(File, { message: "Choose a file to upload" }) });

/** A bill (PDF, photo) or interval data (Green Button XML, CSV), checked by its content. */
export const POST = withMember<Params>("deals:write", async ({ req, member, params }) => {
  if (!idSchema.safeParse(params.id).success) throw notFound("Deal");
  const scope = await openDeal(member, params.id);
  const form = await readForm(req, BODY_CAPS.dealUpload);
  const parsed = uploadFormSchema.safeParse({ file: form.get("file") });
  if (!parsed.success) throw new HttpError(422, "validation_failed", "Choose a file to upload.", { file: ["Choose a file to upload"] });
  const file = parsed.data.file;
  const outcome = await acceptDealUpload(scope, { name: file.name, bytes: new Uint8Array(await file.arrayBuffer()) });
  return NextResponse.json({ data: outcome }, { status: 201 });
});
