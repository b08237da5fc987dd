import "server-only";
import { localIsoDate } from "@/lib/proposal-snapshot";
import { and, asc, desc, eq, inArray, type SQL } from "drizzle-orm";
import ical from "ical-generator";
import { renderJobPacketPdf, type JobPacketPdfPhoto } from "@/documents/job-packet-pdf";
import { env } from "@/env";
import { checklistTemplate, company, crew, deal, design, household, job, jobPhoto, proposal, upload, user, type Stage } from "@/db/schema";
import { checkStringPlan, inverterAcKw, STRING_CAUTION, type StringPlanCheck } from "@/lib/offer-figures";
import { designDocumentSchema, type DesignDocument } from "@/lib/schemas/design";
import {
  parseJobChecklist,
  parseTemplateItems,
  type JobChecklistItem,
  type JobFields,
} from "@/lib/schemas/jobs";
import type { ProposalSnapshot, ProposalSnapshotOffer } from "@/lib/schemas/proposal";
import { STAGE_LABELS } from "@/lib/stages";
import { can } from "@/lib/permissions";
import { getInverterOrThrow, getModuleOrThrow, type InverterModel, type ModuleModel } from "@/server/catalog";
import { getCompanySettings } from "@/server/company-settings";
import { crewIdOfMember, findCrewByFeedToken } from "@/server/crews";
import { db, type Tx } from "@/server/db";
import { HttpError, notFound } from "@/server/errors";
import { normalizePhoto } from "@/server/photos";
import type { Member } from "@/server/session";
import { autoMoveStage } from "@/server/stages";
import { storage } from "@/server/storage";
import type { JobPacket, JobPhotoView, JobRecord, JobView, PacketBomLine, PacketFace } from "@/lib/job-packet";
import { recordEvent } from "@/server/timeline";

export type { JobPacket, JobPhotoView, JobRecord, JobView, PacketBomLine, PacketFace } from "@/lib/job-packet";

// ── Creating the job (deposits call this in the webhook's transaction) ──────────────────

/**
 * Creates the buildable job of a deal (called when its deposit is paid, inside that
 * transaction). Idempotent: a deal has at most one job (unique index job_deal_uq), and a
 * second call returns the existing job's id without writing anything. The job starts with a
 * copy of the company's active checklist template (the first by name), so later edits to the
 * template never change a job already under way.
 */
export async function createJobForDeal(
  tx: Tx,
  j: { companyId: string; dealId: string; proposalId: string | null; actorUserId?: string | null },
): Promise<string> {
  const existing = await findJobIdForDeal(tx, j.companyId, j.dealId);
  if (existing) return existing;

  const [template] = await tx
    .select({ items: checklistTemplate.items })
    .from(checklistTemplate)
    .where(and(eq(checklistTemplate.companyId, j.companyId), eq(checklistTemplate.active, true)))
    .orderBy(asc(checklistTemplate.name), asc(checklistTemplate.id))
    .limit(1);
  const checklist: JobChecklistItem[] = parseTemplateItems(template?.items).map((item) => ({
    id: item.id,
    label: item.label,
    doneAt: null,
    doneByUserId: null,
  }));

  const id = crypto.randomUUID();
  // INSERT IGNORE: a concurrent call that got there first wins; we then return its id.
  const result = await tx
    .insert(job)
    .ignore()
    .values({ id, companyId: j.companyId, dealId: j.dealId, proposalId: j.proposalId, checklist });
  if (result[0].affectedRows !== 1) {
    const winner = await findJobIdForDeal(tx, j.companyId, j.dealId);
    if (winner) return winner;
    throw new Error(`Could not create the job of deal ${j.dealId}.`);
  }
  await recordEvent(tx, {
    companyId: j.companyId,
    dealId: j.dealId,
    kind: "job.created",
    summary: "Job created: ready to schedule the survey",
    actorUserId: j.actorUserId ?? null,
    data: { jobId: id, proposalId: j.proposalId, checklistItems: checklist.length },
  });
  return id;
}

async function findJobIdForDeal(tx: Tx, companyId: string, dealId: string): Promise<string | null> {
  const [row] = await tx
    .select({ id: job.id })
    .from(job)
    .where(and(eq(job.companyId, companyId), eq(job.dealId, dealId)))
    .limit(1);
  return row?.id ?? null;
}

// ── Dates ────────────────────────────────────────────────────────────────────────────────

/** Today in the company's time zone (Settings → Company). */
export async function companyToday(companyId: string, now = new Date()): Promise<string> {
  const { timeZone } = await getCompanySettings(companyId);
  return localIsoDate(now, timeZone);
}

export function addDaysIso(iso: string, days: number): string {
  return new Date(Date.parse(`${iso}T00:00:00Z`) + days * 86_400_000).toISOString().slice(0, 10);
}

export type JobDateKind = "survey" | "install" | "inspection";
export const JOB_DATE_LABELS: Record<JobDateKind, string> = { survey: "Site survey", install: "Install", inspection: "Inspection" };
/** How a crew's list is grouped: work today, in the next 7 days, later, or nothing scheduled ahead. */
export type JobBucket = "today" | "week" | "later" | "none";

/** The next dated visit of a job from `today` on (survey, install, inspection), or null. */
export function nextJobDate(
  j: { surveyDate: string | null; installDate: string | null; inspectionOn: string | null; installedAt?: Date | null },
  today: string,
): { kind: JobDateKind; date: string } | null {
  const dates: { kind: JobDateKind; date: string | null }[] = [
    { kind: "survey", date: j.surveyDate },
    { kind: "install", date: j.installedAt ? null : j.installDate },
    { kind: "inspection", date: j.inspectionOn },
  ];
  const ahead = dates.filter((d): d is { kind: JobDateKind; date: string } => !!d.date && d.date >= today).sort((a, b) => a.date.localeCompare(b.date));
  return ahead[0] ?? null;
}

export function jobBucket(next: { date: string } | null, today: string): JobBucket {
  if (!next) return "none";
  if (next.date === today) return "today";
  return next.date <= addDaysIso(today, 6) ? "week" : "later";
}

// ── Reading jobs (the office sees all; an installer only their crew's) ──────────────────

/** Jobs a person may see: the company's, and for an installer only their crew's (none without a crew). */
async function jobScope(member: Member): Promise<SQL> {
  const sameCompany = eq(job.companyId, member.companyId);
  if (member.role !== "crew") return sameCompany;
  const crewId = await crewIdOfMember(member);
  // An installer without a crew sees no job: an impossible id keeps the query shape simple.
  return and(sameCompany, eq(job.crewId, crewId ?? "00000000-0000-0000-0000-000000000000")) as SQL;
}

const listColumns = {
  id: job.id,
  dealId: job.dealId,
  stage: deal.stage,
  householdName: household.name,
  street: household.street,
  city: household.city,
  crewId: job.crewId,
  crewName: crew.name,
  surveyDate: job.surveyDate,
  installDate: job.installDate,
  permitSubmittedOn: job.permitSubmittedOn,
  permitApprovedOn: job.permitApprovedOn,
  inspectionOn: job.inspectionOn,
  ptoOn: job.ptoOn,
  installedAt: job.installedAt,
  checklist: job.checklist,
  systemDcWatts: deal.systemDcWatts,
  createdAt: job.createdAt,
};

export type JobListRow = {
  id: string;
  dealId: string;
  stage: Stage;
  householdName: string;
  street: string;
  city: string;
  crewId: string | null;
  crewName: string | null;
  surveyDate: string | null;
  installDate: string | null;
  permitSubmittedOn: string | null;
  permitApprovedOn: string | null;
  inspectionOn: string | null;
  ptoOn: string | null;
  installedAt: Date | null;
  systemDcWatts: number | null;
  checklistDone: number;
  checklistTotal: number;
  next: { kind: JobDateKind; date: string } | null;
  bucket: JobBucket;
  createdAt: Date;
};

const BUCKET_ORDER: Record<JobBucket, number> = { today: 0, week: 1, later: 2, none: 3 };

/**
 * The jobs a person may see. Installers: their crew's jobs, today's first, then this week's,
 * then later, then those with nothing scheduled ahead. The office: every job of the company,
 * soonest next visit first, unscheduled after.
 */
export async function listJobs(member: Member, now = new Date()): Promise<JobListRow[]> {
  const today = await companyToday(member.companyId, now);
  const rows = await db()
    .select(listColumns)
    .from(job)
    .innerJoin(deal, and(eq(deal.id, job.dealId), eq(deal.companyId, job.companyId)))
    .innerJoin(household, and(eq(household.id, deal.householdId), eq(household.companyId, deal.companyId)))
    .leftJoin(crew, and(eq(crew.id, job.crewId), eq(crew.companyId, job.companyId)))
    .where(await jobScope(member))
    .orderBy(desc(job.createdAt));
  const out: JobListRow[] = rows.map(({ checklist, ...r }) => {
    const items = parseJobChecklist(checklist);
    const next = nextJobDate(r, today);
    return { ...r, checklistDone: items.filter((i) => i.doneAt).length, checklistTotal: items.length, next, bucket: jobBucket(next, today) };
  });
  return out.sort((a, b) => BUCKET_ORDER[a.bucket] - BUCKET_ORDER[b.bucket] || (a.next?.date ?? "9999").localeCompare(b.next?.date ?? "9999") || a.householdName.localeCompare(b.householdName));
}

/** A job the person may see (another company's, or another crew's for an installer: not found). */
export async function getJobRowOrThrow(member: Member, jobId: string): Promise<JobRecord> {
  const [row] = await db()
    .select()
    .from(job)
    .where(and(eq(job.id, jobId), await jobScope(member)))
    .limit(1);
  if (!row) throw notFound("Job");
  return row;
}

/** GET /api/jobs/[id]: the job with its checklist, stage and household name. */
export async function getJobOrThrow(member: Member, jobId: string): Promise<JobView> {
  const row = await getJobRowOrThrow(member, jobId);
  const [d] = await db()
    .select({ stage: deal.stage, householdName: household.name })
    .from(deal)
    .innerJoin(household, and(eq(household.id, deal.householdId), eq(household.companyId, deal.companyId)))
    .where(and(eq(deal.id, row.dealId), eq(deal.companyId, member.companyId)))
    .limit(1);
  let crewName: string | null = null;
  if (row.crewId) {
    const [c] = await db().select({ name: crew.name }).from(crew).where(and(eq(crew.id, row.crewId), eq(crew.companyId, member.companyId))).limit(1);
    crewName = c?.name ?? null;
  }
  return { ...row, checklist: parseJobChecklist(row.checklist), stage: d?.stage ?? "deposit_paid", householdName: d?.householdName ?? "", crewName };
}

/** The job of a deal, if it has one (for the deal room and the customer's project page). */
export async function findJobForDeal(companyId: string, dealId: string): Promise<JobRecord | null> {
  const [row] = await db()
    .select()
    .from(job)
    .where(and(eq(job.companyId, companyId), eq(job.dealId, dealId)))
    .limit(1);
  return row ?? null;
}

// ── The office's changes: dates, crew, permits; each may move the deal ──────────────────

type DateFieldKey = Exclude<keyof JobFields, "crewId" | "permitNumber" | "interconnectionNumber" | "notes">;

const FIELD_LABELS: Record<keyof JobFields, string> = {
  crewId: "crew",
  surveyDate: "survey date",
  installDate: "install date",
  permitNumber: "permit number",
  permitSubmittedOn: "permit submitted",
  permitApprovedOn: "permit approved",
  interconnectionNumber: "interconnection number",
  interconnectionSubmittedOn: "interconnection submitted",
  interconnectionApprovedOn: "interconnection approved",
  inspectionOn: "inspection date",
  ptoOn: "PTO date",
  notes: "notes",
};

const dateText = (iso: string) => new Intl.DateTimeFormat("en-US", { dateStyle: "medium", timeZone: "UTC" }).format(new Date(`${iso}T00:00:00Z`));

/** A stage move a job change causes: from which stages, to which, and why. */
export type JobStageMove = { from: readonly Stage[]; to: Stage; why: string };

/**
 * The stage moves caused by a job change, in order (each only forward from the named stages):
 * survey date set → Survey; permit submitted → Permitting; install date with an approved
 * permit → Install booked; inspection recorded → Inspected; PTO date → Live.
 */
export function jobStageMoves(before: Pick<JobRecord, DateFieldKey>, after: Pick<JobRecord, DateFieldKey>): JobStageMove[] {
  const set = (k: DateFieldKey) => !!after[k] && after[k] !== before[k];
  const moves: JobStageMove[] = [];
  if (set("surveyDate")) moves.push({ from: ["deposit_paid"], to: "survey", why: `site survey set for ${dateText(after.surveyDate!)}` });
  if (set("permitSubmittedOn")) moves.push({ from: ["deposit_paid", "survey"], to: "permitting", why: `permit submitted on ${dateText(after.permitSubmittedOn!)}` });
  if (after.installDate && after.permitApprovedOn && (set("installDate") || set("permitApprovedOn"))) {
    moves.push({
      from: ["deposit_paid", "survey", "permitting"],
      to: "install_booked",
      why: `install set for ${dateText(after.installDate)}, permit approved on ${dateText(after.permitApprovedOn)}`,
    });
  }
  if (set("inspectionOn")) moves.push({ from: ["installed"], to: "inspected", why: `inspection recorded on ${dateText(after.inspectionOn!)}` });
  if (set("ptoOn")) moves.push({ from: ["inspected"], to: "live", why: `permission to operate on ${dateText(after.ptoOn!)}` });
  return moves;
}

async function dealHouseholdName(tx: Tx, companyId: string, dealId: string): Promise<string> {
  const [row] = await tx
    .select({ name: household.name })
    .from(deal)
    .innerJoin(household, and(eq(household.id, deal.householdId), eq(household.companyId, deal.companyId)))
    .where(and(eq(deal.id, dealId), eq(deal.companyId, companyId)))
    .limit(1);
  return row?.name ?? "The household";
}

export type JobUpdateResult = { job: JobView; moved: { to: Stage }[] };

/**
 * The office sets dates, the crew, permit and interconnection records, notes. One transaction:
 * the job, a Timeline event naming what changed, and the stage moves those changes cause. An
 * install date before the permit's approval is allowed; the deal moves to Install booked only
 * once the permit is approved.
 */
export async function updateJob(member: Member, jobId: string, fields: JobFields): Promise<JobUpdateResult> {
  if (!can(member.role, "jobs:manage")) throw new HttpError(403, "forbidden", "Your role does not allow scheduling jobs.");
  await getJobRowOrThrow(member, jobId);
  if (fields.crewId) {
    const [c] = await db().select({ id: crew.id }).from(crew).where(and(eq(crew.id, fields.crewId), eq(crew.companyId, member.companyId))).limit(1);
    if (!c) throw new HttpError(422, "validation_failed", "crewId: Pick a crew from the list", { crewId: ["Pick a crew from the list"] });
  }
  const moved: { to: Stage }[] = [];
  await db().transaction(async (tx) => {
    const [before] = await tx
      .select()
      .from(job)
      .where(and(eq(job.id, jobId), eq(job.companyId, member.companyId)))
      .for("update");
    if (!before) throw notFound("Job");
    const changes: Partial<JobRecord> = {};
    const changed: (keyof JobFields)[] = [];
    for (const key of Object.keys(FIELD_LABELS) as (keyof JobFields)[]) {
      const value = fields[key];
      if (value === undefined || value === before[key]) continue;
      (changes as Record<string, unknown>)[key] = value;
      changed.push(key);
    }
    const after = { ...before, ...changes };
    // The same rules the form checks, on the merged record (a field may be sent alone).
    if (after.permitSubmittedOn && after.permitApprovedOn && after.permitApprovedOn < after.permitSubmittedOn) {
      throw new HttpError(422, "validation_failed", "permitApprovedOn: The permit cannot be approved before it was submitted", {
        permitApprovedOn: ["The permit cannot be approved before it was submitted"],
      });
    }
    if (after.interconnectionSubmittedOn && after.interconnectionApprovedOn && after.interconnectionApprovedOn < after.interconnectionSubmittedOn) {
      throw new HttpError(422, "validation_failed", "interconnectionApprovedOn: Interconnection cannot be approved before it was submitted", {
        interconnectionApprovedOn: ["Interconnection cannot be approved before it was submitted"],
      });
    }
    if (changed.length === 0) return;
    await tx
      .update(job)
      .set(changes)
      .where(and(eq(job.id, jobId), eq(job.companyId, member.companyId)));
    const name = await dealHouseholdName(tx, member.companyId, before.dealId);
    let crewName: string | null = null;
    if (changes.crewId) {
      const [c] = await tx.select({ name: crew.name }).from(crew).where(and(eq(crew.id, changes.crewId), eq(crew.companyId, member.companyId))).limit(1);
      crewName = c?.name ?? null;
    }
    const parts = changed.map((k) => {
      const v = after[k];
      if (k === "notes") return "notes edited";
      if (k === "crewId") return v ? `crew: ${crewName ?? "assigned"}` : "crew removed";
      if (v === null || v === undefined) return `${FIELD_LABELS[k]} cleared`;
      return `${FIELD_LABELS[k]}: ${k.endsWith("Date") || k.endsWith("On") ? dateText(String(v)) : String(v)}`;
    });
    const summary = `Job updated by ${member.name}: ${parts.join("; ")}`;
    await recordEvent(tx, {
      companyId: member.companyId,
      dealId: before.dealId,
      kind: "job.updated",
      summary: summary.length > 500 ? `${summary.slice(0, 499)}…` : summary,
      actorUserId: member.userId,
      data: { jobId, changed: Object.fromEntries(changed.map((k) => [k, k === "notes" ? "(edited)" : (after[k] ?? null)])) },
    });
    for (const move of jobStageMoves(before, after)) {
      const didMove = await autoMoveStage(tx, {
        companyId: member.companyId,
        dealId: before.dealId,
        from: move.from,
        to: move.to,
        summary: `${name} moved to ${STAGE_LABELS[move.to]}: ${move.why}`,
        actorUserId: member.userId,
        data: { jobId, cause: "job" },
      });
      if (didMove) moved.push({ to: move.to });
    }
  });
  return { job: await getJobOrThrow(member, jobId), moved };
}

// ── The crew's work: checklist, installed, photos ───────────────────────────────────────

/** Ticks or unticks one checklist item, recording who and when (row locked against a lost update). */
export async function setChecklistItem(member: Member, jobId: string, input: { itemId: string; done: boolean }): Promise<JobChecklistItem[]> {
  await getJobRowOrThrow(member, jobId);
  return db().transaction(async (tx) => {
    const [row] = await tx
      .select({ checklist: job.checklist })
      .from(job)
      .where(and(eq(job.id, jobId), eq(job.companyId, member.companyId)))
      .for("update");
    if (!row) throw notFound("Job");
    const items = parseJobChecklist(row.checklist);
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
  return db().transaction(async (tx) => {
    const [row] = await tx.select({ checklist: job.checklist }).from(job).where(and(eq(job.id, jobId), eq(job.companyId, member.companyId))).for("update");
    if (!row) throw notFound("Job");
    if (parseJobChecklist(row.checklist).length > 0) throw new HttpError(409, "checklist_exists", "This job already has its checklist.");
    const [template] = await tx
      .select({ items: checklistTemplate.items })
      .from(checklistTemplate)
      .where(and(eq(checklistTemplate.companyId, member.companyId), eq(checklistTemplate.active, true)))
      .orderBy(asc(checklistTemplate.name), asc(checklistTemplate.id))
      .limit(1);
    if (!template) throw new HttpError(409, "no_active_checklist", "No checklist is active. An admin can activate one under Settings → Checklists.");
    const items = parseTemplateItems(template.items).map((i) => ({ id: i.id, label: i.label, doneAt: null, doneByUserId: null }));
    await tx.update(job).set({ checklist: items }).where(and(eq(job.id, jobId), eq(job.companyId, member.companyId)));
    return items;
  });
}

/** "Installed": the crew marks the work done; the deal moves to Installed in the same transaction. */
export async function markJobInstalled(member: Member, jobId: string): Promise<JobView> {
  const current = await getJobRowOrThrow(member, jobId);
  if (current.installedAt) return getJobOrThrow(member, jobId);
  await db().transaction(async (tx) => {
    const installedAt = new Date();
    const changed = await tx
      .update(job)
      .set({ installedAt })
      .where(and(eq(job.id, jobId), eq(job.companyId, member.companyId)));
    if (changed[0].affectedRows !== 1) throw notFound("Job");
    const name = await dealHouseholdName(tx, member.companyId, current.dealId);
    const items = parseJobChecklist(current.checklist);
    const open = items.filter((i) => !i.doneAt).length;
    await recordEvent(tx, {
      companyId: member.companyId,
      dealId: current.dealId,
      kind: "job.installed",
      summary: `${member.name} marked the install done${open ? ` (${open} checklist item${open === 1 ? "" : "s"} still open)` : ""}`,
      actorUserId: member.userId,
      data: { jobId, checklistOpen: open },
    });
    await autoMoveStage(tx, {
      companyId: member.companyId,
      dealId: current.dealId,
      from: ["deposit_paid", "survey", "permitting", "install_booked"],
      to: "installed",
      summary: `${name} moved to Installed: the crew marked the install done`,
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
  await getJobRowOrThrow(member, row.jobId).catch((err: unknown) => {
    throw err instanceof HttpError && err.status === 404 ? notFound("Photo") : err;
  });
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
  const photo = await normalizePhoto(file.bytes);
  const id = crypto.randomUUID();
  const storageKey = `${member.companyId}/jobs/${id}.jpg`;
  await storage().put(storageKey, photo.jpeg);
  try {
    await db().transaction(async (tx) => {
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

// ── The job packet (web and PDF) ─────────────────────────────────────────────────────────

function jsonValue(raw: unknown): unknown {
  return typeof raw === "string" ? JSON.parse(raw) : raw;
}

function snapshotOf(raw: unknown): ProposalSnapshot | null {
  try {
    const v = jsonValue(raw) as ProposalSnapshot | null;
    return v && Array.isArray(v.offers) ? v : null;
  } catch {
    return null;
  }
}

async function signedOffer(companyId: string, j: JobRecord): Promise<{ offer: ProposalSnapshotOffer; label: string } | null> {
  const rows = await db()
    .select({ id: proposal.id, number: proposal.number, version: proposal.version, status: proposal.status, snapshot: proposal.snapshot, chosenPosition: proposal.chosenPosition })
    .from(proposal)
    .where(and(eq(proposal.companyId, companyId), eq(proposal.dealId, j.dealId), inArray(proposal.status, ["signed"])))
    .orderBy(desc(proposal.signedAt));
  const chosen = rows.find((r) => r.id === j.proposalId) ?? rows[0];
  if (!chosen || chosen.chosenPosition == null) return null;
  const snap = snapshotOf(chosen.snapshot);
  const offer = snap?.offers.find((o) => o.position === chosen.chosenPosition);
  return offer ? { offer, label: `Signed proposal ${chosen.number} v${chosen.version}, offer “${offer.name}”` } : null;
}

async function designOf(companyId: string, dealId: string): Promise<DesignDocument | null> {
  const [row] = await db()
    .select({ document: design.document })
    .from(design)
    .where(and(eq(design.companyId, companyId), eq(design.dealId, dealId)))
    .limit(1);
  if (!row) return null;
  const parsed = designDocumentSchema.safeParse(jsonValue(row.document));
  return parsed.success ? parsed.data : null;
}

async function catalogPair(companyId: string, moduleId: string | null | undefined, inverterId: string | null | undefined): Promise<{ mod: ModuleModel | null; inv: InverterModel | null }> {
  const mod = moduleId ? await getModuleOrThrow(companyId, moduleId).catch(() => null) : null;
  const inv = inverterId ? await getInverterOrThrow(companyId, inverterId).catch(() => null) : null;
  return { mod, inv };
}

function inverterUnits(inv: { kind: "string" | "micro"; modulesPerUnit?: number | null }, moduleCount: number, stringInverters: number): number {
  return inv.kind === "micro" ? Math.ceil(moduleCount / Math.max(1, inv.modulesPerUnit ?? 1)) : stringInverters;
}

/** Everything the crew needs on site, for one job they may see. */
export async function getJobPacket(member: Member, jobId: string): Promise<JobPacket> {
  const j = await getJobOrThrow(member, jobId);
  const [h] = await db()
    .select({
      name: household.name,
      contactName: household.contactName,
      phone: household.phone,
      email: household.email,
      secondContactName: household.secondContactName,
      secondContactPhone: household.secondContactPhone,
      street: household.street,
      city: household.city,
      region: household.region,
      postalCode: household.postalCode,
      latitude: household.latitude,
      longitude: household.longitude,
      utilityName: deal.utilityName,
    })
    .from(deal)
    .innerJoin(household, and(eq(household.id, deal.householdId), eq(household.companyId, deal.companyId)))
    .where(and(eq(deal.id, j.dealId), eq(deal.companyId, member.companyId)))
    .limit(1);
  if (!h) throw notFound("Job");
  const [co] = await db()
    .select({ name: company.name, licenseNumber: company.licenseNumber })
    .from(company)
    .where(eq(company.id, member.companyId))
    .limit(1);

  const signed = await signedOffer(member.companyId, j);
  const doc = await designOf(member.companyId, j.dealId);
  const moduleId = signed?.offer.inputs.moduleId ?? doc?.moduleId ?? null;
  const inverterId = signed?.offer.inputs.inverterId ?? doc?.inverterId ?? null;
  const { mod, inv } = await catalogPair(member.companyId, moduleId, inverterId);
  const stringInverters = doc?.inverterCount ?? 1;

  let faces: PacketFace[] = [];
  let bom: PacketBomLine[] = [];
  let system: JobPacket["system"] = null;
  let source: JobPacket["source"] = { kind: "none", label: "No signed proposal or design yet" };
  if (signed) {
    const eqp = signed.offer.equipment;
    source = { kind: "proposal", label: signed.label };
    faces = eqp.faces.filter((f) => f.moduleCount > 0).map((f) => ({ name: f.name, tiltDeg: f.tiltDeg, azimuthDeg: f.azimuthDeg, moduleCount: f.moduleCount }));
    const units = inverterUnits({ kind: eqp.inverter.kind, modulesPerUnit: inv?.modulesPerUnit }, eqp.moduleCount, stringInverters);
    bom = [
      { item: "PV module", detail: `${eqp.module.manufacturer} ${eqp.module.model}, ${eqp.module.stcWatts} W STC`, quantity: eqp.moduleCount, unit: "pcs" },
      {
        item: eqp.inverter.kind === "micro" ? "Microinverter" : "String inverter",
        detail: `${eqp.inverter.manufacturer} ${eqp.inverter.model}, ${eqp.inverter.acWatts} W AC`,
        quantity: units,
        unit: "pcs",
      },
    ];
    system = {
      moduleCount: eqp.moduleCount,
      kwDc: (eqp.moduleCount * eqp.module.stcWatts) / 1000,
      kwAc: (units * eqp.inverter.acWatts) / 1000,
    };
  } else if (doc && mod && inv) {
    source = { kind: "design", label: "The deal's design (no signed proposal on record)" };
    faces = doc.faces.filter((f) => f.moduleCount > 0).map((f) => ({ name: f.name, tiltDeg: f.tiltDeg, azimuthDeg: f.azimuthDeg, moduleCount: f.moduleCount }));
    const moduleCount = faces.reduce((s, f) => s + f.moduleCount, 0);
    const units = inverterUnits(inv, moduleCount, stringInverters);
    bom = [
      { item: "PV module", detail: `${mod.manufacturer} ${mod.model}, ${mod.stcWatts} W STC`, quantity: moduleCount, unit: "pcs" },
      { item: inv.kind === "micro" ? "Microinverter" : "String inverter", detail: `${inv.manufacturer} ${inv.model}, ${inv.acWatts} W AC`, quantity: units, unit: "pcs" },
    ];
    system = { moduleCount, kwDc: (moduleCount * mod.stcWatts) / 1000, kwAc: inverterAcKw(inv, stringInverters, moduleCount) };
  }

  let stringPlan: JobPacket["stringPlan"] = null;
  if (doc?.stringPlan && mod && inv && inv.kind === "string") {
    const check = checkStringPlan(mod, inv, stringInverters, doc.stringPlan);
    const notes: string[] = [];
    const planned = doc.stringPlan.stringSizes.reduce((s, n) => s + n, 0);
    if (system && planned !== system.moduleCount) notes.push(`The strings hold ${planned} modules; the system has ${system.moduleCount}. Ask the office before wiring.`);
    stringPlan = { lowestTempC: doc.stringPlan.lowestTempC, highestTempC: doc.stringPlan.highestTempC, stringSizes: doc.stringPlan.stringSizes, check, notes };
  }

  const sitePhotos = await db()
    .select({ id: upload.id, fileName: upload.fileName, mimeType: upload.mimeType })
    .from(upload)
    .where(and(eq(upload.companyId, member.companyId), eq(upload.dealId, j.dealId), eq(upload.purpose, "site_photo")))
    .orderBy(asc(upload.createdAt));
  const photos = await listJobPhotos(member, jobId);

  return {
    job: j,
    company: { name: co?.name ?? member.companyName, licenseNumber: co?.licenseNumber ?? null },
    customer: {
      name: h.name,
      contactName: h.contactName,
      phone: h.phone,
      email: h.email,
      secondContactName: h.secondContactName,
      secondContactPhone: h.secondContactPhone,
    },
    site: {
      street: h.street,
      city: h.city,
      region: h.region,
      postalCode: h.postalCode,
      latitude: h.latitude,
      longitude: h.longitude,
      // RFC 5870 geo: URI with the address as the query, so a phone's map app can open it.
      mapUri: `geo:${h.latitude},${h.longitude}?q=${encodeURIComponent(`${h.street}, ${h.city}, ${h.region} ${h.postalCode}`)}`,
      utilityName: h.utilityName,
    },
    source,
    faces,
    system,
    bom,
    stringPlan,
    cautions: [STRING_CAUTION, "Roof attachments, structural loads and conductor sizing follow the stamped plan set and the AHJ's requirements."],
    sitePhotos,
    photos,
    crewName: j.crewName,
  };
}

/** A rep's site photo of the job's deal (bytes), for the crew's packet. */
export async function getJobSitePhotoFile(member: Member, jobId: string, uploadId: string): Promise<{ bytes: Uint8Array; mimeType: string }> {
  const j = await getJobRowOrThrow(member, jobId);
  const [row] = await db()
    .select({ storageKey: upload.storageKey, mimeType: upload.mimeType })
    .from(upload)
    .where(and(eq(upload.id, uploadId), eq(upload.companyId, member.companyId), eq(upload.dealId, j.dealId), eq(upload.purpose, "site_photo")))
    .limit(1);
  if (!row) throw notFound("Site photo");
  const bytes = await storage().get(row.storageKey);
  if (!bytes) throw new HttpError(404, "not_found", "The site photo's file is missing from storage.");
  return { bytes, mimeType: row.mimeType };
}

// ── The crew's calendar feed (RFC 5545) ─────────────────────────────────────────────────

/** How far back the feed reaches: recent visits stay visible for a while, older ones drop off. */
const FEED_PAST_DAYS = 60;

/**
 * The iCalendar feed of a crew's jobs behind its secret token, or null for an unknown (or
 * rotated) token. One all-day event per dated visit (survey, install, inspection) with the
 * household, the address and a link to the job; UIDs are stable so calendar apps update
 * events in place instead of duplicating them. No phone numbers: the URL is shareable.
 */
export async function crewCalendarIcs(token: string, now = new Date()): Promise<string | null> {
  const found = await findCrewByFeedToken(token);
  if (!found) return null;
  const rows = await db()
    .select({
      id: job.id,
      surveyDate: job.surveyDate,
      installDate: job.installDate,
      inspectionOn: job.inspectionOn,
      updatedAt: job.updatedAt,
      householdName: household.name,
      street: household.street,
      city: household.city,
      region: household.region,
      postalCode: household.postalCode,
      latitude: household.latitude,
      longitude: household.longitude,
    })
    .from(job)
    .innerJoin(deal, and(eq(deal.id, job.dealId), eq(deal.companyId, job.companyId)))
    .innerJoin(household, and(eq(household.id, deal.householdId), eq(household.companyId, deal.companyId)))
    .where(and(eq(job.companyId, found.companyId), eq(job.crewId, found.id)))
    .orderBy(asc(job.id));
  const [co] = await db().select({ name: company.name }).from(company).where(eq(company.id, found.companyId)).limit(1);
  const since = addDaysIso(await companyToday(found.companyId, now), -FEED_PAST_DAYS);
  const calendar = ical({
    name: `${found.name} — ${co?.name ?? "Jobs"}`,
    prodId: { company: "Kilowright", product: "Crew jobs", language: "EN" },
    description: `Jobs of ${found.name}`,
  });
  for (const r of rows) {
    const address = `${r.street}, ${r.city}, ${r.region} ${r.postalCode}`;
    const visits: { kind: JobDateKind; date: string | null }[] = [
      { kind: "survey", date: r.surveyDate },
      { kind: "install", date: r.installDate },
      { kind: "inspection", date: r.inspectionOn },
    ];
    for (const v of visits) {
      if (!v.date || v.date < since) continue;
      const url = `${env().APP_URL}/jobs/${r.id}`;
      calendar.createEvent({
        id: `job-${r.id}-${v.kind}@kilowright`,
        start: new Date(`${v.date}T00:00:00Z`),
        end: new Date(`${addDaysIso(v.date, 1)}T00:00:00Z`),
        allDay: true,
        stamp: r.updatedAt,
        summary: `${JOB_DATE_LABELS[v.kind]}: ${r.householdName}`,
        location: { title: r.householdName, address, geo: { lat: r.latitude, lon: r.longitude } },
        description: `${JOB_DATE_LABELS[v.kind]} at ${r.householdName}, ${address}.\nJob packet: ${url}`,
        url,
      });
    }
  }
  return calendar.toString();
}

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
  const bytes = await renderJobPacketPdf({ packet, photos, printedAt: now, jobUrl: `${env().APP_URL}/jobs/${jobId}` });
  const slug = packet.customer.name.toLowerCase().replace(/[^a-z0-9]+/g, "-").replace(/^-|-$/g, "") || "job";
  return { bytes, fileName: `job-packet-${slug}.pdf` };
}

// ── The customer's view of the project (their proposal page) ────────────────────────────

export type ProjectProgress = {
  stage: Stage;
  today: string;
  /** Only dates and whether the permit is approved: no staff names, numbers or notes. */
  job: { surveyDate: string | null; installDate: string | null; inspectionOn: string | null; ptoOn: string | null; permitApproved: boolean; installed: boolean } | null;
};

/** What the customer's project page shows, for the deal of a signed proposal. */
export async function getProjectProgress(companyId: string, dealId: string, now = new Date()): Promise<ProjectProgress | null> {
  const [d] = await db()
    .select({ stage: deal.stage })
    .from(deal)
    .where(and(eq(deal.id, dealId), eq(deal.companyId, companyId)))
    .limit(1);
  if (!d) return null;
  const j = await findJobForDeal(companyId, dealId);
  return {
    stage: d.stage,
    today: await companyToday(companyId, now),
    job: j
      ? {
          surveyDate: j.surveyDate,
          installDate: j.installDate,
          inspectionOn: j.inspectionOn,
          ptoOn: j.ptoOn,
          permitApproved: !!j.permitApprovedOn,
          installed: !!j.installedAt,
        }
      : null,
  };
}
