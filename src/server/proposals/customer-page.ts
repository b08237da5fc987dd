import "server-only";
import { createElement } from "react";
import { and, eq } from "drizzle-orm";
import { proposal } from "@/db/schema";
import { proposalLinkState, type ProposalLinkState } from "@/lib/proposal-snapshot";
import { proposalQuestionSchema } from "@/lib/schemas/proposal";
import QuestionAskedEmail from "@emails/question-asked";
import { transaction } from "@/server/db";
import { HttpError } from "@/server/errors";
import type { ClientMeta } from "@/server/client-address";
import { takeTurn } from "@/server/limits";
import { queueMail, sendQueuedNow } from "@/server/outbound-mail";
import { homeownerInvalid } from "@/server/homeowner-refusals";
import { recordEvent } from "@/server/timeline";
import { insertProposalEvent } from "./events";
import { STATE_REFUSALS } from "./revoke";
import { labelOf, type ProposalRow } from "./rows";
import { dealProposalUrl } from "./send";

// ── The customer's page ─────────────────────────────────────────────────────────────────────

/** A link opened again within this time is not recorded as another view. */
export const VIEW_THROTTLE_MS = 10 * 60_000;

/**
 * Records the customer opening the page: "opened" the first time, "viewed" at most once per
 * 10 minutes after that, each on the proposal's events and the deal's Timeline. Only live and
 * signed versions record (an old link's visits are not the customer reading this proposal).
 */
export async function recordProposalView(p: ProposalRow, client: ClientMeta, now = new Date()): Promise<void> {
  const state = proposalLinkState(p, now);
  if (state !== "live" && state !== "signed") return;
  if (p.lastViewedAt && now.getTime() - p.lastViewedAt.getTime() < VIEW_THROTTLE_MS) return;
  await transaction(async (tx) => {
    const [row] = await tx
      .select({ firstOpenedAt: proposal.firstOpenedAt, lastViewedAt: proposal.lastViewedAt })
      .from(proposal)
      .where(and(eq(proposal.id, p.id), eq(proposal.companyId, p.companyId)))
      .for("update");
    if (!row) return;
    if (row.lastViewedAt && now.getTime() - row.lastViewedAt.getTime() < VIEW_THROTTLE_MS) return;
    const first = !row.firstOpenedAt;
    await tx
      .update(proposal)
      .set(first ? { firstOpenedAt: now, lastViewedAt: now } : { lastViewedAt: now })
      .where(and(eq(proposal.id, p.id), eq(proposal.companyId, p.companyId)));
    const kind = first ? "opened" : "viewed";
    await insertProposalEvent(tx, { companyId: p.companyId, proposalId: p.id, kind, client, at: now });
    await recordEvent(tx, {
      companyId: p.companyId,
      dealId: p.dealId,
      kind: `proposal.${kind}`,
      summary: `The customer ${first ? "opened" : "viewed"} proposal ${labelOf(p)}`,
      actorUserId: null,
      data: { proposalId: p.id, ip: client.ip },
    });
  });
}


/** The customer asks the rep a question: stored as an event, on the Timeline, e-mailed to the rep. */
export async function askQuestion(p: ProposalRow, input: unknown, client: ClientMeta): Promise<{ id: string }> {
  const state = proposalLinkState(p);
  if (state !== "live" && state !== "signed") throw new HttpError(409, "not_live", `${STATE_REFUSALS[state as Exclude<ProposalLinkState, "live">]} Questions go through the newest link.`);
  const parsed = proposalQuestionSchema.safeParse(input);
  if (!parsed.success) throw homeownerInvalid(p.locale, parsed.error, { question: "question" });
  // Counted before the question is stored and mailed (limits.ts), per link and per address.
  const tooMany = (wait: string) => `That is many questions in one hour; your installer has them. Try again in ${wait}, or call them.`;
  await takeTurn("questionLink", p.id, tooMany);
  await takeTurn("questionAddress", client.ip, tooMany);
  const question = parsed.data.question;
  const { id, mailId } = await transaction(async (tx) => {
    const eid = await insertProposalEvent(tx, { companyId: p.companyId, proposalId: p.id, kind: "question", body: question, client });
    const short = question.length > 300 ? `${question.slice(0, 299)}…` : question;
    await recordEvent(tx, {
      companyId: p.companyId,
      dealId: p.dealId,
      kind: "proposal.question",
      summary: `The customer asked about ${labelOf(p)}: “${short}”`,
      actorUserId: null,
      data: { proposalId: p.id, proposalEventId: eid },
    });
    // The question is stored and on the Timeline; its e-mail to the rep is written with it (outbox).
    const queued = await queueMail(tx, {
      companyId: p.companyId,
      kind: "proposal-question",
      to: p.snapshot.rep.email,
      replyTo: p.sentToEmail,
      subject: `Question from the ${p.snapshot.household.name} (${labelOf(p)})`,
      react: createElement(QuestionAskedEmail, {
        householdName: p.snapshot.household.name,
        label: labelOf(p),
        question,
        customerEmail: p.sentToEmail,
        dealUrl: dealProposalUrl(p.dealId),
      }),
      idempotencyKey: `proposal-question-${eid}`,
    });
    return { id: eid, mailId: queued };
  });
  await sendQueuedNow([mailId]);
  return { id };
}
