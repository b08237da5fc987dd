import "server-only";
import { createHash } from "node:crypto";
import { createElement } from "react";
import { and, eq, inArray, max } from "drizzle-orm";
import { company, proposal, type Stage } from "@/db/schema";
import { renderProposalPdf } from "@/documents/proposal-pdf";
import { env } from "@/env";
import { formatDate, formatDateTime } from "@/lib/format";
import { can } from "@/lib/permissions";
import { buildProposalSnapshot, FIRST_PROPOSAL_NUMBER, proposalLabel, type SnapshotSource } from "@/lib/proposal-snapshot";
import { describeStale, type OfferBasis } from "@/lib/offer-basis";
import type { ProposalSnapshot } from "@/lib/schemas/proposal";
import { sendProposalSchema } from "@/lib/schemas/proposal";
import ProposalSentEmail from "@emails/proposal-sent";
import type { Locale } from "@/lib/i18n/locales";
import { translator } from "@/lib/i18n/translator";
import { transaction, type Tx } from "@/server/db";
import { openDeal, type DealScope } from "@/server/deal-scope";
import { getDesignForDeal } from "@/server/designs";
import { offerUnbuildableReason } from "@/server/electrical";
import { fieldError, forbidden, HttpError } from "@/server/errors";
import { sendEmail } from "@/server/mail";
import { listOffers } from "@/server/offers";
import { validationError } from "@/server/route";
import type { Member } from "@/server/session";
import { autoMoveStage } from "@/server/stages";
import { withFilesUndoneOnFailure } from "@/server/storage";
import { recordEvent } from "@/server/timeline";
import { newLinkToken } from "@/server/tokens";
import { insertProposalEvent } from "./events";
import { labelOf } from "./rows";

// ── Freezing the offers ─────────────────────────────────────────────────────────────────────


/**
 * Everything the snapshot copies, taken from the chosen offers themselves: their figures and
 * the usage, design, equipment and price book they were computed from. Only offers whose inputs
 * are all current may be frozen (409 offers_stale naming each offer and what changed), so the
 * usage a proposal shows is the usage its savings were figured with.
 */
export async function snapshotSourceFor(scope: DealScope, offerIds: string[] | undefined, takenAt: Date): Promise<SnapshotSource> {
  const all = await listOffers(scope);
  if (all.length === 0) throw fieldError("offerIds", "This deal has no offers yet: make one on the Offers tab first");
  let chosen = all;
  if (offerIds) {
    if (new Set(offerIds).size !== offerIds.length) throw fieldError("offerIds", "An offer is listed twice");
    chosen = offerIds.map((id) => {
      const found = all.find((o) => o.id === id);
      if (!found) throw fieldError("offerIds", "Pick offers of this deal");
      return found;
    });
    chosen.sort((a, b) => a.position - b.position);
  }
  if (chosen.length > 3) throw fieldError("offerIds", "A proposal holds at most 3 offers");
  for (const o of chosen) {
    if (o.discountStatus === "pending") throw fieldError("offerIds", `"${o.name}" has a discount waiting for the office's approval; send it once it is decided, or leave it out`);
    if (o.discountStatus === "declined") throw fieldError("offerIds", `The office declined the discount on "${o.name}"; save the offer again with an allowed discount, or leave it out`);
  }
  const stale = chosen.filter((o) => o.stale.length > 0 || !o.basis);
  if (stale.length > 0) {
    throw new HttpError(409, "offers_stale", `Recompute these offers: ${stale.map((o) => `"${o.name}" (${describeStale(o.stale)} changed)`).join("; ")}. Open the Offers tab and recompute them.`);
  }
  const bases = chosen.map((o) => o.basis as OfferBasis);
  // Complete or refused: a string plan, the panel's ratings and passing electrical checks (src/lib/string-plan-rule.ts).
  const doc = (await getDesignForDeal(scope))?.document;
  for (const [i, o] of chosen.entries()) {
    const reason = await offerUnbuildableReason(scope, doc, o, bases[i].inverter);
    if (reason) throw fieldError("offerIds", `"${o.name}" cannot go into a proposal yet. ${reason}.`);
  }
  // Current offers share the deal's one usage year and design revision; the first stands for all.
  const { usage, design: saved, priceBook } = bases[0];
  const h = scope.household;
  const d = scope.deal;
  return {
    takenAt,
    company: { name: scope.settings.name, licenseNumber: scope.settings.licenseNumber },
    rep: d.ownerName && d.ownerEmail ? { name: d.ownerName, email: d.ownerEmail } : { name: scope.member.name, email: scope.member.email },
    household: { name: h.name, contactName: h.contactName, email: h.email, phone: h.phone, street: h.street, city: h.city, region: h.region, postalCode: h.postalCode, latitude: h.latitude, longitude: h.longitude, language: h.language },
    utilityName: d.utilityName ?? null,
    usage: { monthlyKwh: usage.monthlyKwh, source: usage.source, estimatedMonths: usage.estimatedMonths, fillMethod: usage.fillMethod },
    design: { lossesPct: saved.lossesPct, faces: saved.faces },
    offers: chosen.map((o, i) => ({ position: o.position, name: o.name, inputs: o.inputs, figures: o.results, module: bases[i].module, inverter: bases[i].inverter })),
    book: priceBook.document,
  };
}

const sha256Hex = (bytes: Uint8Array) => createHash("sha256").update(bytes).digest("hex");

export const proposalUrl = (token: string) => `${env().APP_URL}/p/${token}`;
export const dealProposalUrl = (dealId: string) => `${env().APP_URL}/deals/${dealId}/proposal`;

/** Stages a newly sent proposal moves a deal from (later stages stay where they are). */
const BEFORE_PROPOSAL: readonly Stage[] = ["lead", "bills_in", "designing", "proposal_out"];

export type SentProposal = { id: string; label: string; number: number; version: number; expiresAt: Date; mailSent: boolean; mailError: string | null };

function isDuplicateKey(err: unknown): boolean {
  for (let e: unknown = err, depth = 0; e && depth < 5; depth++) {
    if (typeof e === "object" && e !== null && (e as { code?: unknown }).code === "ER_DUP_ENTRY") return true;
    e = typeof e === "object" && e !== null ? (e as { cause?: unknown }).cause : null;
  }
  return false;
}

/**
 * Under a lock on the company row: the deal's earlier versions and the next number and version
 * (a deal's first proposal takes the company's next number, later ones the next version).
 */
async function nextNumbering(tx: Tx, companyId: string, dealId: string) {
  await tx.select({ id: company.id }).from(company).where(eq(company.id, companyId)).for("update");
  const earlier = await tx
    .select({ id: proposal.id, number: proposal.number, version: proposal.version, status: proposal.status })
    .from(proposal)
    .where(and(eq(proposal.companyId, companyId), eq(proposal.dealId, dealId)));
  const signed = earlier.find((p) => p.status === "signed");
  if (signed) throw new HttpError(409, "already_signed", `${labelOf(signed)} of this deal is signed; a signed agreement is not replaced by a new version.`);
  let number: number;
  let version: number;
  if (earlier.length > 0) {
    number = earlier[0].number;
    version = Math.max(...earlier.map((p) => p.version)) + 1;
  } else {
    const [top] = await tx.select({ n: max(proposal.number) }).from(proposal).where(eq(proposal.companyId, companyId));
    number = Math.max(FIRST_PROPOSAL_NUMBER, (top?.n ?? FIRST_PROPOSAL_NUMBER - 1) + 1);
    version = 1;
  }
  return { earlier, number, version };
}

/** Marks the deal's live earlier versions replaced by the new one. */
async function markReplaced(tx: Tx, companyId: string, live: { id: string }[], id: string): Promise<void> {
  if (live.length > 0) {
    await tx
      .update(proposal)
      .set({ status: "replaced", replacedByProposalId: id })
      .where(
        and(
          eq(proposal.companyId, companyId),
          inArray(
            proposal.id,
            live.map((p) => p.id),
          ),
          eq(proposal.status, "sent"),
        ),
      );
  }
}

/**
 * Freezes the chosen offers (all by default) into a new proposal version, renders and stores
 * its PDF, marks earlier live versions of the deal replaced, moves the deal to Proposal out and
 * e-mails the link. Numbering happens under a lock on the company row: a deal's first proposal
 * takes the company's next number, later ones the same number with the next version.
 */
export async function sendProposal(member: Member, input: unknown): Promise<SentProposal> {
  if (!can(member.role, "proposals:send")) throw forbidden("sending proposals");
  const parsed = sendProposalSchema.safeParse(input);
  if (!parsed.success) throw validationError(parsed.error);
  const { dealId, offerIds, toEmail, message, validDays, inHomeSale } = parsed.data;
  const scope = await openDeal(member, dealId); // reps: only their own deals

  const sentAt = new Date();
  const snapshot = buildProposalSnapshot(await snapshotSourceFor(scope, offerIds, sentAt));
  const expiresAt = new Date(sentAt.getTime() + validDays * 86_400_000);
  const { token, hash } = newLinkToken();
  const id = crypto.randomUUID();
  const key = `${member.companyId}/proposals/${crypto.randomUUID()}.pdf`;
  let numbering: { number: number; version: number };
  try {
    numbering = await withFilesUndoneOnFailure((put) => transaction(async (tx) => {
      const { earlier, number, version } = await nextNumbering(tx, member.companyId, dealId);
      const pdf = await renderProposalPdf(snapshot, { number, version, sentAt, expiresAt, timeZone: scope.settings.timeZone, locale: scope.household.language, inHomeSale, cancelDeadlineText: null /* known once signed: the signed copy and the page show the date */ });
      await put(key, pdf);
      await tx.insert(proposal).values({
        id,
        companyId: member.companyId,
        dealId,
        number,
        version,
        status: "sent",
        snapshot,
        pdfStorageKey: key,
        pdfSha256: sha256Hex(pdf),
        tokenHash: hash,
        expiresAt,
        sentToEmail: toEmail,
        sentByUserId: member.userId,
        inHomeSale,
        locale: scope.household.language,
        createdAt: sentAt,
      });
      const live = earlier.filter((p) => p.status === "sent");
      await markReplaced(tx, member.companyId, live, id);
      const label = proposalLabel(number, version);
      await insertProposalEvent(tx, { companyId: member.companyId, proposalId: id, kind: "sent", body: `to ${toEmail}`, actorUserId: member.userId, at: sentAt });
      const offerNames = snapshot.offers.map((o) => `"${o.name}"`).join(", ");
      await recordEvent(tx, {
        companyId: member.companyId,
        dealId,
        kind: "proposal.sent",
        summary: `${member.name} sent proposal ${label} to ${toEmail} (${offerNames}), link valid until ${formatDate(expiresAt, scope.settings.timeZone)}${live.length ? `; replaces ${live.map(labelOf).join(", ")}` : ""}`,
        actorUserId: member.userId,
        data: { proposalId: id, number, version },
      });
      await autoMoveStage(tx, {
        companyId: member.companyId,
        dealId,
        from: BEFORE_PROPOSAL,
        to: "proposal_out",
        summary: `Moved to Proposal out: proposal ${label} sent`,
        actorUserId: member.userId,
        data: { proposalId: id },
      });
      return { number, version };
    }));
  } catch (err) {
    if (isDuplicateKey(err)) throw new HttpError(409, "proposal_conflict", "Another proposal for this company was numbered at the same moment. Send again.");
    throw err;
  }
  const label = proposalLabel(numbering.number, numbering.version);
  const mail = await mailProposalLink({ companyId: member.companyId, proposalId: id, dealId, token, snapshot, label, expiresAt, timeZone: scope.settings.timeZone, to: toEmail, message, idempotencyKey: `proposal-sent-${id}`, resent: false, locale: scope.household.language });
  return { id, label, ...numbering, expiresAt, ...mail };
}

export async function mailProposalLink(m: {
  companyId: string;
  proposalId: string;
  dealId: string;
  token: string;
  snapshot: ProposalSnapshot;
  label: string;
  expiresAt: Date;
  /** The company's zone: the link's last day is its day. */
  timeZone: string;
  to: string;
  message: string;
  idempotencyKey: string;
  resent: boolean;
  /** The homeowner's language for this proposal. */
  locale: Locale;
}): Promise<{ mailSent: boolean; mailError: string | null }> {
  try {
    await sendEmail({
      companyId: m.companyId,
      to: m.to,
      subject: translator(m.locale, "email.proposalSent")(m.resent ? "subjectResent" : "subject", { company: m.snapshot.company.name, label: m.label }),
      replyTo: m.snapshot.rep.email,
      react: createElement(ProposalSentEmail, {
        companyName: m.snapshot.company.name,
        repName: m.snapshot.rep.name,
        householdName: m.snapshot.household.name,
        label: m.label,
        offerCount: m.snapshot.offers.length,
        validUntil: formatDateTime(m.expiresAt, m.timeZone, "minutes", m.locale),
        proposalUrl: proposalUrl(m.token),
        message: m.message,
        resent: m.resent,
        locale: m.locale,
      }),
      idempotencyKey: m.idempotencyKey,
    });
    return { mailSent: true, mailError: null };
  } catch (err) {
    console.error("proposal saved; its e-mail could not be sent", m.proposalId, err);
    const reason = err instanceof Error ? err.message : "unknown error";
    await transaction((tx) => insertProposalEvent(tx, { companyId: m.companyId, proposalId: m.proposalId, kind: "send_failed", body: reason.slice(0, 500) }))
      .catch(() => undefined);
    return { mailSent: false, mailError: `The e-mail could not be sent (${reason}). Use "Re-send link" to try again.` };
  }
}
