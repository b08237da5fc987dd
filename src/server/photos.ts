import "server-only";
import { fileTypeFromBuffer } from "file-type";
import sharp from "sharp";
import { JOB_PHOTO_MAX_BYTES, JOB_PHOTO_MAX_SIDE_PX, JOB_PHOTO_MIME_TYPES } from "@/lib/schemas/jobs";
import { HttpError } from "@/server/errors";

const ACCEPTED = new Set<string>(JOB_PHOTO_MIME_TYPES);

export type NormalizedPhoto = { jpeg: Uint8Array; widthPx: number; heightPx: number; sizeBytes: number };

/**
 * A photo from a phone or a camera, for the crew's jobs and the rep's site visits: checked by its
 * content (JPEG, PNG or WebP, never by its name), turned upright from the EXIF orientation with
 * the metadata dropped (no GPS or device data kept), resized to at most 2048 px on its long side
 * and re-encoded as JPEG. Throws a 422 HttpError naming the problem; nothing is stored here.
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
  try {
    const out = await sharp(bytes, { failOn: "error" })
      .rotate()
      .resize({ width: JOB_PHOTO_MAX_SIDE_PX, height: JOB_PHOTO_MAX_SIDE_PX, fit: "inside", withoutEnlargement: true })
      .jpeg({ quality: 82, mozjpeg: true })
      .toBuffer({ resolveWithObject: true });
    return { jpeg: new Uint8Array(out.data), widthPx: out.info.width, heightPx: out.info.height, sizeBytes: out.info.size };
  } catch {
    throw new HttpError(422, "unreadable_image", "The photo could not be read (it may be cut short). Take it again.", { file: ["The photo could not be read"] });
  }
}
