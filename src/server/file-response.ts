import "server-only";

/**
 * The one way a stored file leaves the app: its exact, checked type with
 * `X-Content-Type-Options: nosniff` (the browser never guesses another type); images also get a
 * sandboxing Content-Security-Policy, so one opened on its own in a tab runs nothing in our origin
 * (PDFs do not: a sandboxed document cannot show the browser's PDF viewer).
 * `inline` only for bytes we wrote ourselves (re-encoded photos, our PDFs); anything kept as a
 * person sent it goes out as `attachment` (a download).
 */
export function storedFileResponse(
  bytes: Uint8Array,
  opts: { type: "image/jpeg" | "image/png" | "application/pdf"; fileName: string; disposition: "inline" | "attachment"; cache: string },
): Response {
  // RFC 6266: an ASCII fallback name plus the UTF-8 one (RFC 8187).
  const ascii = opts.fileName.replace(/[^\x20-\x7e]|["\\]/g, "_");
  return new Response(Buffer.from(bytes), {
    headers: {
      "Content-Type": opts.type,
      "Content-Length": String(bytes.byteLength),
      "Content-Disposition": `${opts.disposition}; filename="${ascii}"; filename*=UTF-8''${encodeURIComponent(opts.fileName)}`,
      "X-Content-Type-Options": "nosniff",
      ...(opts.type.startsWith("image/") ? { "Content-Security-Policy": "default-src 'none'; style-src 'unsafe-inline'; sandbox" } : {}),
      "Cache-Control": opts.cache,
    },
  });
}
