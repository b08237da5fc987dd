import "server-only";
import { and, eq } from "drizzle-orm";
import { crew, deal, household, job, type Stage } from "@/db/schema";
import type { JobFields } from "@/lib/schemas/jobs";
import { formatCalendarDate } from "@/lib/format";
import { STAGE_LABELS } from "@/lib/stages";
import { can } from "@/lib/permissions";
import { dateInZone, todayInZone } from "@/lib/zoned-time";
import { getCompanySettings } from "@/server/company-settings";
import { db, transaction, type Tx } from "@/server/db";
import { HttpError, notFound } from "@/server/errors";
import type { Member } from "@/server/session";
import { autoMoveStage } from "@/server/stages";
import type { JobRecord, JobView } from "@/lib/job-packet";
import { recordEvent } from "@/server/timeline";
import { getJobOrThrow, getJobRowOrThrow } from "./read";
import { assertJobOpen, cancelWindowEndOf, installInsideWindow } from "./rules";

// ── The office's changes: dates, crew, permits; each may move the deal ──────────────────

type DateFieldKey = Exclude<keyof JobFields, "crewId" | "permitNumber" | "interconnectionNumber" | "notes">;

const FIELD_LABELS: Record<keyof JobFields, string> = {
  crewId: "crew",
  surveyDate: "survey date",
  surveyDoneOn: "survey done",
  installDate: "install date",
  permitNumber: "permit number",
  permitSubmittedOn: "permit submitted",
  permitApprovedOn: "permit approved",
  interconnectionNumber: "interconnection number",
  interconnectionSubmittedOn: "interconnection submitted",
  interconnectionApprovedOn: "interconnection approved",
  inspectionOn: "inspection date",
  inspectionPassedOn: "inspection passed",
  ptoOn: "PTO date",
  notes: "notes",
};

const dateText = (iso: string) => formatCalendarDate(iso);

/** A stage move a job change causes: from which stages, to which, and why. */
export type JobStageMove = { from: readonly Stage[]; to: Stage; why: string };

/**
 * The stage moves caused by a job change, in order (each only forward from the named stages).
 * Planned dates (survey, install, inspection) never move a deal by themselves: a deal moves when
 * something is recorded as done, and records cannot be after the company's today (updateJob
 * refuses them). Survey done → Survey; permit submitted → Permitting; an approved permit with an
 * install date on the books → Install booked (the stage names the booking itself, and the
 * permit's approval is what has happened); installed is the crew's (markJobInstalled);
 * inspection passed → Inspected; PTO received → Live.
 */
export function jobStageMoves(before: Pick<JobRecord, DateFieldKey>, after: Pick<JobRecord, DateFieldKey>): JobStageMove[] {
  const set = (k: DateFieldKey) => !!after[k] && after[k] !== before[k];
  const moves: JobStageMove[] = [];
  if (set("surveyDoneOn")) moves.push({ from: ["deposit_paid"], to: "survey", why: `site survey done on ${dateText(after.surveyDoneOn!)}` });
  if (set("permitSubmittedOn")) moves.push({ from: ["deposit_paid", "survey"], to: "permitting", why: `permit submitted on ${dateText(after.permitSubmittedOn!)}` });
  if (after.installDate && after.permitApprovedOn && (set("installDate") || set("permitApprovedOn"))) {
    moves.push({
      from: ["deposit_paid", "survey", "permitting"],
      to: "install_booked",
      why: `install set for ${dateText(after.installDate)}, permit approved on ${dateText(after.permitApprovedOn)}`,
    });
  }
  if (set("inspectionPassedOn")) moves.push({ from: ["installed"], to: "inspected", why: `inspection passed on ${dateText(after.inspectionPassedOn!)}` });
  if (set("ptoOn")) moves.push({ from: ["inspected"], to: "live", why: `permission to operate received on ${dateText(after.ptoOn!)}` });
  return moves;
}

/** Dates that record what happened (not plans): never after the company's today. */
const RECORD_FIELDS = ["surveyDoneOn", "permitSubmittedOn", "permitApprovedOn", "interconnectionSubmittedOn", "interconnectionApprovedOn", "inspectionPassedOn", "ptoOn"] as const;

const refuse = (field: keyof JobFields, message: string) => new HttpError(422, "validation_failed", `${field}: ${message}`, { [field]: [message] });

/**
 * The rules a change must keep, on the merged record (a field may be sent alone): records not in
 * the future, approvals after submissions, the inspection after the install, and no install
 * inside the buyer's right-to-cancel window (`windowEnd`, its last day).
 */
function checkJobChange(before: JobRecord, after: JobRecord, changed: (keyof JobFields)[], c: { today: string; timeZone: string; windowEnd: string | null }): void {
  for (const k of RECORD_FIELDS) {
    const v = after[k];
    if (changed.includes(k) && v && v > c.today) {
      throw refuse(k, `The ${FIELD_LABELS[k]} date records what has happened, so it cannot be after today (${dateText(c.today)}). Plans go in the survey, install and inspection dates.`);
    }
  }
  if (after.permitSubmittedOn && after.permitApprovedOn && after.permitApprovedOn < after.permitSubmittedOn) {
    throw refuse("permitApprovedOn", "The permit cannot be approved before it was submitted");
  }
  if (after.interconnectionSubmittedOn && after.interconnectionApprovedOn && after.interconnectionApprovedOn < after.interconnectionSubmittedOn) {
    throw refuse("interconnectionApprovedOn", "Interconnection cannot be approved before it was submitted");
  }
  if (after.installDate && after.inspectionOn && after.inspectionOn < after.installDate && (changed.includes("inspectionOn") || changed.includes("installDate"))) {
    throw refuse("inspectionOn", "The inspection cannot come before the install");
  }
  if (after.installDate && changed.includes("installDate")) {
    const early = installInsideWindow(after.installDate, c.windowEnd);
    if (early) throw refuse("installDate", early);
  }
  if (after.inspectionPassedOn && changed.includes("inspectionPassedOn")) {
    if (!before.installedAt) throw refuse("inspectionPassedOn", "An inspection cannot be recorded before the installation: the crew has not marked this job installed yet.");
    const installedOn = dateInZone(before.installedAt, c.timeZone);
    if (after.inspectionPassedOn < installedOn) throw refuse("inspectionPassedOn", `The inspection cannot have passed before the installation on ${dateText(installedOn)}.`);
  }
}

export async function dealHouseholdName(tx: Tx, companyId: string, dealId: string): Promise<string> {
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
export async function updateJob(member: Member, jobId: string, fields: JobFields, now = new Date()): Promise<JobUpdateResult> {
  if (!can(member.role, "jobs:manage")) throw new HttpError(403, "forbidden", "Your role does not allow scheduling jobs.");
  const current = await getJobRowOrThrow(member, jobId);
  const { timeZone } = await getCompanySettings(member.companyId);
  const rules = { today: todayInZone(timeZone, now), timeZone, windowEnd: await cancelWindowEndOf(member.companyId, current) };
  if (fields.crewId) {
    const [c] = await db().select({ id: crew.id }).from(crew).where(and(eq(crew.id, fields.crewId), eq(crew.companyId, member.companyId))).limit(1);
    if (!c) throw new HttpError(422, "validation_failed", "crewId: Pick a crew from the list", { crewId: ["Pick a crew from the list"] });
  }
  const moved: { to: Stage }[] = [];
  await transaction(async (tx) => {
    const [before] = await tx
      .select()
      .from(job)
      .where(and(eq(job.id, jobId), eq(job.companyId, member.companyId)))
      .for("update");
    if (!before) throw notFound("Job");
    assertJobOpen(before);
    const changes: Partial<JobRecord> = {};
    const changed: (keyof JobFields)[] = [];
    for (const key of Object.keys(FIELD_LABELS) as (keyof JobFields)[]) {
      const value = fields[key];
      if (value === undefined || value === before[key]) continue;
      (changes as Record<string, unknown>)[key] = value;
      changed.push(key);
    }
    const after = { ...before, ...changes };
    checkJobChange(before, after, changed, rules);
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
