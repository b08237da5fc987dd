import "server-only";
import { createHash } from "node:crypto";
import { and, desc, eq } from "drizzle-orm";
import { upload, user } from "@/db/schema";
import { db, transaction } from "@/server/db";
import { openDeal } from "@/server/deal-scope";
import { HttpError, notFound } from "@/server/errors";
import { normalizePhoto } from "@/server/photos";
import type { Member } from "@/server/session";
import { storage } from "@/server/storage";
import { recordEvent } from "@/server/timeline";

/** A photo the rep took on the site visit (roof, electrical panel, meter); the crew sees it in the job packet. */
export type SitePhotoView = {
  id: string;
  fileName: string;
  sizeBytes: number;
  uploadedByName: string | null;
  createdAt: Date;
};

const columns = {
  id: upload.id,
  fileName: upload.fileName,
  sizeBytes: upload.sizeBytes,
  uploadedByName: user.name,
  createdAt: upload.createdAt,
};

/** The deal's site photos, newest first (the deal must be one the person may see). */
export async function listSitePhotos(member: Member, dealId: string): Promise<SitePhotoView[]> {
  await openDeal(member, dealId);
  return db()
    .select(columns)
    .from(upload)
    .leftJoin(user, eq(user.id, upload.uploadedByUserId))
    .where(and(eq(upload.companyId, member.companyId), eq(upload.dealId, dealId), eq(upload.purpose, "site_photo")))
    .orderBy(desc(upload.createdAt), desc(upload.id));
}

async function sitePhotoRowOrThrow(member: Member, dealId: string, uploadId: string) {
  await openDeal(member, dealId);
  const [row] = await db()
    .select({ storageKey: upload.storageKey, fileName: upload.fileName })
    .from(upload)
    .where(and(eq(upload.id, uploadId), eq(upload.companyId, member.companyId), eq(upload.dealId, dealId), eq(upload.purpose, "site_photo")))
    .limit(1);
  if (!row) throw notFound("Site photo");
  return row;
}

/**
 * A site photo from the rep's phone or camera, checked and resized like the crew's photos
 * (normalizePhoto) and kept with the deal. A refused file stores nothing.
 */
export async function addSitePhoto(member: Member, dealId: string, file: { name: string; bytes: Uint8Array }): Promise<SitePhotoView> {
  await openDeal(member, dealId);
  const photo = await normalizePhoto(file.bytes);
  const id = crypto.randomUUID();
  const storageKey = `${member.companyId}/uploads/${id}.jpg`;
  // The kept file is a JPEG whatever was sent; its name says so.
  const base = file.name.replace(/\.[^./\\]*$/, "").trim().slice(0, 240) || "site-photo";
  const fileName = `${base}.jpg`;
  await storage().put(storageKey, photo.jpeg);
  try {
    await transaction(async (tx) => {
      await tx.insert(upload).values({
        id,
        companyId: member.companyId,
        dealId,
        purpose: "site_photo",
        fileName,
        mimeType: "image/jpeg",
        sizeBytes: photo.sizeBytes,
        sha256: createHash("sha256").update(photo.jpeg).digest("hex"),
        storageKey,
        uploadedByUserId: member.userId,
      });
      await recordEvent(tx, { companyId: member.companyId, dealId, kind: "upload.added", summary: `${member.name} added the site photo “${fileName}”`, actorUserId: member.userId });
    });
  } catch (err) {
    await storage().delete(storageKey);
    throw err;
  }
  const [view] = await db().select(columns).from(upload).leftJoin(user, eq(user.id, upload.uploadedByUserId)).where(eq(upload.id, id));
  return view;
}

/** The photo's bytes (always JPEG), for the deal page. */
export async function getSitePhotoFile(member: Member, dealId: string, uploadId: string): Promise<Uint8Array> {
  const row = await sitePhotoRowOrThrow(member, dealId, uploadId);
  const bytes = await storage().get(row.storageKey);
  if (!bytes) throw new HttpError(404, "not_found", "The site photo's file is missing from storage.");
  return bytes;
}

/** Removes a site photo (a wrong or blurred shot): the row and the timeline note in one transaction, then the file. */
export async function deleteSitePhoto(member: Member, dealId: string, uploadId: string): Promise<void> {
  const row = await sitePhotoRowOrThrow(member, dealId, uploadId);
  await transaction(async (tx) => {
    await tx.delete(upload).where(and(eq(upload.id, uploadId), eq(upload.companyId, member.companyId)));
    await recordEvent(tx, { companyId: member.companyId, dealId, kind: "upload.removed", summary: `${member.name} removed the site photo “${row.fileName}”`, actorUserId: member.userId });
  });
  await storage().delete(row.storageKey);
}
