import { NextResponse, type NextRequest } from "next/server";
import { z } from "zod";
import { BODY_CAPS } from "@/server/body-limit";
import { HttpError } from "@/server/errors";
import { clientAddress } from "@/server/client-address";
import { takeTurn } from "@/server/limits";
import { readForm, toErrorResponse } from "@/server/route";
import { verifySignedPdf } from "@/server/signing";

const formSchema = z.object({ file: z.instanceof(File, { message: "Choose a PDF file" }) });

/**
 * Anyone may check a PDF (multipart, field "file"): its SHA-256 either matches a signed record
 * — answered with the proposal's label and signing date only — or it does not. Limited per
 * address (limits.ts verifyAddress: 429 past 20 checks in 10 minutes, naming the wait).
 */
export async function POST(req: NextRequest): Promise<Response> {
  try {
    await takeTurn("verifyAddress", clientAddress(req.headers), (wait) => `Too many checks from this address. Try again in ${wait}.`);
    const form = await readForm(req, BODY_CAPS.verify, "the PDF");
    const parsed = formSchema.safeParse({ file: form.get("file") });
    if (!parsed.success) throw new HttpError(422, "validation_failed", "Choose a PDF file.", { file: ["Choose a PDF file"] });
    const bytes = new Uint8Array(await parsed.data.file.arrayBuffer());
    return NextResponse.json({ data: await verifySignedPdf(bytes) });
  } catch (err) {
    return toErrorResponse(err);
  }
}
