import "server-only";
import { and, asc, eq, gt, inArray, isNotNull, sql, type SQL } from "drizzle-orm";
import { deal, household, job, membership, proposal, user, type Stage } from "@/db/schema";
import { can } from "@/lib/permissions";
import { checkManualMove, REP_STAGES, type BoardFilter } from "@/lib/stage-rules";
import { STAGE_LABELS } from "@/lib/stages";
import { openDeal } from "@/server/deal-scope";
import { dealColumns, type DealRow } from "@/server/deal-audience";
import { zoneForDays, withinDays } from "@/server/day-filters";
import { db, transaction, type Tx } from "@/server/db";
import { HttpError } from "@/server/errors";
import type { Member } from "@/server/session";
import { recordEvent } from "@/server/timeline";

/** A manual move the stage rules refuse (422); `needs` says what would make it pass. */
export class StageRuleError extends HttpError {
  constructor(
    message: string,
    readonly needs?: "reason" | "admin_reason",
  ) {
    super(422, "stage_rule", message, needs ? { reason: [message] } : undefined);
    this.name = "StageRuleError";
  }
}

export type StageMove = { dealId: string; from: Stage; to: Stage; reason: string | null; stageChangedAt: Date };

/**
 * Moves a deal to another stage by hand: permission, then the stage rules, then one
 * transaction that changes the stage (only if nobody moved it meanwhile) and writes the
 * Timeline event.
 */
export async function moveDealStage(member: Member, dealId: string, toStage: Stage, reason?: string | null): Promise<StageMove> {
  if (!can(member.role, "deals:write")) throw new HttpError(403, "forbidden", "Your role does not allow moving deals.");
  const found = (await openDeal(member, dealId)).deal; // reps see (and so move) only their own deals
  const from = found.stage;
  const office = can(member.role, "deals:read-all");
  if (!office && !(REP_STAGES.includes(from) && REP_STAGES.includes(toStage))) {
    const allowed = REP_STAGES.map((s) => STAGE_LABELS[s]).join(", ");
    throw new HttpError(403, "forbidden", `Your role can move deals only between ${allowed}; ask the office for ${STAGE_LABELS[toStage]}.`);
  }
  const why = reason?.trim() || null;
  const permitApprovedAt = toStage === "install_booked" ? await permitApprovedOn(member.companyId, dealId) : null;
  const hasLiveProposal = toStage === "proposal_out" ? await liveProposalOf(member.companyId, dealId) : false;
  const check = checkManualMove({ from, to: toStage, role: member.role, reason: why, permitApprovedAt, hasLiveProposal });
  if (!check.ok) throw new StageRuleError(check.reason, check.needs);

  const stageChangedAt = new Date();
  const summary = `${member.name} moved ${found.householdName} from ${STAGE_LABELS[from]} to ${STAGE_LABELS[toStage]}${why ? `: ${why}` : ""}`;
  await transaction(async (tx) => {
    const changed = await tx
      .update(deal)
      .set({ stage: toStage, stageChangedAt })
      // The stage compared as text, so the row is found by its primary key: planned on the
      // (company_id, stage) index, this UPDATE locked that index entry, and a concurrent move
      // waiting on it deadlocked instead of one of them answering 409.
      .where(and(eq(deal.id, dealId), eq(deal.companyId, member.companyId), sql`CAST(${deal.stage} AS CHAR) = ${from}`));
    if (changed[0].affectedRows !== 1) {
      throw new HttpError(409, "stage_conflict", "Someone else moved this deal a moment ago. Reload to see where it is now.");
    }
    await recordEvent(tx, {
      companyId: member.companyId,
      dealId,
      kind: "stage.moved",
      summary: summary.length > 500 ? `${summary.slice(0, 499)}…` : summary,
      actorUserId: member.userId,
      data: { from, to: toStage, reason: why, automatic: false },
    });
  });
  return { dealId, from, to: toStage, reason: why, stageChangedAt };
}

/** The permit approval date recorded on the deal's job (null while there is no job or no date). */
export async function permitApprovedOn(companyId: string, dealId: string): Promise<Date | null> {
  const [row] = await db()
    .select({ approvedOn: job.permitApprovedOn })
    .from(job)
    .where(and(eq(job.companyId, companyId), eq(job.dealId, dealId)))
    .limit(1);
  return row?.approvedOn ? new Date(`${row.approvedOn}T00:00:00Z`) : null;
}

/** Whether the deal has a sent proposal whose link is still open (the only way into Proposal out). */
async function liveProposalOf(companyId: string, dealId: string, now = new Date()): Promise<boolean> {
  const [row] = await db()
    .select({ id: proposal.id })
    .from(proposal)
    .where(and(eq(proposal.companyId, companyId), eq(proposal.dealId, dealId), eq(proposal.status, "sent"), gt(proposal.expiresAt, now)))
    .limit(1);
  return !!row;
}

/**
 * A move caused by the customer, by Stripe or by a job date (these moves happen by
 * themselves; nobody drags the card). Call it inside the transaction of the change that causes it; it moves the
 * deal only from one of `from` (so a late or repeated event never drags a deal backwards) and
 * writes the Timeline event in the same transaction. Returns whether the deal moved.
 */
export async function autoMoveStage(
  tx: Tx,
  move: { companyId: string; dealId: string; from: readonly Stage[]; to: Stage; summary: string; actorUserId?: string | null; data?: Record<string, unknown> },
): Promise<boolean> {
  const [row] = await tx
    .select({ stage: deal.stage })
    .from(deal)
    .where(and(eq(deal.id, move.dealId), eq(deal.companyId, move.companyId)))
    .for("update");
  if (!row || row.stage === move.to || !move.from.includes(row.stage)) return false;
  await tx
    .update(deal)
    .set({ stage: move.to, stageChangedAt: new Date() })
    .where(and(eq(deal.id, move.dealId), eq(deal.companyId, move.companyId)));
  await recordEvent(tx, {
    companyId: move.companyId,
    dealId: move.dealId,
    kind: "stage.moved",
    summary: move.summary.length > 500 ? `${move.summary.slice(0, 499)}…` : move.summary,
    actorUserId: move.actorUserId ?? null,
    data: { ...move.data, from: row.stage, to: move.to, reason: null, automatic: true },
  });
  return true;
}

/** The deals on the board: the person's visible deals, filtered on the server. */
export async function listBoardDeals(member: Member, filter: BoardFilter): Promise<(DealRow & { ownerUserId: string | null })[]> {
  const conditions: SQL[] = [eq(deal.companyId, member.companyId)];
  if (!can(member.role, "deals:read-all")) conditions.push(eq(deal.ownerUserId, member.userId));
  else if (filter.rep) conditions.push(eq(deal.ownerUserId, filter.rep));
  if (filter.source) conditions.push(eq(deal.source, filter.source));
  conditions.push(...withinDays(deal.createdAt, filter, await zoneForDays(member.companyId, filter)));
  return db()
    .select({ ...dealColumns, ownerUserId: deal.ownerUserId })
    .from(deal)
    .innerJoin(household, and(eq(household.id, deal.householdId), eq(household.companyId, deal.companyId)))
    .leftJoin(user, eq(user.id, deal.ownerUserId))
    .where(and(...conditions))
    .orderBy(asc(deal.stageChangedAt));
}

const DEAL_OWNER_ROLES: ("owner" | "admin" | "office_manager" | "sales_rep")[] = ["owner", "admin", "office_manager", "sales_rep"];

/** The company's active members who may own deals (its sellers); with `userId`, that one only. */
export function activeDealOwners(companyId: string, userId?: string) {
  return db()
    .select({ id: user.id, name: user.name })
    .from(membership)
    .innerJoin(user, eq(user.id, membership.userId))
    .where(
      and(
        eq(membership.companyId, companyId),
        eq(membership.status, "active"),
        inArray(membership.role, DEAL_OWNER_ROLES),
        userId === undefined ? undefined : eq(membership.userId, userId),
      ),
    );
}

/** People who own deals (for the rep filter). */
export async function listBoardOwners(member: Member): Promise<{ id: string; name: string }[]> {
  return activeDealOwners(member.companyId).orderBy(asc(user.name));
}

/** The lead sources used on the company's deals. */
export async function listBoardSources(member: Member): Promise<string[]> {
  const rows = await db()
    .selectDistinct({ source: deal.source })
    .from(deal)
    .where(and(eq(deal.companyId, member.companyId), isNotNull(deal.source)))
    .orderBy(asc(deal.source));
  return rows.map((r) => r.source).filter((s): s is string => !!s).sort();
}
