import { NextResponse } from "next/server";
import { z } from "zod";
import { BODY_CAPS } from "@/server/body-limit";
import { withDeal } from "@/server/deal-route";
import { acceptBillPhotoSet, acceptDealUpload, listDealUploads } from "@/server/energy";
import { HttpError } from "@/server/errors";
import { readForm } from "@/server/route";

export const GET = withDeal("deals:read-own", async ({ scope }) => NextResponse.json({ data: await listDealUploads(scope) }));

const uploadFormSchema = z.object({ file: z.array(z.instanceof(File, { message: "Choose a file to upload" })).min(1, "Choose a file to upload") });

/**
 * A bill (PDF, photo) or interval data (Green Button XML, CSV), checked by its content; or several
 * photos of one bill's pages (several "file" fields), read as one bill.
 */
export const POST = withDeal("deals:write", async ({ req, scope }) => {
  const form = await readForm(req, BODY_CAPS.dealUpload);
  const parsed = uploadFormSchema.safeParse({ file: form.getAll("file") });
  if (!parsed.success) throw new HttpError(422, "validation_failed", "Choose a file to upload.", { file: ["Choose a file to upload"] });
  const files = await Promise.all(parsed.data.file.map(async (f) => ({ name: f.name, bytes: new Uint8Array(await f.arrayBuffer()) })));
  const outcome = files.length > 1 ? await acceptBillPhotoSet(scope, files) : await acceptDealUpload(scope, files[0]);
  return NextResponse.json({ data: outcome }, { status: 201 });
});
