import "server-only";
import { fileTypeFromBuffer } from "file-type";
import sharp, { type Sharp } from "sharp";
import { JOB_PHOTO_MAX_BYTES, JOB_PHOTO_MAX_SIDE_PX, JOB_PHOTO_MIME_TYPES } from "@/lib/schemas/jobs";
import { HttpError } from "@/server/errors";

const ACCEPTED = new Set<string>(JOB_PHOTO_MIME_TYPES);

/**
 * Largest image decoded, in pixels (our choice: 40 megapixels is above any phone camera's
 * photo, and a 16000 × 16000 image that compresses to a few kB is refused from its header,
 * before its 1 GB of pixels is decoded).
 */
export const MAX_IMAGE_PIXELS = 40_000_000;

/**
 * Opens an image for decoding with the pixel limit, after reading only its header: refuses
 * an oversized image (422 naming its size and the limit) and a file that claims to be an image
 * but whose header does not read (422). `field` names the form field in the error.
 */
export async function openImage(bytes: Uint8Array, opts: { field: string; what: string; maxPixels?: number }): Promise<Sharp> {
  const maxPixels = opts.maxPixels ?? MAX_IMAGE_PIXELS;
  let width: number | undefined;
  let height: number | undefined;
  try {
    ({ width, height } = await sharp(bytes, { limitInputPixels: false }).metadata());
  } catch {
    throw new HttpError(422, "unreadable_image", `The ${opts.what} could not be read as an image (damaged or not an image).`, { [opts.field]: [`The ${opts.what} could not be read`] });
  }
  if (!width || !height) throw new HttpError(422, "unreadable_image", `The ${opts.what} has no size in its header; it is not a readable image.`, { [opts.field]: [`The ${opts.what} could not be read`] });
  if (width * height > maxPixels) {
    const message = `The ${opts.what} is ${width} × ${height} px (${(width * height / 1e6).toFixed(0)} megapixels); images up to ${maxPixels / 1e6} megapixels are accepted.`;
    throw new HttpError(422, "image_too_large", message, { [opts.field]: [message] });
  }
  // failOn "error": a truncated or corrupt image fails instead of decoding to grey.
  return sharp(bytes, { limitInputPixels: maxPixels, failOn: "error" });
}

export type NormalizedPhoto = { jpeg: Uint8Array; widthPx: number; heightPx: number; sizeBytes: number };

/**
 * A photo from a phone or a camera, for the crew's jobs and the rep's site visits: checked by its
 * content (JPEG, PNG or WebP, never by its name), decoded within MAX_IMAGE_PIXELS, turned upright
 * from the EXIF orientation with the metadata dropped (no GPS or device data kept), resized to at
 * most 2048 px on its long side and re-encoded as JPEG. Throws a 422 HttpError naming the
 * problem; nothing is stored here.
 */
export async function normalizePhoto(bytes: Uint8Array): Promise<NormalizedPhoto> {
  if (bytes.byteLength === 0) throw new HttpError(422, "empty_file", "The file is empty. Take the photo again.", { file: ["The file is empty"] });
  if (bytes.byteLength > JOB_PHOTO_MAX_BYTES) {
    throw new HttpError(422, "file_too_large", `The photo is larger than ${JOB_PHOTO_MAX_BYTES / 1024 / 1024} MB.`, { file: ["The photo is too large"] });
  }
  const type = await fileTypeFromBuffer(bytes);
  if (!type || !ACCEPTED.has(type.mime)) {
    const what = type ? `a ${type.ext.toUpperCase()} file` : "not an image";
    throw new HttpError(422, "unsupported_file", `This file is ${what}. Upload a photo as JPEG, PNG or WebP.`, { file: ["Upload a JPEG, PNG or WebP photo"] });
  }
  const image = await openImage(bytes, { field: "file", what: "photo" });
  try {
    const out = await image
      .rotate()
      .resize({ width: JOB_PHOTO_MAX_SIDE_PX, height: JOB_PHOTO_MAX_SIDE_PX, fit: "inside", withoutEnlargement: true })
      .jpeg({ quality: 82, mozjpeg: true })
      .toBuffer({ resolveWithObject: true });
    return { jpeg: new Uint8Array(out.data), widthPx: out.info.width, heightPx: out.info.height, sizeBytes: out.info.size };
  } catch {
    throw new HttpError(422, "unreadable_image", "The photo could not be read (it may be cut short). Take it again.", { file: ["The photo could not be read"] });
  }
}

/**
 * A photographed bill (JPEG or PNG, already checked by its content): decoded within the pixel
 * limit and re-encoded in its own format without metadata, so what is kept is pixels we wrote,
 * never the sender's bytes. 422 when it does not decode.
 */
export async function reencodeBillImage(bytes: Uint8Array, mime: "image/jpeg" | "image/png", fileName: string): Promise<Uint8Array> {
  const image = await openImage(bytes, { field: "file", what: `photo “${fileName}”` });
  try {
    const rotated = image.rotate();
    const out = mime === "image/png" ? await rotated.png().toBuffer() : await rotated.jpeg({ quality: 90, mozjpeg: true }).toBuffer();
    return new Uint8Array(out);
  } catch {
    throw new HttpError(422, "unreadable_image", `The photo “${fileName}” could not be read (damaged or cut short). Nothing was saved; take or export it again.`, { file: ["The photo could not be read"] });
  }
}
