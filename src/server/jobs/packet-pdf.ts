import "server-only";
import { and, asc, desc, eq } from "drizzle-orm";
import { renderJobPacketPdf, type JobPacketPdfPhoto } from "@/documents/job-packet-pdf";
import { env } from "@/env";
import { jobPhoto, upload } from "@/db/schema";
import { getCompanySettings } from "@/server/company-settings";
import { db } from "@/server/db";
import type { Member } from "@/server/session";
import { storage } from "@/server/storage";
import { getJobPacket } from "./packet";

// ── The packet as a PDF ──────────────────────────────────────────────────────────────────

/** Photos printed in the packet at most (the newest job photos first, then site photos). */
const PACKET_PDF_MAX_PHOTOS = 8;

/** The job packet as a PDF, for a person who may see the job. */
export async function getJobPacketPdf(member: Member, jobId: string, now = new Date()): Promise<{ bytes: Uint8Array; fileName: string }> {
  const packet = await getJobPacket(member, jobId);
  const photoRows = await db()
    .select({ storageKey: jobPhoto.storageKey, caption: jobPhoto.caption })
    .from(jobPhoto)
    .where(and(eq(jobPhoto.companyId, member.companyId), eq(jobPhoto.jobId, jobId)))
    .orderBy(desc(jobPhoto.createdAt))
    .limit(PACKET_PDF_MAX_PHOTOS);
  const siteRows = await db()
    .select({ storageKey: upload.storageKey, fileName: upload.fileName, mimeType: upload.mimeType })
    .from(upload)
    .where(and(eq(upload.companyId, member.companyId), eq(upload.dealId, packet.job.dealId), eq(upload.purpose, "site_photo")))
    .orderBy(asc(upload.createdAt))
    .limit(PACKET_PDF_MAX_PHOTOS);
  const photos: JobPacketPdfPhoto[] = [];
  for (const r of photoRows) {
    const bytes = await storage().get(r.storageKey);
    if (bytes) photos.push({ caption: r.caption ?? "Job photo", mimeType: "image/jpeg", bytes });
  }
  for (const r of siteRows) {
    if (photos.length >= PACKET_PDF_MAX_PHOTOS) break;
    if (r.mimeType !== "image/jpeg" && r.mimeType !== "image/png") continue;
    const bytes = await storage().get(r.storageKey);
    if (bytes) photos.push({ caption: `Site photo: ${r.fileName}`, mimeType: r.mimeType, bytes });
  }
  const { timeZone } = await getCompanySettings(member.companyId);
  const bytes = await renderJobPacketPdf({ packet, photos, printedAt: now, timeZone, jobUrl: `${env().APP_URL}/jobs/${jobId}` });
  const slug = packet.customer.name.toLowerCase().replace(/[^a-z0-9]+/g, "-").replace(/^-|-$/g, "") || "job";
  return { bytes, fileName: `job-packet-${slug}.pdf` };
}
