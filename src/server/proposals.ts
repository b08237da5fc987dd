import "server-only";
// Proposals: freezing a deal's offers into a numbered, versioned snapshot with its PDF, sending
// the link, revoking and re-sending it, what the customer's page records (opened, viewed,
// questions) and the right to cancel. Signing itself lives in src/server/signing.ts.
import { createHash } from "node:crypto";
import { createElement } from "react";
import { and, asc, desc, eq, inArray, max } from "drizzle-orm";
import type { NextRequest } from "next/server";
import { z } from "zod";
import { company, deal, proposal, proposalEvent, user, type Stage } from "@/db/schema";
import { renderProposalPdf } from "@/documents/proposal-pdf";
import { env } from "@/env";
import { formatDate, formatDateTime } from "@/lib/format";
import { can } from "@/lib/permissions";
import {
  buildProposalSnapshot,
  canStillCancel,
  cancelWindowClosesAt,
  FIRST_PROPOSAL_NUMBER,
  formatIsoDateLong,
  proposalDisplayStatus,
  proposalLabel,
  proposalLinkState,
  type ProposalLinkState,
  type SnapshotSource,
} from "@/lib/proposal-snapshot";
import type { ProposalSnapshot } from "@/lib/schemas/proposal";
import { proposalQuestionSchema, sendProposalSchema } from "@/lib/schemas/proposal";
import ProposalCancelledEmail from "@emails/proposal-cancelled";
import ProposalSentEmail from "@emails/proposal-sent";
import QuestionAskedEmail from "@emails/question-asked";
import { getInverterOrThrow, getModuleOrThrow } from "@/server/catalog";
import { getCompanySettings } from "@/server/company-settings";
import { db, type Tx } from "@/server/db";
import { getDealOrThrow, getDealRoom } from "@/server/deals";
import { getDesignForDeal, jsonValue } from "@/server/designs";
import { getDealUsage } from "@/server/energy";
import { forbidden, HttpError, notFound } from "@/server/errors";
import { clientMeta, type ClientMeta } from "@/server/client-address";
import { takeTurn } from "@/server/limits";
import { sendEmail } from "@/server/mail";
import { queueMail, sendQueuedNow } from "@/server/outbound-mail";
import { listOffers } from "@/server/offers";
import { getPriceBook } from "@/server/price-book";
import { toErrorResponse, validationError } from "@/server/route";
import type { Member } from "@/server/session";
import { autoMoveStage } from "@/server/stages";
import { storage, withFilesUndoneOnFailure } from "@/server/storage";
import { refundOnCancellation } from "@/server/payments";
import { recordEvent } from "@/server/timeline";
import { guardPublicMutation } from "@/server/request-guard";
import { hashToken, newLinkToken } from "@/server/tokens";

// ── Rows ────────────────────────────────────────────────────────────────────────────────────

type StoredProposal = typeof proposal.$inferSelect;

/** A proposal as the server modules use it (never with the token or code hashes). */
export type ProposalRow = Omit<StoredProposal, "snapshot" | "tokenHash" | "codeHash"> & { snapshot: ProposalSnapshot };

function toRow(row: StoredProposal): ProposalRow {
  const { tokenHash: _t, codeHash: _c, snapshot, ...rest } = row;
  return { ...rest, snapshot: jsonValue(snapshot) as ProposalSnapshot };
}

export const labelOf = (p: { number: number; version: number }) => proposalLabel(p.number, p.version);

/** A link token as newLinkToken makes it: 32 random bytes in base64url (43 characters). */
export const tokenSchema = z.string().regex(/^[A-Za-z0-9_-]{43}$/);

/**
 * The proposal a customer's link points at, or null (malformed or unknown token). Only the
 * token's SHA-256 is stored, so the lookup hashes it first.
 */
export async function findProposalByToken(token: string): Promise<ProposalRow | null> {
  if (!tokenSchema.safeParse(token).success) return null;
  const [row] = await db().select().from(proposal).where(eq(proposal.tokenHash, hashToken(token))).limit(1);
  return row ? toRow(row) : null;
}

/** A proposal by id for staff: company-scoped in the query, reps only on deals they own. */
export async function getProposalOrThrow(member: Member, proposalId: string): Promise<ProposalRow> {
  const [row] = await db()
    .select()
    .from(proposal)
    .where(and(eq(proposal.id, proposalId), eq(proposal.companyId, member.companyId)))
    .limit(1);
  if (!row) throw notFound("Proposal");
  await getDealOrThrow(member, row.dealId).catch((err: unknown) => {
    throw err instanceof HttpError && err.status === 404 ? notFound("Proposal") : err;
  });
  return toRow(row);
}

export async function getProposalEventOrThrow(member: Member, eventId: string) {
  const [row] = await db()
    .select()
    .from(proposalEvent)
    .where(and(eq(proposalEvent.id, eventId), eq(proposalEvent.companyId, member.companyId)))
    .limit(1);
  if (!row) throw notFound("Proposal event");
  await getProposalOrThrow(member, row.proposalId).catch((err: unknown) => {
    throw err instanceof HttpError && err.status === 404 ? notFound("Proposal event") : err;
  });
  return row;
}

/** What the staff API answers for one proposal: no hashes, the label and the link state. */
export function publicView(p: ProposalRow) {
  return { ...p, label: labelOf(p), state: proposalLinkState(p), displayStatus: proposalDisplayStatus(p) };
}

// ── Events ──────────────────────────────────────────────────────────────────────────────────

// The caller's address comes from the connection (client-address.ts), never from their headers.
export { clientMeta, type ClientMeta } from "@/server/client-address";

export type ProposalEventKind =
  | "sent"
  | "resent"
  | "send_failed"
  | "opened"
  | "viewed"
  | "code_sent"
  | "code_wrong"
  | "code_verified"
  | "consented"
  | "signed"
  | "question"
  | "revoked"
  | "cancelled";

export async function insertProposalEvent(
  tx: Tx,
  e: { companyId: string; proposalId: string; kind: ProposalEventKind; body?: string | null; client?: ClientMeta | null; actorUserId?: string | null; at?: Date },
): Promise<string> {
  const id = crypto.randomUUID();
  await tx.insert(proposalEvent).values({
    id,
    companyId: e.companyId,
    proposalId: e.proposalId,
    kind: e.kind,
    body: e.body ?? null,
    ip: e.client?.ip ?? null,
    userAgent: e.client?.userAgent ?? null,
    actorUserId: e.actorUserId ?? null,
    createdAt: e.at ?? new Date(),
  });
  return id;
}

export type ProposalEventView = { id: string; kind: string; body: string | null; ip: string | null; userAgent: string | null; actorName: string | null; createdAt: Date };

async function eventsOf(companyId: string, proposalIds: string[]): Promise<(ProposalEventView & { proposalId: string })[]> {
  if (proposalIds.length === 0) return [];
  return db()
    .select({
      id: proposalEvent.id,
      proposalId: proposalEvent.proposalId,
      kind: proposalEvent.kind,
      body: proposalEvent.body,
      ip: proposalEvent.ip,
      userAgent: proposalEvent.userAgent,
      actorName: user.name,
      createdAt: proposalEvent.createdAt,
    })
    .from(proposalEvent)
    .leftJoin(user, eq(user.id, proposalEvent.actorUserId))
    .where(and(eq(proposalEvent.companyId, companyId), inArray(proposalEvent.proposalId, proposalIds)))
    .orderBy(asc(proposalEvent.createdAt));
}

// ── The Proposal tab's list ─────────────────────────────────────────────────────────────────

export type ProposalListItem = {
  id: string;
  label: string;
  number: number;
  version: number;
  status: ReturnType<typeof proposalDisplayStatus>;
  state: ProposalLinkState;
  sentAt: Date;
  sentToEmail: string;
  sentByName: string | null;
  expiresAt: Date;
  inHomeSale: boolean;
  offers: { position: number; name: string; contractCents: number }[];
  chosenPosition: number | null;
  signedAt: Date | null;
  signerName: string | null;
  signedSha256: string | null;
  cancelDeadline: string | null;
  cancelledAt: Date | null;
  revokedAt: Date | null;
  replacedByLabel: string | null;
  events: ProposalEventView[];
};

/** Every version of the deal's proposal, newest first, with its events. */
export async function listProposalsForDeal(member: Member, dealId: string): Promise<ProposalListItem[]> {
  await getDealOrThrow(member, dealId);
  const rows = await db()
    .select({ p: proposal, sentByName: user.name })
    .from(proposal)
    .leftJoin(user, eq(user.id, proposal.sentByUserId))
    .where(and(eq(proposal.companyId, member.companyId), eq(proposal.dealId, dealId)))
    .orderBy(desc(proposal.number), desc(proposal.version));
  const events = await eventsOf(
    member.companyId,
    rows.map((r) => r.p.id),
  );
  const labels = new Map(rows.map((r) => [r.p.id, labelOf(r.p)]));
  return rows.map(({ p: stored, sentByName }) => {
    const p = toRow(stored);
    return {
      id: p.id,
      label: labelOf(p),
      number: p.number,
      version: p.version,
      status: proposalDisplayStatus(p),
      state: proposalLinkState(p),
      sentAt: p.createdAt,
      sentToEmail: p.sentToEmail,
      sentByName,
      expiresAt: p.expiresAt,
      inHomeSale: p.inHomeSale,
      offers: p.snapshot.offers.map((o) => ({ position: o.position, name: o.name, contractCents: o.figures.summary.contractCents })),
      chosenPosition: p.chosenPosition,
      signedAt: p.signedAt,
      signerName: p.signerName,
      signedSha256: p.signedSha256,
      cancelDeadline: p.cancelDeadline,
      cancelledAt: p.cancelledAt,
      revokedAt: p.revokedAt,
      replacedByLabel: p.replacedByProposalId ? (labels.get(p.replacedByProposalId) ?? null) : null,
      events: events.filter((e) => e.proposalId === p.id).map(({ proposalId: _p, ...e }) => e),
    };
  });
}

// ── Freezing the offers ─────────────────────────────────────────────────────────────────────

const fieldError = (field: string, message: string) => new HttpError(422, "validation_failed", `${field}: ${message}`, { [field]: [message] });

/** Everything the snapshot copies, read from the deal's stored offers, design, usage, catalog and price book. */
export async function snapshotSourceFor(member: Member, dealId: string, offerIds: string[] | undefined, takenAt: Date): Promise<SnapshotSource> {
  const room = await getDealRoom(member, dealId);
  const all = await listOffers(member, dealId);
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
  const saved = await getDesignForDeal(member, dealId);
  if (!saved) throw new HttpError(422, "no_design", "Save a design on the Design tab before sending a proposal.");
  const doc = saved.document;

  const [usage, book, [co], [owner]] = await Promise.all([
    getDealUsage(member, dealId),
    getPriceBook(member.companyId),
    db().select({ name: company.name, licenseNumber: company.licenseNumber }).from(company).where(eq(company.id, member.companyId)).limit(1),
    db()
      .select({ name: user.name, email: user.email })
      .from(deal)
      .innerJoin(user, eq(user.id, deal.ownerUserId))
      .where(and(eq(deal.id, dealId), eq(deal.companyId, member.companyId)))
      .limit(1),
  ]);
  if (!co) throw notFound("Company");

  const offers: SnapshotSource["offers"] = [];
  for (const o of chosen) {
    const mod = await getModuleOrThrow(member.companyId, o.inputs.moduleId ?? doc.moduleId);
    const inv = await getInverterOrThrow(member.companyId, o.inputs.inverterId ?? doc.inverterId);
    // The figures were computed when the offer was saved; a design changed since would not match them.
    const modules = doc.faces.reduce((s, f) => s + (o.inputs.faceCounts?.find((c) => c.faceId === f.id)?.moduleCount ?? f.moduleCount), 0);
    if (modules !== o.results.summary.moduleCount || Math.abs(o.results.summary.kwDc - (modules * mod.stcWatts) / 1000) > 0.001) {
      throw fieldError("offerIds", `The design changed after "${o.name}" was computed; open the Offers tab and save that offer again`);
    }
    offers.push({
      position: o.position,
      name: o.name,
      inputs: o.inputs,
      figures: o.results,
      module: { manufacturer: mod.manufacturer, model: mod.model, stcWatts: mod.stcWatts },
      inverter: { manufacturer: inv.manufacturer, model: inv.model, kind: inv.kind, acWatts: inv.acWatts },
    });
  }
  const h = room.household;
  return {
    takenAt,
    company: { name: co.name, licenseNumber: co.licenseNumber },
    rep: owner ?? { name: member.name, email: member.email },
    household: {
      name: h.name,
      contactName: h.contactName,
      email: h.email,
      phone: h.phone,
      street: h.street,
      city: h.city,
      region: h.region,
      postalCode: h.postalCode,
      latitude: h.latitude,
      longitude: h.longitude,
    },
    utilityName: room.deal.utilityName ?? null,
    usage: { monthlyKwh: usage.monthlyKwh, source: usage.source, estimatedMonths: usage.estimatedMonths.filter(Boolean).length, fillMethod: usage.fillMethod },
    design: { lossesPct: doc.lossesPct, faces: doc.faces },
    offers,
    book,
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
  await getDealOrThrow(member, dealId); // reps: only their own deals

  const sentAt = new Date();
  const snapshot = buildProposalSnapshot(await snapshotSourceFor(member, dealId, offerIds, sentAt));
  const expiresAt = new Date(sentAt.getTime() + validDays * 86_400_000);
  const { token, hash } = newLinkToken();
  const id = crypto.randomUUID();
  const key = `${member.companyId}/proposals/${crypto.randomUUID()}.pdf`;
  let numbering: { number: number; version: number };
  try {
    numbering = await withFilesUndoneOnFailure((put) => db().transaction(async (tx) => {
      await tx.select({ id: company.id }).from(company).where(eq(company.id, member.companyId)).for("update");
      const earlier = await tx
        .select({ id: proposal.id, number: proposal.number, version: proposal.version, status: proposal.status })
        .from(proposal)
        .where(and(eq(proposal.companyId, member.companyId), eq(proposal.dealId, dealId)));
      const signed = earlier.find((p) => p.status === "signed");
      if (signed) throw new HttpError(409, "already_signed", `${labelOf(signed)} of this deal is signed; a signed agreement is not replaced by a new version.`);
      let number: number;
      let version: number;
      if (earlier.length > 0) {
        number = earlier[0].number;
        version = Math.max(...earlier.map((p) => p.version)) + 1;
      } else {
        const [top] = await tx.select({ n: max(proposal.number) }).from(proposal).where(eq(proposal.companyId, member.companyId));
        number = Math.max(FIRST_PROPOSAL_NUMBER, (top?.n ?? FIRST_PROPOSAL_NUMBER - 1) + 1);
        version = 1;
      }
      const pdf = await renderProposalPdf(snapshot, { number, version, sentAt, expiresAt, inHomeSale, cancelDeadlineText: null /* known once signed: the signed copy and the page show the date */ });
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
        createdAt: sentAt,
      });
      const live = earlier.filter((p) => p.status === "sent");
      if (live.length > 0) {
        await tx
          .update(proposal)
          .set({ status: "replaced", replacedByProposalId: id })
          .where(
            and(
              eq(proposal.companyId, member.companyId),
              inArray(
                proposal.id,
                live.map((p) => p.id),
              ),
              eq(proposal.status, "sent"),
            ),
          );
      }
      const label = proposalLabel(number, version);
      await insertProposalEvent(tx, { companyId: member.companyId, proposalId: id, kind: "sent", body: `to ${toEmail}`, actorUserId: member.userId, at: sentAt });
      const offerNames = snapshot.offers.map((o) => `"${o.name}"`).join(", ");
      await recordEvent(tx, {
        companyId: member.companyId,
        dealId,
        kind: "proposal.sent",
        summary: `${member.name} sent proposal ${label} to ${toEmail} (${offerNames}), link valid until ${formatDate(expiresAt)}${live.length ? `; replaces ${live.map(labelOf).join(", ")}` : ""}`,
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
  const mail = await mailProposalLink({ companyId: member.companyId, proposalId: id, dealId, token, snapshot, label, expiresAt, to: toEmail, message, idempotencyKey: `proposal-sent-${id}`, resent: false });
  return { id, label, ...numbering, expiresAt, ...mail };
}

async function mailProposalLink(m: {
  companyId: string;
  proposalId: string;
  dealId: string;
  token: string;
  snapshot: ProposalSnapshot;
  label: string;
  expiresAt: Date;
  to: string;
  message: string;
  idempotencyKey: string;
  resent: boolean;
}): Promise<{ mailSent: boolean; mailError: string | null }> {
  try {
    await sendEmail({
      companyId: m.companyId,
      to: m.to,
      subject: `${m.resent ? "New link: " : ""}Your solar proposal from ${m.snapshot.company.name} (${m.label})`,
      replyTo: m.snapshot.rep.email,
      react: createElement(ProposalSentEmail, {
        companyName: m.snapshot.company.name,
        repName: m.snapshot.rep.name,
        householdName: m.snapshot.household.name,
        label: m.label,
        offerCount: m.snapshot.offers.length,
        validUntil: formatDate(m.expiresAt),
        proposalUrl: proposalUrl(m.token),
        message: m.message,
        resent: m.resent,
      }),
      idempotencyKey: m.idempotencyKey,
    });
    return { mailSent: true, mailError: null };
  } catch (err) {
    console.error("proposal saved; its e-mail could not be sent", m.proposalId, err);
    const reason = err instanceof Error ? err.message : "unknown error";
    await db()
      .transaction((tx) => insertProposalEvent(tx, { companyId: m.companyId, proposalId: m.proposalId, kind: "send_failed", body: reason.slice(0, 500) }))
      .catch(() => undefined);
    return { mailSent: false, mailError: `The e-mail could not be sent (${reason}). Use "Re-send link" to try again.` };
  }
}

// ── Revoke and re-send ──────────────────────────────────────────────────────────────────────

const STATE_REFUSALS: Record<Exclude<ProposalLinkState, "live">, string> = {
  expired: "This version's link has expired.",
  revoked: "This version's link was revoked.",
  replaced: "A newer version replaced this one.",
  signed: "This version is signed.",
  cancelled: "The buyer cancelled this agreement.",
};

/** Stops the link working (reps on their own deals, the office on all). Only a live, unsigned version can be revoked. */
export async function revokeProposal(member: Member, proposalId: string): Promise<ProposalRow> {
  if (!can(member.role, "proposals:send")) throw forbidden("revoking proposals");
  const p = await getProposalOrThrow(member, proposalId);
  const now = new Date();
  await db().transaction(async (tx) => {
    const [row] = await tx
      .select({ status: proposal.status })
      .from(proposal)
      .where(and(eq(proposal.id, p.id), eq(proposal.companyId, member.companyId)))
      .for("update");
    if (!row || row.status !== "sent") {
      const state = proposalLinkState({ status: row?.status ?? "revoked", expiresAt: p.expiresAt });
      throw new HttpError(409, "not_revocable", `${labelOf(p)} cannot be revoked. ${state === "live" ? "" : STATE_REFUSALS[state]}`.trim());
    }
    await tx.update(proposal).set({ status: "revoked", revokedAt: now }).where(and(eq(proposal.id, p.id), eq(proposal.companyId, member.companyId)));
    await insertProposalEvent(tx, { companyId: member.companyId, proposalId: p.id, kind: "revoked", actorUserId: member.userId, at: now });
    await recordEvent(tx, {
      companyId: member.companyId,
      dealId: p.dealId,
      kind: "proposal.revoked",
      summary: `${member.name} revoked the link of proposal ${labelOf(p)}`,
      actorUserId: member.userId,
      data: { proposalId: p.id },
    });
  });
  return getProposalOrThrow(member, p.id);
}

/**
 * A new link for the same version (the customer lost the e-mail, or it went to a wrong
 * address): a new token replaces the old one, which stops working at once. Live, signed and
 * cancelled versions can be re-sent (a signed customer keeps access to their copy); an expired,
 * revoked or replaced one cannot — send a new version instead.
 */
export async function resendProposal(member: Member, proposalId: string): Promise<SentProposal> {
  if (!can(member.role, "proposals:send")) throw forbidden("re-sending proposals");
  const p = await getProposalOrThrow(member, proposalId);
  const state = proposalLinkState(p);
  if (state === "expired" || state === "revoked" || state === "replaced") {
    throw new HttpError(409, "not_resendable", `${STATE_REFUSALS[state]} Send a new version from the Proposal tab instead.`);
  }
  const { token, hash } = newLinkToken();
  const eventId = await db().transaction(async (tx) => {
    await tx.update(proposal).set({ tokenHash: hash, codeHash: null, codeExpiresAt: null, codeAttempts: 0, codeVerifiedAt: null }).where(and(eq(proposal.id, p.id), eq(proposal.companyId, member.companyId)));
    const eid = await insertProposalEvent(tx, { companyId: member.companyId, proposalId: p.id, kind: "resent", body: `to ${p.sentToEmail}`, actorUserId: member.userId });
    await recordEvent(tx, {
      companyId: member.companyId,
      dealId: p.dealId,
      kind: "proposal.resent",
      summary: `${member.name} sent a new link for proposal ${labelOf(p)} to ${p.sentToEmail}; the earlier link no longer opens`,
      actorUserId: member.userId,
      data: { proposalId: p.id },
    });
    return eid;
  });
  const mail = await mailProposalLink({
    companyId: member.companyId,
    proposalId: p.id,
    dealId: p.dealId,
    token,
    snapshot: p.snapshot,
    label: labelOf(p),
    expiresAt: p.expiresAt,
    to: p.sentToEmail,
    message: "",
    idempotencyKey: `proposal-resent-${eventId}`,
    resent: true,
  });
  return { id: p.id, label: labelOf(p), number: p.number, version: p.version, expiresAt: p.expiresAt, ...mail };
}

// ── Files ───────────────────────────────────────────────────────────────────────────────────

export const pdfFileName = (p: { number: number; version: number }, signed: boolean) => `proposal-P-${p.number}-v${p.version}${signed ? "-signed" : ""}.pdf`;

/** The stored bytes of a proposal's unsigned or signed PDF (404 when there is none). */
export async function readProposalPdf(p: Pick<ProposalRow, "pdfStorageKey" | "signedStorageKey">, which: "unsigned" | "signed"): Promise<Uint8Array> {
  const key = which === "signed" ? p.signedStorageKey : p.pdfStorageKey;
  if (!key) throw notFound(which === "signed" ? "Signed document" : "Document");
  const bytes = await storage().get(key);
  if (!bytes) throw notFound(which === "signed" ? "Signed document" : "Document");
  return bytes;
}

export function pdfResponse(bytes: Uint8Array, fileName: string): Response {
  return new Response(Buffer.from(bytes), {
    status: 200,
    headers: {
      "Content-Type": "application/pdf",
      "Content-Disposition": `attachment; filename="${fileName}"`,
      "Content-Length": String(bytes.byteLength),
      "Cache-Control": "private, no-store",
      "X-Content-Type-Options": "nosniff",
    },
  });
}

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
  await db().transaction(async (tx) => {
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
  if (!parsed.success) throw validationError(parsed.error);
  // Counted before the question is stored and mailed (limits.ts), per link and per address.
  const tooMany = (wait: string) => `That is many questions in one hour; your installer has them. Try again in ${wait}, or call them.`;
  await takeTurn("questionLink", p.id, tooMany);
  await takeTurn("questionAddress", client.ip, tooMany);
  const question = parsed.data.question;
  const { id, mailId } = await db().transaction(async (tx) => {
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

// ── Right to cancel ─────────────────────────────────────────────────────────────────────────

/** Stages a cancellation inside the window moves a deal from (it cannot have gone further in 3 business days). */
const CANCELLABLE_STAGES: readonly Stage[] = ["signed", "deposit_paid", "survey", "permitting", "install_booked"];

export type CancelOutcome = { proposalId: string; companyId: string; dealId: string; cancelledAt: Date };

/**
 * The buyer cancels a signed in-home sale inside the 3-business-day window (16 CFR 429.1):
 * the proposal becomes cancelled and the deal moves to Cancelled, in one transaction. After
 * the window: 409 naming the deadline.
 */
export async function cancelSignedProposal(p: ProposalRow, client: ClientMeta, now = new Date()): Promise<CancelOutcome> {
  const { timeZone } = await getCompanySettings(p.companyId);
  const outcome = await db().transaction(async (tx) => {
    const [row] = await tx
      .select({ status: proposal.status, inHomeSale: proposal.inHomeSale, cancelDeadline: proposal.cancelDeadline })
      .from(proposal)
      .where(and(eq(proposal.id, p.id), eq(proposal.companyId, p.companyId)))
      .for("update");
    if (!row) throw notFound("Proposal");
    if (row.status === "cancelled") throw new HttpError(409, "already_cancelled", "This agreement is already cancelled.");
    if (row.status !== "signed") throw new HttpError(409, "not_signed", "Only a signed agreement can be cancelled.");
    if (!row.inHomeSale || !row.cancelDeadline) throw new HttpError(409, "no_right_to_cancel", "This agreement was not made in your home, so the 3-day right to cancel does not apply. Contact your installer.");
    if (!canStillCancel(row, timeZone, now)) {
      throw new HttpError(409, "cancel_window_closed", `The time to cancel ended with ${formatIsoDateLong(row.cancelDeadline)}. Contact your installer.`);
    }
    await tx.update(proposal).set({ status: "cancelled", cancelledAt: now }).where(and(eq(proposal.id, p.id), eq(proposal.companyId, p.companyId)));
    await insertProposalEvent(tx, { companyId: p.companyId, proposalId: p.id, kind: "cancelled", body: "The buyer cancelled inside the right-to-cancel window.", client, at: now });
    await recordEvent(tx, {
      companyId: p.companyId,
      dealId: p.dealId,
      kind: "proposal.cancelled",
      summary: `The buyer cancelled the signed agreement ${labelOf(p)} (right to cancel until ${formatIsoDateLong(row.cancelDeadline)})`,
      actorUserId: null,
      data: { proposalId: p.id, ip: client.ip },
    });
    await autoMoveStage(tx, {
      companyId: p.companyId,
      dealId: p.dealId,
      from: CANCELLABLE_STAGES,
      to: "cancelled",
      summary: `Moved to Cancelled: the buyer cancelled ${labelOf(p)} inside the 3-business-day window`,
      data: { proposalId: p.id },
    });
    const mailId = await queueMail(tx, {
      companyId: p.companyId,
      kind: "proposal-cancelled",
      to: p.snapshot.rep.email,
      subject: `Cancelled: the ${p.snapshot.household.name} (${labelOf(p)})`,
      react: createElement(ProposalCancelledEmail, {
        householdName: p.snapshot.household.name,
        label: labelOf(p),
        cancelledAt: formatDateTime(now),
        dealUrl: dealProposalUrl(p.dealId),
      }),
      idempotencyKey: `proposal-cancelled-${p.id}`,
    });
    return { proposalId: p.id, companyId: p.companyId, dealId: p.dealId, cancelledAt: now, mailId };
  });
  // After the commit: refund any paid deposit through the provider. The cancellation stands even
  // if the provider cannot be reached now; the office sees the refund due on Today and retries.
  try {
    await refundOnCancellation(outcome.companyId, outcome.dealId, `Buyer cancelled ${labelOf(p)} inside the right-to-cancel window`);
  } catch (err) {
    console.error(`[proposals] refund after the cancellation of ${labelOf(p)} failed:`, err);
  }
  await sendQueuedNow([outcome.mailId]);
  const { mailId: _sent, ...cancelled } = outcome;
  return cancelled;
}

/** When the buyer's window closes, for the page (null when the sale carries no right to cancel). */
export async function cancelWindowOf(p: ProposalRow, now = new Date()): Promise<{ deadline: string; closesAt: Date; timeZone: string; open: boolean } | null> {
  if (!p.inHomeSale || !p.cancelDeadline) return null;
  const { timeZone } = await getCompanySettings(p.companyId);
  const closesAt = cancelWindowClosesAt(p.cancelDeadline, timeZone);
  return { deadline: p.cancelDeadline, closesAt, timeZone, open: canStillCancel(p, timeZone, now) };
}

// ── Public route handlers ───────────────────────────────────────────────────────────────────

type TokenHandler = (args: { req: NextRequest; token: string; proposal: ProposalRow; client: ClientMeta }) => Promise<Response>;

/**
 * The wrapper for the customer's route handlers (/api/public/proposals/[token]/…): a malformed
 * or unknown token is simply not found, and nothing about other records is revealed. Its
 * mutations come only from our own pages (request-guard.ts: 403/415).
 */
export function withProposalToken(handler: TokenHandler) {
  return async (req: NextRequest, ctx: { params: Promise<{ token: string }> }): Promise<Response> => {
    try {
      guardPublicMutation(req);
      const { token } = await ctx.params;
      const found = await findProposalByToken(token);
      if (!found) throw notFound("Proposal");
      return await handler({ req, token, proposal: found, client: clientMeta(req.headers) });
    } catch (err) {
      return toErrorResponse(err);
    }
  };
}
