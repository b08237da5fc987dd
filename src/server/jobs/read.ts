import "server-only";
import { and, desc, eq, isNull, type SQL } from "drizzle-orm";
import { crew, deal, household, job, type Stage } from "@/db/schema";
import { crewIdOfMember } from "@/server/crews";
import { db } from "@/server/db";
import { notFound } from "@/server/errors";
import type { Member } from "@/server/session";
import type { JobRecord, JobView } from "@/lib/job-packet";
import { companyToday, jobBucket, type JobBucket, type JobDateKind, nextJobDate } from "./dates";

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
    // A cancelled job leaves the list (its page stays readable by its link and from the deal).
    .where(and(await jobScope(member), isNull(job.cancelledAt)))
    .orderBy(desc(job.createdAt));
  const out: JobListRow[] = rows.map(({ checklist, ...r }) => {
    const items = checklist ?? [];
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
  return { ...row, checklist: row.checklist ?? [], stage: d?.stage ?? "deposit_paid", householdName: d?.householdName ?? "", crewName };
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
