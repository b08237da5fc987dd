import "server-only";
import { and, asc, eq } from "drizzle-orm";
import { checklistTemplate, job } from "@/db/schema";
import type { JobChecklistItem } from "@/lib/schemas/jobs";
import type { Tx } from "@/server/db";
import { recordEvent } from "@/server/timeline";

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
  const checklist: JobChecklistItem[] = (template?.items ?? []).map((item) => ({
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
