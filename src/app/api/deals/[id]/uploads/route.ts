import { NextResponse } from "next/server";
import { z } from "zod";
import { BODY_CAPS } from "@/server/body-limit";
import { withDeal } from "@/server/deal-route";
import { acceptDealUpload, listDealUploads } from "@/server/energy";
import { HttpError } from "@/server/errors";
import { readForm } from "@/server/route";

export const GET = withDeal("deals:read-own", async ({ scope }) => NextResponse.json({ data: await listDealUploads(scope) }));

const uploadFormSchema = z.object({ file: z.instanceof(File, { message: "Choose a file to upload" }) });

/** A bill (PDF, photo) or interval data (Green Button XML, CSV), checked by its content. */
export const POST = withDeal("deals:write", async ({ req, scope }) => {
  const form = await readForm(req, BODY_CAPS.dealUpload);
  const parsed = uploadFormSchema.safeParse({ file: form.get("file") });
  if (!parsed.success) throw new HttpError(422, "validation_failed", "Choose a file to upload.", { file: ["Choose a file to upload"] });
  const file = parsed.data.file;
  const outcome = await acceptDealUpload(scope, { name: file.name, bytes: new Uint8Array(await file.arrayBuffer()) });
  return NextResponse.json({ data: outcome }, { status: 201 });
});
