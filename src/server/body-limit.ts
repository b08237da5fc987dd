import "server-only";
import { CSV_MAX_BYTES } from "@/lib/schemas/catalog";
import { MAX_INTERVAL_FILE_BYTES } from "@/lib/schemas/energy";
import { JOB_PHOTO_MAX_BYTES } from "@/lib/schemas/jobs";
import { MAX_VERIFY_FILE_BYTES } from "@/lib/schemas/proposal";
import { WEATHER_FILE_MAX_BYTES } from "@/lib/schemas/weather";
import { HttpError } from "@/server/errors";

/** A cap on one request body: the raw bytes read before anything parses them, and the 413 message naming it. */
export type BodyCap = { bytes: number; message: string };

const MB = 1024 * 1024;
const mb = (bytes: number) => `${Math.round((bytes / MB) * 10) / 10} MB`;
/** Room for a multipart form's boundaries, part headers and small text fields around the file (our choice). */
export const MULTIPART_OVERHEAD_BYTES = 64 * 1024;

const plain = (bytes: number, what: string): BodyCap => ({ bytes, message: `${what} up to ${mb(bytes)} are accepted; this one is larger.` });
const file = (maxFileBytes: number, what: string): BodyCap => ({
  bytes: maxFileBytes + MULTIPART_OVERHEAD_BYTES,
  message: `${what} up to ${mb(maxFileBytes)} are accepted; this upload is larger.`,
});

/**
 * Every request body the app reads is capped here, before it is read (our choices; OWASP ASVS
 * 4.0 V12.1.1 / V13.1 ask for a size limit on every input). A body over its cap answers 413
 * without the rest being buffered. (The app has no server actions.)
 */
export const BODY_CAPS = {
  /** JSON route handlers (withMember + readJson, the public proposal routes). */
  json: plain(1 * MB, "JSON bodies"),
  /** Stripe's webhook: events are a few kB; Stripe documents no event near 1 MB. */
  webhook: plain(1 * MB, "Webhook events"),
  /** better-auth's endpoints (sign-in, sign-up, reset): a few hundred bytes of JSON. */
  auth: plain(64 * 1024, "Sign-in and account requests"),
  /** /verify: the signed PDF being checked. */
  verify: file(MAX_VERIFY_FILE_BYTES, "PDFs"),
  /** A deal's upload: bills (10 MB) or interval data (the larger, 20 MB); the kind is checked after reading. */
  dealUpload: file(MAX_INTERVAL_FILE_BYTES, "Files"),
  /** Job and site photos. */
  photo: file(JOB_PHOTO_MAX_BYTES, "Photos"),
  /** Weather files (EPW, TMY3, hourly CSV). */
  weather: file(WEATHER_FILE_MAX_BYTES, "Weather files"),
  /** Catalog CSV imports (multipart or a text/csv body). */
  csvImport: file(CSV_MAX_BYTES, "CSV files"),
} as const satisfies Record<string, BodyCap>;

export const bodyTooLarge = (cap: BodyCap) => new HttpError(413, "body_too_large", cap.message);

/**
 * Reads a request body up to its cap: a declared Content-Length over the cap is refused before
 * a byte is read; otherwise the stream is read chunk by chunk, counting, and reading stops at
 * the first chunk past the cap (a chunked body has no Content-Length to trust). Throws the 413
 * HttpError; the rest of the body is never read into memory.
 */
export async function readCappedBody(req: Request, cap: BodyCap): Promise<Uint8Array<ArrayBuffer>> {
  const declared = req.headers.get("content-length");
  if (declared !== null && /^\d+$/.test(declared.trim()) && Number(declared.trim()) > cap.bytes) throw bodyTooLarge(cap);
  if (!req.body) return new Uint8Array(0);
  const reader = req.body.getReader();
  const chunks: Uint8Array[] = [];
  let total = 0;
  try {
    for (;;) {
      const { done, value } = await reader.read();
      if (done) break;
      total += value.byteLength;
      if (total > cap.bytes) {
        // Stop here: the stream is released, not drained (the server discards what is left).
        void reader.cancel().catch(() => undefined);
        throw bodyTooLarge(cap);
      }
      chunks.push(value);
    }
  } finally {
    reader.releaseLock();
  }
  const out = new Uint8Array(total);
  let at = 0;
  for (const c of chunks) {
    out.set(c, at);
    at += c.byteLength;
  }
  return out;
}

/** The capped body as UTF-8 text (invalid sequences replaced, as Request.text() does). */
export async function readCappedText(req: Request, cap: BodyCap): Promise<string> {
  return new TextDecoder().decode(await readCappedBody(req, cap));
}

/**
 * A multipart form read within its cap: the raw bytes are capped first, then parsed (undici's
 * formData() on the bytes already in memory). Throws 413 over the cap, 400 when it is not a form.
 */
export async function readCappedForm(req: Request, cap: BodyCap, what: string): Promise<FormData> {
  const bytes = await readCappedBody(req, cap);
  const contentType = req.headers.get("content-type") ?? "";
  try {
    return await new Response(bytes, { headers: { "content-type": contentType } }).formData();
  } catch {
    throw new HttpError(400, "invalid_form", `Send ${what} as multipart/form-data in a field named “file”.`);
  }
}
