import { NextResponse, type NextRequest } from "next/server";
import { z } from "zod";
import { HttpError } from "@/server/errors";
import { clientAddress } from "@/server/client-address";
import { takeTurn } from "@/server/limits";
import { readForm, toErrorResponse } from "@/server/route";
import { MAX_VERIFY_FILE_BYTES, verifySignedPdf } from "@/server/signing";

const formSchema = z.object({ file: z.instanceof(File, { message: "Choose a PDF file" }) });

/**
 * Anyone may check a PDF (multipart, field "file"): its SHA-256 either matches a signed record
 * — answered with the proposal's label and signing date only — or it does not. Limited per
 * address (limits.ts verifyAddress: 429 past 20 checks in 10 minutes, naming the wait).
 */
export async function POST(req: NextRequest): Promise<Response> {
  try {
    const length = Number(req.headers.get("content-length") ?? "0");
    if (length > MAX_VERIFY_FILE_BYTES + 64 * 1024) throw new HttpError(413, "file_too_large", `Files up to ${MAX_VERIFY_FILE_BYTES / 1048576} MB are checked.`);
    await takeTurn("verifyAddress", clientAddress(req.headers), (wait) => `Too many checks from this address. Try again in ${wait}.`);
    const form = await readForm(req);
    const parsed = formSchema.safeParse({ file: form.get("file") });
    if (!parsed.success) throw new HttpError(422, "validation_failed", "Choose a PDF file.", { file: ["Choose a PDF file"] });
    const bytes = new Uint8Array(await parsed.data.file.arrayBuffer());
    return NextResponse.json({ data: await verifySignedPdf(bytes) });
  } catch (err) {
    return toErrorResponse(err);
  }
}
