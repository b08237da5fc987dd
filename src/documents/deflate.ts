// Node's zlib for the streams pdf-lib embeds. Its own module so the fonts (which embed files)
// and the page layout (which names the fonts' type) do not import each other.
import { deflateSync } from "node:zlib";
import type { PDFDocument } from "pdf-lib";

/**
 * Makes `pdf` compress the streams it embeds (font files, their Unicode maps, images) with
 * Node's zlib rather than pdf-lib's JavaScript deflate; the same idea as compressContentStreams.
 */
export function useNativeDeflate(pdf: PDFDocument): void {
  const context = pdf.context;
  context.flateStream = (contents, dict = {}) =>
    context.stream(deflateSync(typeof contents === "string" ? Buffer.from(contents, "latin1") : contents), { ...dict, Filter: "FlateDecode" });
}
