// Stage rules: which manual moves are allowed and what they require.
// Pure: shared by the server (which enforces them) and the board (which explains them).
import { z } from "zod";
import { STAGES, type Role, type Stage } from "@/lib/enums";
import { STAGE_LABELS } from "@/lib/stages";

/** Side states, beside the main line. */
export const SIDE_STAGES: readonly Stage[] = ["on_hold", "lost", "cancelled"];
/** The main line of a deal, from first contact to a running system, in order (STAGES lists it first). */
export const PIPELINE: readonly Stage[] = STAGES.filter((s) => !SIDE_STAGES.includes(s));

/** Stages a sales rep may move their own deals between; the rest is the office's. */
export const REP_STAGES: readonly Stage[] = ["lead", "bills_in", "designing", "proposal_out", "on_hold", "lost"];

const OFFICE_ROLES: readonly Role[] = ["owner", "admin", "office_manager"];
const ADMIN_ROLES: readonly Role[] = ["owner", "admin"];

/**
 * Days a deal may sit in a stage before the board flags it as stalled, until a company sets
 * its own in Settings → Company (src/lib/schemas/company-settings.ts). The defaults follow
 * common practice in the trade (a proposal unanswered after two weeks, a permit pending after
 * a month…). Stages without an entry are never flagged (Live is the end; Lost and Cancelled
 * are closed).
 */
export const DEFAULT_STALL_DAYS: Partial<Record<Stage, number>> = {
  lead: 7,
  bills_in: 7,
  designing: 5,
  proposal_out: 14,
  signed: 7,
  deposit_paid: 10,
  survey: 14,
  permitting: 30,
  install_booked: 21,
  installed: 14,
  inspected: 30,
  on_hold: 30,
};

export function isStalled(stage: Stage, daysInStage: number, limits: Partial<Record<Stage, number>> = DEFAULT_STALL_DAYS): boolean {
  const limit = limits[stage];
  return limit !== undefined && daysInStage > limit;
}

export type MoveCheck = { ok: true } | { ok: false; reason: string; needs?: "reason" | "admin_reason" };

export type MoveInput = {
  from: Stage;
  to: Stage;
  role: Role;
  reason?: string | null;
  /**
   * When the permit was approved: the deal's job.permit_approved_on, or null while the job has
   * none (or there is no job yet). Without it, Install booked needs an owner's or admin's reason.
   */
  permitApprovedAt: Date | null;
  /**
   * Whether the deal has a sent proposal whose link is still open (status "sent", not expired).
   * Proposal out is where sending puts a deal; by hand it needs one.
   */
  hasLiveProposal?: boolean;
};

const pipelineIndex = (s: Stage) => PIPELINE.indexOf(s);

/** Checks a move a person makes by hand (automatic moves by e-sign or Stripe do not come here). */
export function checkManualMove({ from, to, role, reason, permitApprovedAt, hasLiveProposal = false }: MoveInput): MoveCheck {
  const why = reason?.trim() ?? "";
  const office = OFFICE_ROLES.includes(role);
  const admin = ADMIN_ROLES.includes(role);
  const toLabel = STAGE_LABELS[to];

  if (from === to) return { ok: false, reason: `The deal is already in ${toLabel}.` };
  if (to === "signed") {
    return { ok: false, reason: "Signed happens by itself when the customer e-signs the proposal; it cannot be set by hand." };
  }
  if (to === "deposit_paid") {
    return { ok: false, reason: "Deposit paid happens by itself when the card payment for the deposit is confirmed; it cannot be set by hand." };
  }
  if (to === "cancelled") {
    return { ok: false, reason: "Only the customer can cancel, inside the cooling-off window; use Lost (with a reason) instead." };
  }
  if (to === "proposal_out" && !hasLiveProposal) {
    return {
      ok: false,
      reason: "Proposal out happens by itself when a proposal is sent from the deal's Proposal tab; this deal has no sent proposal with an open link.",
    };
  }
  if (!office && !(REP_STAGES.includes(from) && REP_STAGES.includes(to))) {
    return { ok: false, reason: `Your role can move deals only between ${REP_STAGES.map((s) => STAGE_LABELS[s]).join(", ")}.` };
  }
  if (to === "lost" && !why) return { ok: false, reason: "Say why the deal is lost.", needs: "reason" };
  if (to === "on_hold" && !why) return { ok: false, reason: "Say why the deal is on hold.", needs: "reason" };
  if ((from === "lost" || from === "cancelled") && !why) {
    return { ok: false, reason: `Say why this ${STAGE_LABELS[from].toLowerCase()} deal is reopened.`, needs: "reason" };
  }

  const fromIdx = pipelineIndex(from);
  const toIdx = pipelineIndex(to);
  const depositIdx = pipelineIndex("deposit_paid");
  if (fromIdx >= 0 && toIdx >= 0) {
    if (toIdx < fromIdx) {
      if (!office) return { ok: false, reason: "Only the office can move a deal back to an earlier stage." };
      if (!why) return { ok: false, reason: `Say why the deal goes back to ${toLabel}.`, needs: "reason" };
    }
    if (fromIdx < depositIdx && toIdx > depositIdx) {
      return { ok: false, reason: `The deal must be signed and its deposit paid before it can move to ${toLabel}.` };
    }
  }

  if (to === "install_booked" && !permitApprovedAt) {
    if (!admin) {
      return {
        ok: false,
        reason: "No permit approval date is recorded for this deal. Only an owner or admin can book the install without one, giving a reason.",
      };
    }
    if (!why) {
      return {
        ok: false,
        reason: "No permit approval date is recorded for this deal. To book the install anyway, give a reason.",
        needs: "admin_reason",
      };
    }
  }
  return { ok: true };
}

/** Why a person moves a deal (some moves require it); empty means none. */
export const stageMoveReason = z
  .string()
  .trim()
  .max(300, "Keep the reason under 300 characters")
  .optional()
  .nullable()
  .transform((v) => (v ? v : null));

/** PATCH /api/deals/[id]/stage */
export const stageMoveSchema = z.object({ stage: z.enum(STAGES, "Pick a stage"), reason: stageMoveReason });

const optionalFilter = z
  .string()
  .trim()
  .max(100)
  .optional()
  .transform((v) => (v ? v : undefined));
const optionalDate = z
  .string()
  .regex(/^\d{4}-\d{2}-\d{2}$/)
  .optional()
  .catch(undefined);

/** The board's filters, read from the query string (bad values are ignored, not errors). */
export const boardFilterSchema = z.object({
  rep: z.string().uuid().optional().catch(undefined),
  source: optionalFilter.catch(undefined),
  from: optionalDate,
  to: optionalDate,
});
export type BoardFilter = { rep?: string; source?: string; from?: string; to?: string };
