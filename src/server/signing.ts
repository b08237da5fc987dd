import "server-only";
// Signing a proposal: the customer confirms their e-mail with a one-time code (6 digits,
// 10 minutes, 5 tries, then only a new code helps), consents to electronic records, types their
// name and draws a signature; the server stamps it into the PDF with a certificate page, stores
// the signed file under a new key and records its SHA-256. Also the public verify check.
//
// ESIGN Act (15 U.S.C. 7001) and UETA: consent (the disclosure shown and agreed), intent (the
// sign action), association (signature, name and certificate in the document itself) and
// retention (the immutable stored file, downloadable from the customer's page).
import { createHash, createHmac, randomBytes, randomInt, timingSafeEqual } from "node:crypto";
import { createElement } from "react";
import { and, asc, eq } from "drizzle-orm";
import { fileTypeFromBuffer } from "file-type";
import { deal, proposal, proposalEvent } from "@/db/schema";
import { SignatureImageError, stampSignedPdf } from "@/documents/signed-pdf";
import { env } from "@/env";
import { cancelDeadline } from "@/lib/business-days";
import { formatCalendarDate, formatCents, formatDate, formatDateTime, zoneName } from "@/lib/format";
import { type Locale } from "@/lib/i18n/locales";
import { translator } from "@/lib/i18n/translator";
import { formatIsoDateLong, proposalLinkState, type ProposalLinkState } from "@/lib/proposal-snapshot";
import { dateInZone } from "@/lib/zoned-time";
import { MAX_VERIFY_FILE_BYTES, signProposalSchema, verifyCodeSchema, type ProposalSnapshotOffer } from "@/lib/schemas/proposal";
import type { Stage } from "@/db/schema";
import SignedCopyEmail from "@emails/signed-copy";
import SignedNoticeEmail from "@emails/signed-notice";
import SigningCodeEmail from "@emails/signing-code";
import { getCompanySettings } from "@/server/company-settings";
import type { ClientMeta } from "@/server/client-address";
import { db, transaction, type Tx } from "@/server/db";
import { HttpError } from "@/server/errors";
import { takeTurn } from "@/server/limits";
import { sendEmail } from "@/server/mail";
import { queueMail, sendQueuedNow } from "@/server/outbound-mail";
import { dealProposalUrl, insertProposalEvent, labelOf, proposalUrl, readProposalPdf, type ProposalRow } from "@/server/proposals";
import { homeownerInvalid, refusal, type RefusalKey } from "@/server/homeowner-refusals";
import { autoMoveStage } from "@/server/stages";
import { openImage } from "@/server/photos";
import { withFilesUndoneOnFailure } from "@/server/storage";
import { recordEvent } from "@/server/timeline";

export const CODE_DIGITS = 6;
export const CODE_TTL_MS = 10 * 60_000;
export const MAX_CODE_ATTEMPTS = 5;
/** A confirmed e-mail stays good for signing this long. */
export const SIGNING_WINDOW_MS = 30 * 60_000;
export const MAX_SIGNATURE_PNG_BYTES = 200 * 1024;
/** A drawn signature is a phone or desktop canvas at device pixel ratio: far under 4 megapixels (our choice). */
export const MAX_SIGNATURE_PIXELS = 4_000_000;
/** The browser keeps its confirmation in this cookie (httpOnly), scoped to the public proposal API. */
export const SIGNING_COOKIE = "kw_signing";
export const SIGNING_COOKIE_PATH = "/api/public/proposals";

const sha256Hex = (bytes: Uint8Array) => createHash("sha256").update(bytes).digest("hex");

/**
 * Codes and signing confirmations are stored only as an HMAC keyed with the app's secret and
 * bound to the proposal, so a copy of the database alone cannot test the 10⁶ possible codes.
 */
function secretHash(proposalId: string, purpose: "code" | "session", value: string): string {
  return createHmac("sha256", env().BETTER_AUTH_SECRET).update(`${purpose}:${proposalId}:${value}`).digest("hex");
}

function sameHash(a: string, b: string): boolean {
  const x = Buffer.from(a, "hex");
  const y = Buffer.from(b, "hex");
  return x.length === y.length && timingSafeEqual(x, y);
}

const REFUSALS: Record<Exclude<ProposalLinkState, "live">, { status: number; code: string; key: RefusalKey }> = {
  expired: { status: 410, code: "expired", key: "expired" },
  revoked: { status: 410, code: "revoked", key: "revoked" },
  replaced: { status: 409, code: "replaced", key: "replaced" },
  signed: { status: 409, code: "already_signed", key: "signed" },
  cancelled: { status: 409, code: "cancelled", key: "cancelled" },
};

/** Refused unless the link is live, in the homeowner's language. */
function requireLive(p: { status: string; expiresAt: Date; locale: Locale }): void {
  const state = proposalLinkState(p);
  if (state !== "live") {
    const r = REFUSALS[state];
    throw refusal(p.locale, r.status, r.code, r.key);
  }
}

/** "t•••@example.com": enough for the customer to recognise the address, not to learn it. */
export function maskEmail(email: string): string {
  const [local, domain] = email.split("@");
  return `${local.slice(0, 1)}•••@${domain ?? ""}`;
}

// ── The one-time code ──────────────────────────────────────────────────────────────────────

/** Sends a new code to the address the proposal went to; a new code resets the tries and any earlier confirmation. */
export async function sendSigningCode(p: ProposalRow, token: string, client: ClientMeta): Promise<{ sentTo: string; expiresAt: Date }> {
  requireLive(p);
  const now = new Date();
  // Counted before the code is made (limits.ts): a double tap sends one code, and a link or an
  // address asks for a bounded number an hour, however many requests arrive at once.
  await takeTurn("signingCodeGap", p.id, (wait) => `A code was sent a moment ago. Check your e-mail, or ask again in ${wait}.`);
  await takeTurn("signingCodeLink", p.id, (wait) => `Too many codes asked for in the last hour. Try again in ${wait}.`);
  await takeTurn("signingCodeAddress", client.ip, (wait) => `Too many codes asked for from this address. Try again in ${wait}.`);
  const code = String(randomInt(0, 10 ** CODE_DIGITS)).padStart(CODE_DIGITS, "0");
  const expiresAt = new Date(now.getTime() + CODE_TTL_MS);
  const eventId = await transaction(async (tx) => {
    const changed = await tx
      .update(proposal)
      .set({ codeHash: secretHash(p.id, "code", code), codeExpiresAt: expiresAt, codeAttempts: 0, codeVerifiedAt: null })
      .where(and(eq(proposal.id, p.id), eq(proposal.companyId, p.companyId), eq(proposal.status, "sent")));
    if (changed[0].affectedRows !== 1) throw new HttpError(409, "not_live", "This proposal can no longer be signed. Reload the page.");
    return insertProposalEvent(tx, { companyId: p.companyId, proposalId: p.id, kind: "code_sent", body: `to ${p.sentToEmail}`, client, at: now });
  });
  try {
    await sendEmail({
      companyId: p.companyId,
      to: p.sentToEmail,
      subject: translator(p.locale, "email.signingCode")("subject", { code }),
      react: createElement(SigningCodeEmail, {
        companyName: p.snapshot.company.name,
        label: labelOf(p),
        code,
        minutes: CODE_TTL_MS / 60_000,
        tries: MAX_CODE_ATTEMPTS,
        proposalUrl: proposalUrl(token),
        locale: p.locale,
      }),
      idempotencyKey: `signing-code-${eventId}`,
    });
  } catch (err) {
    console.error("signing code stored; its e-mail could not be sent", p.id, err);
    throw new HttpError(502, "mail_failed", "The code could not be e-mailed just now. Try again in a minute.");
  }
  return { sentTo: maskEmail(p.sentToEmail), expiresAt };
}

type VerifyOutcome = { ok: true; session: string; validUntil: Date } | { ok: false; error: HttpError };

/**
 * Checks a code. Wrong tries are counted (and committed) before the answer; the fifth locks
 * the code. A right code becomes a signing confirmation for this browser: a random secret in
 * an httpOnly cookie, whose HMAC replaces the code's in code_hash, good for 30 minutes
 * (code_expires_at then holds the confirmation's expiry).
 */
export async function verifySigningCode(p: ProposalRow, input: unknown, client: ClientMeta): Promise<{ session: string; validUntil: Date }> {
  requireLive(p);
  const parsed = verifyCodeSchema.safeParse(input);
  if (!parsed.success) throw homeownerInvalid(p.locale, parsed.error, { code: "code" });
  const code = parsed.data.code;
  const now = new Date();
  const outcome: VerifyOutcome = await transaction(async (tx): Promise<VerifyOutcome> => {
    const [row] = await tx
      .select({ status: proposal.status, codeHash: proposal.codeHash, codeExpiresAt: proposal.codeExpiresAt, codeAttempts: proposal.codeAttempts, codeVerifiedAt: proposal.codeVerifiedAt })
      .from(proposal)
      .where(and(eq(proposal.id, p.id), eq(proposal.companyId, p.companyId)))
      .for("update");
    if (!row || row.status !== "sent") return { ok: false, error: new HttpError(409, "not_live", "This proposal can no longer be signed. Reload the page.") };
    if (!row.codeHash || row.codeVerifiedAt) return { ok: false, error: new HttpError(409, "no_code", "Ask for a code first: press “E-mail me a code”.") };
    if (row.codeAttempts >= MAX_CODE_ATTEMPTS) {
      return { ok: false, error: new HttpError(423, "code_locked", `This code is locked after ${MAX_CODE_ATTEMPTS} wrong tries. Ask for a new code.`, { code: ["Locked: ask for a new code"] }) };
    }
    if (!row.codeExpiresAt || row.codeExpiresAt.getTime() <= now.getTime()) {
      return { ok: false, error: new HttpError(410, "code_expired", "This code has expired (codes last 10 minutes). Ask for a new code.", { code: ["Expired: ask for a new code"] }) };
    }
    if (!sameHash(row.codeHash, secretHash(p.id, "code", code))) {
      const attempts = row.codeAttempts + 1;
      await tx.update(proposal).set({ codeAttempts: attempts }).where(and(eq(proposal.id, p.id), eq(proposal.companyId, p.companyId)));
      await insertProposalEvent(tx, { companyId: p.companyId, proposalId: p.id, kind: "code_wrong", body: `try ${attempts} of ${MAX_CODE_ATTEMPTS}`, client, at: now });
      const left = MAX_CODE_ATTEMPTS - attempts;
      const message = left > 0 ? `Wrong code: ${left} ${left === 1 ? "try" : "tries"} left.` : `Wrong code. After ${MAX_CODE_ATTEMPTS} wrong tries this code is locked: ask for a new code.`;
      return { ok: false, error: new HttpError(left > 0 ? 422 : 423, left > 0 ? "code_wrong" : "code_locked", message, { code: [message] }) };
    }
    const session = randomBytes(32).toString("base64url");
    const validUntil = new Date(now.getTime() + SIGNING_WINDOW_MS);
    await tx
      .update(proposal)
      .set({ codeHash: secretHash(p.id, "session", session), codeVerifiedAt: now, codeExpiresAt: validUntil })
      .where(and(eq(proposal.id, p.id), eq(proposal.companyId, p.companyId)));
    await insertProposalEvent(tx, { companyId: p.companyId, proposalId: p.id, kind: "code_verified", body: `e-mail ${p.sentToEmail} confirmed`, client, at: now });
    return { ok: true, session, validUntil };
  });
  if (!outcome.ok) throw outcome.error;
  return { session: outcome.session, validUntil: outcome.validUntil };
}

/** What a reload may skip (GET …/verify-code). Nothing secret: whether this browser's confirmation still holds, or a code waits to be typed. */
export type SigningCodeState = { verified: boolean; minutesLeft: number; codePending: boolean; sentTo: string | null };

/**
 * Where this browser stands with the code. The confirmation stays server-side (the HMAC of the
 * cookie's secret in code_hash, good until code_expires_at: 30 minutes from the right code);
 * the browser only holds the httpOnly cookie, which expires with it. Nothing new is stored.
 */
export async function signingCodeState(p: ProposalRow, session: string | null, now = new Date()): Promise<SigningCodeState> {
  const none: SigningCodeState = { verified: false, minutesLeft: 0, codePending: false, sentTo: null };
  if (proposalLinkState(p, now) !== "live") return none;
  const [row] = await db()
    .select({ codeHash: proposal.codeHash, codeExpiresAt: proposal.codeExpiresAt, codeAttempts: proposal.codeAttempts, codeVerifiedAt: proposal.codeVerifiedAt })
    .from(proposal)
    .where(and(eq(proposal.id, p.id), eq(proposal.companyId, p.companyId)));
  if (!row?.codeHash || !row.codeExpiresAt || row.codeExpiresAt.getTime() <= now.getTime()) return none;
  if (row.codeVerifiedAt) {
    if (!session || !sameHash(row.codeHash, secretHash(p.id, "session", session))) return none;
    return { ...none, verified: true, minutesLeft: Math.max(1, Math.floor((row.codeExpiresAt.getTime() - now.getTime()) / 60_000)) };
  }
  return row.codeAttempts < MAX_CODE_ATTEMPTS ? { ...none, codePending: true, sentTo: maskEmail(p.sentToEmail) } : none;
}

// ── Signing ────────────────────────────────────────────────────────────────────────────────

/** Stages signing moves a deal from (a deal already further along stays there). */
const BEFORE_SIGNED: readonly Stage[] = ["lead", "bills_in", "designing", "proposal_out"];

const EVENT_TEXT: Record<string, (e: { body: string | null; ip: string | null }) => string> = {
  sent: (e) => `Proposal sent ${e.body ?? ""}`.trim(),
  resent: (e) => `New link sent ${e.body ?? ""}`.trim(),
  opened: (e) => `Opened${e.ip ? ` from ${e.ip}` : ""}`,
  viewed: (e) => `Viewed${e.ip ? ` from ${e.ip}` : ""}`,
  code_sent: (e) => `One-time code sent ${e.body ?? ""}`.trim(),
  code_wrong: (e) => `Wrong code entered (${e.body ?? ""})`,
  code_verified: (e) => `E-mail confirmed with the one-time code${e.ip ? ` from ${e.ip}` : ""}`,
  consented: (e) => `Consent to electronic records and signatures given${e.ip ? ` from ${e.ip}` : ""}`,
  signed: (e) => `Signed${e.ip ? ` from ${e.ip}` : ""}`,
};

/** Decodes and checks the drawn signature: a real PNG (by its bytes), within the size limit; refusals in the homeowner's language. */
export async function signaturePngBytes(dataUrl: string, locale: Locale = "en"): Promise<Uint8Array> {
  const refuse = (key: RefusalKey, code = "validation_failed") => refusal(locale, 422, code, key, "signaturePng");
  const base64 = dataUrl.slice("data:image/png;base64,".length);
  if (!/^[A-Za-z0-9+/]+={0,2}$/.test(base64)) throw refuse("signatureAgain");
  const bytes = new Uint8Array(Buffer.from(base64, "base64"));
  if (bytes.byteLength > MAX_SIGNATURE_PNG_BYTES) throw refuse("signatureTooLarge");
  const type = await fileTypeFromBuffer(bytes);
  if (type?.mime !== "image/png") throw refuse("signatureUnreadable");
  // Decoded within a pixel limit and re-encoded: the PDF gets pixels we wrote, never the sender's bytes.
  const image = await openImage(bytes, { field: "signaturePng", what: "signature drawing", maxPixels: MAX_SIGNATURE_PIXELS }).catch((err: unknown) => {
    if (err instanceof HttpError) throw err.code === "image_too_large" ? refuse("signatureTooLarge", "image_too_large") : refuse("signatureUnreadable");
    throw err;
  });
  try {
    return new Uint8Array(await image.png().toBuffer());
  } catch {
    throw refuse("signatureUnreadable");
  }
}

export type SignedOutcome = { signedAt: Date; signedSha256: string; cancelDeadline: string | null; chosenPosition: number };

/** The proposal's row, locked, once the link is live and this session confirmed its code. */
async function lockConfirmedProposal(tx: Tx, p: ProposalRow, session: string | null, now: Date) {
  const [row] = await tx.select().from(proposal).where(and(eq(proposal.id, p.id), eq(proposal.companyId, p.companyId))).for("update");
  if (!row) throw new HttpError(404, "not_found", "Proposal not found.");
  if (row.status === "signed") throw refusal(p.locale, 409, "already_signed", "alreadySigned");
  requireLive({ ...row, locale: p.locale });
  const confirmed =
    !!session &&
    !!row.codeHash &&
    !!row.codeVerifiedAt &&
    !!row.codeExpiresAt &&
    row.codeExpiresAt.getTime() > now.getTime() &&
    sameHash(row.codeHash, secretHash(p.id, "session", session));
  if (!confirmed) throw refusal(p.locale, 403, "code_required", "codeRequired");
  return row;
}

/** Records the consent, then the certificate's lines: every event so far and the signature itself. */
async function consentAndCertificateEvents(tx: Tx, p: ProposalRow, client: ClientMeta, now: Date, method: "drawn" | "typed") {
  await insertProposalEvent(tx, { companyId: p.companyId, proposalId: p.id, kind: "consented", body: "Agreed to the electronic records disclosure", client, at: now });
  const events = await tx
    .select({ kind: proposalEvent.kind, body: proposalEvent.body, ip: proposalEvent.ip, createdAt: proposalEvent.createdAt })
    .from(proposalEvent)
    .where(and(eq(proposalEvent.companyId, p.companyId), eq(proposalEvent.proposalId, p.id)))
    .orderBy(asc(proposalEvent.createdAt));
  return events
    .filter((e) => EVENT_TEXT[e.kind])
    .map((e) => ({ at: e.createdAt, kind: e.kind, detail: EVENT_TEXT[e.kind](e) }))
    .concat([{ at: now, kind: "signed", detail: signedDetail(method, client.ip) }]);
}

/** The certificate's signing line; a typed name adopted as the signature says so (ESIGN 15 U.S.C. 7006(5): any symbol adopted with intent to sign). */
function signedDetail(method: "drawn" | "typed", ip: string | null): string {
  return method === "typed" ? `Signed, typed name adopted as the signature${ip ? ` from ${ip}` : ""}` : EVENT_TEXT.signed({ body: null, ip });
}

type Signature = { position: number; signerName: string; offer: ProposalSnapshotOffer; client: ClientMeta; now: Date; deadline: string | null; key: string; signedSha256: string };

/** The proposal signed, its deal's contract and size, the timelines and the stage, all in the signing's transaction. */
async function recordSignature(tx: Tx, p: ProposalRow, row: ProposalRow, s: Signature): Promise<void> {
  const contractCents = s.offer.figures.summary.contractCents;
  await tx
    .update(proposal)
    .set({
      status: "signed",
      chosenPosition: s.position,
      consentedAt: s.now,
      signedAt: s.now,
      signerName: s.signerName,
      signerEmail: row.sentToEmail,
      signerIp: s.client.ip,
      signerUserAgent: s.client.userAgent,
      signedStorageKey: s.key,
      signedSha256: s.signedSha256,
      cancelDeadline: s.deadline,
      codeHash: null,
    })
    .where(and(eq(proposal.id, p.id), eq(proposal.companyId, p.companyId)));
  await insertProposalEvent(tx, { companyId: p.companyId, proposalId: p.id, kind: "signed", body: `${s.signerName}: "${s.offer.name}" at ${formatCents(contractCents)}`, client: s.client, at: s.now });
  await tx
    .update(deal)
    .set({ contractCents, systemDcWatts: Math.round(s.offer.equipment.moduleCount * s.offer.equipment.module.stcWatts) })
    .where(and(eq(deal.id, p.dealId), eq(deal.companyId, p.companyId)));
  await recordEvent(tx, {
    companyId: p.companyId,
    dealId: p.dealId,
    kind: "proposal.signed",
    summary: `${s.signerName} signed proposal ${labelOf(row)}: "${s.offer.name}" at ${formatCents(contractCents)}${s.deadline ? `; may cancel until ${formatIsoDateLong(s.deadline)}` : ""}`,
    actorUserId: null,
    data: { proposalId: p.id, position: s.position, signedSha256: s.signedSha256, ip: s.client.ip },
  });
  await autoMoveStage(tx, {
    companyId: p.companyId,
    dealId: p.dealId,
    from: BEFORE_SIGNED,
    to: "signed",
    summary: `Moved to Signed: the customer signed ${labelOf(row)}`,
    data: { proposalId: p.id },
  });
}

/** What each field of the signing form says when it is refused. */
const SIGN_FIELDS: Record<string, RefusalKey> = { position: "position", signerName: "signerName", consent: "consent", signaturePng: "signatureMissing", signatureMethod: "signatureMissing" };

/**
 * Signs the proposal for the chosen offer. One transaction holds the proposal's row lock from
 * the check to the last write: a second signing waits, then finds it signed (409). The signed
 * file is written under a new key and never overwritten. Copies go out after the commit.
 */
export async function signProposal(p: ProposalRow, token: string, input: unknown, client: ClientMeta, session: string | null): Promise<SignedOutcome> {
  // The link's state first: a replaced or expired link says so whatever was sent (checked again under the lock).
  if (p.status === "signed") throw refusal(p.locale, 409, "already_signed", "alreadySigned");
  requireLive(p);
  const parsed = signProposalSchema.safeParse(input);
  if (!parsed.success) throw homeownerInvalid(p.locale, parsed.error, SIGN_FIELDS);
  const { position, signerName } = parsed.data;
  const offer = p.snapshot.offers.find((o) => o.position === position);
  if (!offer) throw refusal(p.locale, 422, "validation_failed", "position", "position");
  const signaturePng = await signaturePngBytes(parsed.data.signaturePng, p.locale);

  const { timeZone } = await getCompanySettings(p.companyId);
  const key = `${p.companyId}/signed/${crypto.randomUUID()}.pdf`;
  const result = await withFilesUndoneOnFailure((put) =>
    transaction(async (tx) => {
      const now = new Date();
      const row = await lockConfirmedProposal(tx, p, session, now);
      const certificateEvents = await consentAndCertificateEvents(tx, p, client, now, parsed.data.signatureMethod);
      // The deadline counts from the day of signing in the company's time zone (Settings → Company).
      const signedOn = dateInZone(now, timeZone);
      const deadline = row.inHomeSale ? cancelDeadline(signedOn) : null;
      const unsigned = await readProposalPdf(row, "unsigned");
      if (sha256Hex(unsigned) !== row.pdfSha256) throw new Error(`proposal ${p.id}: the stored PDF does not match its recorded SHA-256`);
      // The signed copy is the document as sent: its stamp and certificate speak the PDF's language.
      const docLocale = row.snapshot.household.language ?? "en";
      const signed = await stampSignedPdf(unsigned, {
        locale: docLocale,
        signaturePng,
        signerName,
        signerEmail: row.sentToEmail,
        chosenPosition: position,
        chosenOfferName: offer.name,
        chosenContractCents: offer.figures.summary.contractCents,
        signedAt: now,
        timeZone,
        ip: client.ip,
        userAgent: client.userAgent,
        unsignedSha256: row.pdfSha256,
        proposalLabel: labelOf(row),
        events: certificateEvents,
        cancelDeadlineText: deadline ? formatCalendarDate(deadline, "full", docLocale) : null,
        signedOnText: formatCalendarDate(signedOn, "full", docLocale),
      }).catch((err: unknown) => {
        if (err instanceof SignatureImageError) throw refusal(p.locale, 422, "validation_failed", "signatureUnreadable", "signaturePng");
        throw err;
      });
      const signedSha256 = sha256Hex(signed);
      await put(key, signed);
      await recordSignature(tx, p, row, { position, signerName, offer, client, now, deadline, key, signedSha256 });
      const outcome = { signedAt: now, signedSha256, cancelDeadline: deadline, chosenPosition: position };
      // The copies are written with the signature, so a crash after the commit cannot lose them.
      const mailIds = await queueSignedCopies(tx, p, token, { signerName, offerName: offer.name, contractCents: offer.figures.summary.contractCents, timeZone, locale: row.locale }, outcome);
      return { ...outcome, mailIds };
    }),
  );
  await sendQueuedNow(result.mailIds);
  const { mailIds: _sent, ...signed } = result;
  return signed;
}

/**
 * The copies, queued in the signing's transaction (src/server/outbound-mail.ts): the customer
 * gets a link to their page (which always serves the signed PDF) and the rep a link to the deal.
 * A link rather than an attachment: the mail helper (src/server/mail.ts) sends no attachments
 * and the dev outbox drops them.
 */
async function queueSignedCopies(
  tx: Tx,
  p: ProposalRow,
  token: string,
  { signerName, offerName, contractCents, timeZone, locale }: { signerName: string; offerName: string; contractCents: number; timeZone: string; locale: Locale },
  r: SignedOutcome,
): Promise<string[]> {
  // The homeowner's copy in their language for this proposal; the rep's news in English.
  const inLocale = (l: Locale) => ({
    signerName,
    label: labelOf(p),
    offerName,
    price: formatCents(contractCents, l),
    signedAt: formatDateTime(r.signedAt, timeZone, "minutes", l),
    cancelBy: r.cancelDeadline ? formatCalendarDate(r.cancelDeadline, "full", l) : null,
    sha256: r.signedSha256,
  });
  return [
    await queueMail(tx, {
      companyId: p.companyId,
      kind: "signed-copy-customer",
      to: p.sentToEmail,
      replyTo: p.snapshot.rep.email,
      subject: translator(locale, "email.signedCopy")("subject", { company: p.snapshot.company.name, label: labelOf(p) }),
      react: createElement(SignedCopyEmail, { ...inLocale(locale), companyName: p.snapshot.company.name, url: proposalUrl(token), locale }),
      idempotencyKey: `signed-copy-customer-${p.id}`,
    }),
    await queueMail(tx, {
      companyId: p.companyId,
      kind: "signed-copy-rep",
      to: p.snapshot.rep.email,
      subject: `Signed: the ${p.snapshot.household.name} (${labelOf(p)})`,
      react: createElement(SignedNoticeEmail, { ...inLocale("en"), householdName: p.snapshot.household.name, url: dealProposalUrl(p.dealId) }),
      idempotencyKey: `signed-copy-rep-${p.id}`,
    }),
  ];
}

// ── Verify ─────────────────────────────────────────────────────────────────────────────────


/** A match names the proposal, its signing date (in the document's language) and that language. */
export type VerifyAnswer = { match: true; label: string; signedOn: string; locale: Locale } | { match: false };

/**
 * Does this file's SHA-256 match a signed Kilowright record? Answers only the proposal's label
 * and the day of signing (the seller's day, its zone named, as on the signed copy); nothing else about it.
 */
export async function verifySignedPdf(bytes: Uint8Array): Promise<VerifyAnswer> {
  if (bytes.byteLength === 0) throw new HttpError(422, "empty_file", "The file is empty.");
  if (bytes.byteLength > MAX_VERIFY_FILE_BYTES) throw new HttpError(413, "file_too_large", `Files up to ${MAX_VERIFY_FILE_BYTES / 1048576} MB are checked.`);
  const type = await fileTypeFromBuffer(bytes);
  if (type?.mime !== "application/pdf") throw new HttpError(415, "not_pdf", "This is not a PDF file. Upload the signed PDF you received.");
  const [row] = await db()
    .select({ number: proposal.number, version: proposal.version, signedAt: proposal.signedAt, companyId: proposal.companyId, snapshot: proposal.snapshot })
    .from(proposal)
    .where(eq(proposal.signedSha256, sha256Hex(bytes)))
    .limit(1);
  if (!row || !row.signedAt) return { match: false };
  const { timeZone } = await getCompanySettings(row.companyId);
  const locale = row.snapshot.household.language ?? "en"; // the signed PDF's own language
  return { match: true, label: labelOf(row), signedOn: `${formatDate(row.signedAt, timeZone, locale)} (${zoneName(row.signedAt, timeZone)})`, locale };
}
