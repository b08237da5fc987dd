import "server-only";
import { and, desc, eq, inArray, isNotNull } from "drizzle-orm";
import { job, proposal } from "@/db/schema";
import { addDaysToDate } from "@/lib/zoned-time";
import { formatIsoDateLong } from "@/lib/proposal-snapshot";
import { db, type Tx } from "@/server/db";
import { HttpError } from "@/server/errors";
import { recordEvent } from "@/server/timeline";

// ── The job's workflow rules: cancelled jobs are frozen; no install inside the buyer's window ──

/** A cancelled job (its deal was cancelled) is read only: every change is refused, naming when and why. */
export function assertJobOpen(j: { cancelledAt: Date | null; cancelReason: string | null }): void {
  if (!j.cancelledAt) return;
  throw new HttpError(409, "job_cancelled", `This job is cancelled and read only: ${j.cancelReason ?? "its deal was cancelled"}.`);
}

/**
 * The last day of the buyer's right to cancel the sale the job builds (16 CFR 429.1: through
 * midnight of the third business day after signing), or null when the sale carries none (not
 * made in the home). The job's own proposal first; a job without one takes the deal's signed
 * or cancelled agreement with the latest deadline.
 */
export async function cancelWindowEndOf(companyId: string, j: { dealId: string; proposalId: string | null }, tx?: Tx): Promise<string | null> {
  const q = (tx ?? db())
    .select({ deadline: proposal.cancelDeadline })
    .from(proposal)
    .where(
      and(
        eq(proposal.companyId, companyId),
        eq(proposal.dealId, j.dealId),
        j.proposalId ? eq(proposal.id, j.proposalId) : inArray(proposal.status, ["signed", "cancelled"]),
        eq(proposal.inHomeSale, true),
        isNotNull(proposal.cancelDeadline),
      ),
    )
    .orderBy(desc(proposal.cancelDeadline))
    .limit(1);
  const [row] = await q;
  return row?.deadline ?? null;
}

/** The first day an install may happen: the day after the buyer's window ends (null: no window). */
export const firstInstallDay = (windowEnd: string | null): string | null => (windowEnd ? addDaysToDate(windowEnd, 1) : null);

/** Why an install on `installDate` is too early for the buyer's window, or null when it is not. */
export function installInsideWindow(installDate: string, windowEnd: string | null): string | null {
  if (!windowEnd || installDate > windowEnd) return null;
  return `The install cannot be booked before the buyer's right to cancel ends: it runs through ${formatIsoDateLong(windowEnd)}. Pick ${formatIsoDateLong(firstInstallDay(windowEnd)!)} or later.`;
}

/**
 * Cancels the deal's job in the transaction that cancels the deal: frozen as it was (dates, crew
 * and checklist stay for the record, and every change is refused from now on), so it leaves the
 * crew's calendar feed, Today and the Jobs list. Frozen, not cleared (our choice): the office can
 * still see what had been booked and tell the crew, and a refund dispute has the history. No job
 * (no deposit yet): nothing to do. Returns whether a job was cancelled.
 */
export async function cancelJobOfDeal(tx: Tx, c: { companyId: string; dealId: string; reason: string; at: Date; actorUserId?: string | null }): Promise<boolean> {
  const [row] = await tx
    .select({ id: job.id, cancelledAt: job.cancelledAt, installedAt: job.installedAt })
    .from(job)
    .where(and(eq(job.companyId, c.companyId), eq(job.dealId, c.dealId)))
    .for("update");
  if (!row || row.cancelledAt) return false;
  const reason = c.reason.length > 300 ? `${c.reason.slice(0, 299)}…` : c.reason;
  await tx.update(job).set({ cancelledAt: c.at, cancelReason: reason }).where(and(eq(job.id, row.id), eq(job.companyId, c.companyId)));
  await recordEvent(tx, {
    companyId: c.companyId,
    dealId: c.dealId,
    kind: "job.cancelled",
    summary: `Job cancelled: ${reason}. Its dates and crew are kept read only and it left the crew's calendar.`,
    actorUserId: c.actorUserId ?? null,
    data: { jobId: row.id },
  });
  return true;
}
