import "server-only";
import { and, asc, eq } from "drizzle-orm";
import { checklistTemplate, job } from "@/db/schema";
import type { JobChecklistItem } from "@/lib/schemas/jobs";
import type { Tx } from "@/server/db";
import { recordEvent } from "@/server/timeline";

// ── Creating the job (deposits call this in the webhook's transaction) ──────────────────

type NewJob = { companyId: string; dealId: string; proposalId: string | null; actorUserId?: string | null };

/**
 * Creates the buildable job of a deal (called when its deposit is paid, inside that
 * transaction). Idempotent: a deal has at most one job (unique index job_deal_uq), and a
 * second call returns the existing job's id without writing anything. The job starts with a
 * copy of the company's active checklist template (the first by name), so later edits to the
 * template never change a job already under way. A deal that was cancelled, reopened and sold
 * again finds its old job cancelled: that job is reopened for the new sale (see reopenJob).
 */
export async function createJobForDeal(tx: Tx, j: NewJob): Promise<string> {
  const existing = await findJobForDeal(tx, j.companyId, j.dealId);
  if (existing?.cancelledAt) return reopenJob(tx, existing.id, j, existing.cancelReason);
  if (existing) return existing.id;

  const checklist = await freshChecklist(tx, j.companyId);
  const id = crypto.randomUUID();
  // INSERT IGNORE: a concurrent call that got there first wins; we then return its id.
  const result = await tx
    .insert(job)
    .ignore()
    .values({ id, companyId: j.companyId, dealId: j.dealId, proposalId: j.proposalId, checklist });
  if (result[0].affectedRows !== 1) {
    const winner = await findJobForDeal(tx, j.companyId, j.dealId);
    if (winner) return winner.id;
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

/**
 * The job of a cancelled sale, opened again for the new one: the old booking, records and
 * ticks belonged to the cancelled sale, so the schedule, crew, permit and interconnection
 * records and checklist start afresh (the old ones stay on the Timeline); notes and photos of
 * the house are kept.
 */
async function reopenJob(tx: Tx, jobId: string, j: NewJob, oldReason: string | null): Promise<string> {
  const checklist = await freshChecklist(tx, j.companyId);
  await tx
    .update(job)
    .set({
      proposalId: j.proposalId,
      crewId: null,
      surveyDate: null,
      surveyDoneOn: null,
      installDate: null,
      permitNumber: null,
      permitSubmittedOn: null,
      permitApprovedOn: null,
      interconnectionNumber: null,
      interconnectionSubmittedOn: null,
      interconnectionApprovedOn: null,
      inspectionOn: null,
      inspectionPassedOn: null,
      ptoOn: null,
      installedAt: null,
      checklist,
      cancelledAt: null,
      cancelReason: null,
    })
    .where(and(eq(job.id, jobId), eq(job.companyId, j.companyId)));
  await recordEvent(tx, {
    companyId: j.companyId,
    dealId: j.dealId,
    kind: "job.reopened",
    summary: "Job reopened for the new sale: ready to schedule the survey (the cancelled booking is in the Timeline above)",
    actorUserId: j.actorUserId ?? null,
    data: { jobId, proposalId: j.proposalId, checklistItems: checklist.length, cancelledBefore: oldReason },
  });
  return jobId;
}

/** A copy of the company's active checklist template (the first by name), nothing ticked. */
async function freshChecklist(tx: Tx, companyId: string): Promise<JobChecklistItem[]> {
  const [template] = await tx
    .select({ items: checklistTemplate.items })
    .from(checklistTemplate)
    .where(and(eq(checklistTemplate.companyId, companyId), eq(checklistTemplate.active, true)))
    .orderBy(asc(checklistTemplate.name), asc(checklistTemplate.id))
    .limit(1);
  return (template?.items ?? []).map((item) => ({ id: item.id, label: item.label, doneAt: null, doneByUserId: null }));
}

async function findJobForDeal(tx: Tx, companyId: string, dealId: string): Promise<{ id: string; cancelledAt: Date | null; cancelReason: string | null } | null> {
  const [row] = await tx
    .select({ id: job.id, cancelledAt: job.cancelledAt, cancelReason: job.cancelReason })
    .from(job)
    .where(and(eq(job.companyId, companyId), eq(job.dealId, dealId)))
    .limit(1);
  return row ?? null;
}
