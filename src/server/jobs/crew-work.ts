import "server-only";
import { and, asc, eq, isNull } from "drizzle-orm";
import { checklistTemplate, job, jobPhoto, user } from "@/db/schema";
import type { JobChecklistItem, MarkInstalledInput } from "@/lib/schemas/jobs";
import { formatIsoDateLong } from "@/lib/proposal-snapshot";
import { can } from "@/lib/permissions";
import { hiddenWithParent } from "@/server/records";
import { db, transaction } from "@/server/db";
import { HttpError, notFound } from "@/server/errors";
import { normalizePhoto } from "@/server/photos";
import type { Member } from "@/server/session";
import { autoMoveStage } from "@/server/stages";
import { storage } from "@/server/storage";
import type { JobPhotoView, JobRecord, JobView } from "@/lib/job-packet";
import { recordEvent } from "@/server/timeline";
import { dealHouseholdName } from "./office";
import { companyToday } from "./dates";
import { getJobOrThrow, getJobRowOrThrow } from "./read";
import { assertJobOpen, cancelWindowEndOf, firstInstallDay } from "./rules";

// ── The crew's work: checklist, installed, photos ───────────────────────────────────────

/** Ticks or unticks one checklist item, recording who and when (row locked against a lost update). */
export async function setChecklistItem(member: Member, jobId: string, input: { itemId: string; done: boolean }): Promise<JobChecklistItem[]> {
  await getJobRowOrThrow(member, jobId);
  return transaction(async (tx) => {
    const [row] = await tx
      .select({ checklist: job.checklist, cancelledAt: job.cancelledAt, cancelReason: job.cancelReason })
      .from(job)
      .where(and(eq(job.id, jobId), eq(job.companyId, member.companyId)))
      .for("update");
    if (!row) throw notFound("Job");
    assertJobOpen(row);
    const items = (row.checklist ?? []);
    const item = items.find((i) => i.id === input.itemId);
    if (!item) throw new HttpError(422, "validation_failed", "itemId: This item is not on the job's checklist", { itemId: ["This item is not on the job's checklist"] });
    if (input.done && !item.doneAt) {
      item.doneAt = new Date().toISOString();
      item.doneByUserId = member.userId;
    } else if (!input.done) {
      item.doneAt = null;
      item.doneByUserId = null;
    }
    await tx
      .update(job)
      .set({ checklist: items })
      .where(and(eq(job.id, jobId), eq(job.companyId, member.companyId)));
    return items;
  });
}

/** The office copies the active checklist into a job that has none (e.g. created before any template existed). */
export async function applyActiveChecklist(member: Member, jobId: string): Promise<JobChecklistItem[]> {
  if (!can(member.role, "jobs:manage")) throw new HttpError(403, "forbidden", "Your role does not allow changing a job's checklist.");
  await getJobRowOrThrow(member, jobId);
  return transaction(async (tx) => {
    const [row] = await tx
      .select({ checklist: job.checklist, cancelledAt: job.cancelledAt, cancelReason: job.cancelReason })
      .from(job)
      .where(and(eq(job.id, jobId), eq(job.companyId, member.companyId)))
      .for("update");
    if (!row) throw notFound("Job");
    assertJobOpen(row);
    if ((row.checklist ?? []).length > 0) throw new HttpError(409, "checklist_exists", "This job already has its checklist.");
    const [template] = await tx
      .select({ items: checklistTemplate.items })
      .from(checklistTemplate)
      .where(and(eq(checklistTemplate.companyId, member.companyId), eq(checklistTemplate.active, true)))
      .orderBy(asc(checklistTemplate.name), asc(checklistTemplate.id))
      .limit(1);
    if (!template) throw new HttpError(409, "no_active_checklist", "No checklist is active. An admin can activate one under Settings → Checklists.");
    const items = template.items.map((i) => ({ id: i.id, label: i.label, doneAt: null, doneByUserId: null }));
    await tx.update(job).set({ checklist: items }).where(and(eq(job.id, jobId), eq(job.companyId, member.companyId)));
    return items;
  });
}

/**
 * Whether the job may be marked installed today, and what the Timeline says about an early one.
 * Never inside the buyer's right-to-cancel window (nobody may install then); before the install
 * date only the office may, with a reason: a crew's early request is refused naming the date.
 */
async function installedTiming(member: Member, current: JobRecord, earlyReason: string | null, now: Date): Promise<string | null> {
  const today = await companyToday(member.companyId, now);
  const windowEnd = await cancelWindowEndOf(member.companyId, current);
  if (windowEnd && today <= windowEnd) {
    throw new HttpError(409, "inside_cancel_window", `The buyer may still cancel through ${formatIsoDateLong(windowEnd)}, so the job cannot be installed before ${formatIsoDateLong(firstInstallDay(windowEnd)!)}.`);
  }
  const booked = current.installDate;
  if (booked && booked <= today) return null;
  const when = booked ? `its install date, ${formatIsoDateLong(booked)}` : "any install date was booked";
  if (!can(member.role, "jobs:manage")) {
    throw new HttpError(409, "install_date_ahead", `This job cannot be marked installed before ${when}. Ask the office to confirm an early install.`);
  }
  if (!earlyReason) {
    const message = `Say why the job was installed before ${when}.`;
    throw new HttpError(422, "validation_failed", `earlyReason: ${message}`, { earlyReason: [message] });
  }
  return ` before ${when}, confirmed by the office: ${earlyReason}`;
}

/** "Installed": the crew marks the work done; the deal moves to Installed in the same transaction. */
export async function markJobInstalled(member: Member, jobId: string, input: MarkInstalledInput = {}, now = new Date()): Promise<JobView> {
  const current = await getJobRowOrThrow(member, jobId);
  assertJobOpen(current);
  if (current.installedAt) return getJobOrThrow(member, jobId);
  const early = await installedTiming(member, current, input.earlyReason ?? null, now);
  await transaction(async (tx) => {
    const changed = await tx
      .update(job)
      .set({ installedAt: now })
      .where(and(eq(job.id, jobId), eq(job.companyId, member.companyId), isNull(job.cancelledAt), isNull(job.installedAt)));
    if (changed[0].affectedRows !== 1) return; // cancelled or marked meanwhile: the page shows which
    const name = await dealHouseholdName(tx, member.companyId, current.dealId);
    const open = (current.checklist ?? []).filter((i) => !i.doneAt).length;
    await recordEvent(tx, {
      companyId: member.companyId,
      dealId: current.dealId,
      kind: "job.installed",
      summary: `${member.name} marked the install done${early ?? ""}${open ? ` (${open} checklist item${open === 1 ? "" : "s"} still open)` : ""}`,
      actorUserId: member.userId,
      data: { jobId, checklistOpen: open, ...(early ? { early: true, reason: input.earlyReason, installDate: current.installDate } : {}) },
    });
    await autoMoveStage(tx, {
      companyId: member.companyId,
      dealId: current.dealId,
      from: ["deposit_paid", "survey", "permitting", "install_booked"],
      to: "installed",
      summary: `${name} moved to Installed: the crew marked the install done${early ? " (early, confirmed by the office)" : ""}`,
      actorUserId: member.userId,
      data: { jobId, cause: "job" },
    });
  });
  return getJobOrThrow(member, jobId);
}

const photoColumns = {
  id: jobPhoto.id,
  jobId: jobPhoto.jobId,
  mimeType: jobPhoto.mimeType,
  widthPx: jobPhoto.widthPx,
  heightPx: jobPhoto.heightPx,
  sizeBytes: jobPhoto.sizeBytes,
  caption: jobPhoto.caption,
  uploadedByName: user.name,
  createdAt: jobPhoto.createdAt,
};

export async function listJobPhotos(member: Member, jobId: string): Promise<JobPhotoView[]> {
  await getJobRowOrThrow(member, jobId);
  return db()
    .select(photoColumns)
    .from(jobPhoto)
    .leftJoin(user, eq(user.id, jobPhoto.uploadedByUserId))
    .where(and(eq(jobPhoto.companyId, member.companyId), eq(jobPhoto.jobId, jobId)))
    .orderBy(asc(jobPhoto.createdAt));
}

/** One photo's metadata, for a person who may see its job. */
export async function getJobPhotoOrThrow(member: Member, photoId: string): Promise<JobPhotoView> {
  const [row] = await db()
    .select(photoColumns)
    .from(jobPhoto)
    .leftJoin(user, eq(user.id, jobPhoto.uploadedByUserId))
    .where(and(eq(jobPhoto.id, photoId), eq(jobPhoto.companyId, member.companyId)))
    .limit(1);
  if (!row) throw notFound("Photo");
  await hiddenWithParent(getJobRowOrThrow(member, row.jobId), "Photo");
  return row;
}

export async function getJobPhotoFile(member: Member, photoId: string): Promise<{ bytes: Uint8Array; mimeType: string }> {
  const meta = await getJobPhotoOrThrow(member, photoId);
  const [row] = await db()
    .select({ storageKey: jobPhoto.storageKey })
    .from(jobPhoto)
    .where(and(eq(jobPhoto.id, photoId), eq(jobPhoto.companyId, member.companyId)))
    .limit(1);
  const bytes = row ? await storage().get(row.storageKey) : null;
  if (!bytes) throw new HttpError(404, "not_found", "The photo's file is missing from storage.");
  return { bytes, mimeType: meta.mimeType };
}

/** A photo from the crew's phone, checked and resized by normalizePhoto (photos.ts). A refused file stores nothing. */
export async function addJobPhoto(member: Member, jobId: string, file: { bytes: Uint8Array; caption: string }): Promise<JobPhotoView> {
  const current = await getJobRowOrThrow(member, jobId);
  assertJobOpen(current);
  const photo = await normalizePhoto(file.bytes);
  const id = crypto.randomUUID();
  const storageKey = `${member.companyId}/jobs/${id}.jpg`;
  await storage().put(storageKey, photo.jpeg);
  try {
    await transaction(async (tx) => {
      await tx.insert(jobPhoto).values({
        id,
        companyId: member.companyId,
        jobId,
        storageKey,
        mimeType: "image/jpeg",
        widthPx: photo.widthPx,
        heightPx: photo.heightPx,
        sizeBytes: photo.sizeBytes,
        caption: file.caption || null,
        uploadedByUserId: member.userId,
      });
      await recordEvent(tx, {
        companyId: member.companyId,
        dealId: current.dealId,
        kind: "job.photo",
        summary: `${member.name} added a job photo${file.caption ? `: ${file.caption}` : ""}`,
        actorUserId: member.userId,
        data: { jobId, photoId: id },
      });
    });
  } catch (err) {
    await storage().delete(storageKey);
    throw err;
  }
  return getJobPhotoOrThrow(member, id);
}
