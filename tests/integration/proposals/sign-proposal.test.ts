// Signing against a real MariaDB and the dev outbox: the one-time code (wrong tries, the lock,
// a new code), the browser-bound confirmation, the stamped PDF and its record, a second signing,
// verifying a signed PDF (and a tampered one), and the right to cancel inside and after the window.
import { createHash } from "node:crypto";
import { and, eq, sql } from "drizzle-orm";
import { PDFDocument } from "pdf-lib";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { deal, proposal, proposalEvent, timelineEvent } from "@/db/schema";
import { formatDate, zoneName } from "@/lib/format";
import type { MailFake } from "@/fakes/mail-server";
import { client, latestCode, latestToken, mailTo, newDeal, newWorld, rejection, signatureDataUrl, startMailIfNeeded, type World } from "./support";
import { openDeal } from "@/server/deal-scope";

let fake: MailFake | null = null;
let w: World;
let png: string;

type Mods = {
  proposals: typeof import("@/server/proposals");
  signing: typeof import("@/server/signing");
  storage: typeof import("@/server/storage");
  db: typeof import("@/server/db");
};
let m: Mods;

beforeAll(async () => {
  fake = await startMailIfNeeded();
  m = {
    proposals: await import("@/server/proposals"),
    signing: await import("@/server/signing"),
    storage: await import("@/server/storage"),
    db: await import("@/server/db"),
  };
  w = await newWorld("Proposal Sign Solar");
  png = await signatureDataUrl();
}, 180_000);

afterAll(async () => {
  await fake?.close();
});

const sha = (b: Uint8Array) => createHash("sha256").update(b).digest("hex");

/** A sent proposal and its link token, as the customer holds it. */
async function sent(opts: { inHomeSale?: boolean } = {}) {
  const d = await newDeal(w);
  const s = await m.proposals.sendProposal(w.rep, { dealId: d.dealId, toEmail: d.email, inHomeSale: opts.inHomeSale ?? true });
  const token = await latestToken(d.email);
  const load = async () => (await m.proposals.findProposalByToken(token))!;
  return { ...d, id: s.id, label: s.label, token, load };
}

/** Lets the 20 s between codes pass at once: the limiter's double-tap window for this proposal ends now. */
async function allowNewCode(proposalId: string) {
  await m.db.db().execute(sql`UPDATE rate_limit SET expire = 0 WHERE \`key\` = ${`signingCodeGap:${proposalId}`}`);
}

async function confirmed(x: Awaited<ReturnType<typeof sent>>): Promise<string> {
  await m.signing.sendSigningCode(await x.load(), x.token, client);
  const code = await latestCode(x.email);
  return (await m.signing.verifySigningCode(await x.load(), { code }, client)).session;
}

const signInput = (position = 1) => ({ position, signerName: "Tess Testwell", consent: true, signaturePng: png });

describe("the one-time code", () => {
  it("e-mails 6 digits, stores only a keyed hash, and confirms the e-mail with the right code", async () => {
    const x = await sent();
    const r = await m.signing.sendSigningCode(await x.load(), x.token, client);
    expect(r.sentTo).toMatch(/^h•••@integration\.example$/);
    const code = await latestCode(x.email);
    expect(code).toMatch(/^\d{6}$/);
    const [row] = await m.db.db().select().from(proposal).where(eq(proposal.id, x.id));
    expect(row.codeHash).toMatch(/^[0-9a-f]{64}$/);
    expect(row.codeHash).not.toBe(sha(new TextEncoder().encode(code)));
    expect(row.codeExpiresAt!.getTime() - Date.now()).toBeGreaterThan(9 * 60_000);
    const ok = await m.signing.verifySigningCode(await x.load(), { code }, client);
    expect(ok.session).toMatch(/^[A-Za-z0-9_-]{43}$/);
    const events = await m.db.db().select().from(proposalEvent).where(eq(proposalEvent.proposalId, x.id));
    expect(events.map((e) => e.kind)).toEqual(expect.arrayContaining(["code_sent", "code_verified"]));
  });

  it("locks the code after 5 wrong tries, saying how many are left; only a new code helps", async () => {
    const x = await sent();
    await m.signing.sendSigningCode(await x.load(), x.token, client);
    const right = await latestCode(x.email);
    const wrong = right === "000000" ? "111111" : "000000";
    for (let i = 1; i <= 4; i++) {
      const e = await rejection(m.signing.verifySigningCode(await x.load(), { code: wrong }, client), 422);
      expect(e.code).toBe("code_wrong");
      expect(e.message).toBe(`Wrong code: ${5 - i} ${5 - i === 1 ? "try" : "tries"} left.`);
    }
    const fifth = await rejection(m.signing.verifySigningCode(await x.load(), { code: wrong }, client), 423);
    expect(fifth.message).toMatch(/locked: ask for a new code/);
    const locked = await rejection(m.signing.verifySigningCode(await x.load(), { code: right }, client), 423);
    expect(locked.code).toBe("code_locked");
    // A new code at once is refused as a double tap; a moment later it works and resets the tries.
    await rejection(m.signing.sendSigningCode(await x.load(), x.token, client), 429);
    await allowNewCode(x.id);
    await m.signing.sendSigningCode(await x.load(), x.token, client);
    const fresh = await latestCode(x.email);
    const ok = await m.signing.verifySigningCode(await x.load(), { code: fresh }, client);
    expect(ok.session).toBeTruthy();
    const wrongs = await m.db.db().select().from(proposalEvent).where(and(eq(proposalEvent.proposalId, x.id), eq(proposalEvent.kind, "code_wrong")));
    expect(wrongs).toHaveLength(5);
  });

  it("refuses an expired code and a malformed one", async () => {
    const x = await sent();
    await m.signing.sendSigningCode(await x.load(), x.token, client);
    const code = await latestCode(x.email);
    const bad = await rejection(m.signing.verifySigningCode(await x.load(), { code: "12ab" }, client), 422);
    expect(bad.fields?.code?.[0]).toBe("Enter the 6 digits from the e-mail.");
    await m.db.db().update(proposal).set({ codeExpiresAt: new Date(Date.now() - 1000) }).where(eq(proposal.id, x.id));
    const expired = await rejection(m.signing.verifySigningCode(await x.load(), { code }, client), 410);
    expect(expired.message).toMatch(/expired/);
  });
});

describe("the code's state after a reload", () => {
  it("tells this browser it is confirmed (minutes left), another browser nothing; a code waiting to be typed is named", async () => {
    const x = await sent();
    expect(await m.signing.signingCodeState(await x.load(), null)).toEqual({ verified: false, minutesLeft: 0, codePending: false, sentTo: null });
    await m.signing.sendSigningCode(await x.load(), x.token, client);
    const waiting = await m.signing.signingCodeState(await x.load(), null);
    expect(waiting).toMatchObject({ verified: false, codePending: true });
    expect(waiting.sentTo).toMatch(/^h•••@integration\.example$/);
    const session = (await m.signing.verifySigningCode(await x.load(), { code: await latestCode(x.email) }, client)).session;
    expect(await m.signing.signingCodeState(await x.load(), session)).toEqual({ verified: true, minutesLeft: 29, codePending: false, sentTo: null });
    expect((await m.signing.signingCodeState(await x.load(), "another-browsers-secret-aaaaaaaaaaaaaaaaaaa")).verified).toBe(false);
    // Past the 30 minutes the confirmation is gone, as the cookie is.
    await m.db.db().update(proposal).set({ codeExpiresAt: new Date(Date.now() - 1000) }).where(eq(proposal.id, x.id));
    expect((await m.signing.signingCodeState(await x.load(), session)).verified).toBe(false);
  });
});

describe("signing", () => {
  it("takes the typed name adopted as the signature and says so on the certificate; refuses an unknown method", async () => {
    const x = await sent();
    const session = await confirmed(x);
    const odd = await rejection(m.signing.signProposal(await x.load(), x.token, { ...signInput(), signatureMethod: "stamped" }, client, session), 422);
    expect(odd.fields?.signatureMethod?.[0]).toBe("Draw your signature in the box, or use your typed name as your signature.");
    await m.signing.signProposal(await x.load(), x.token, { ...signInput(), signatureMethod: "typed" }, client, session);
    const signed = await x.load();
    const bytes = await m.proposals.readProposalPdf(signed, "signed");
    const { extractText, getDocumentProxy } = await import("unpdf");
    const { text } = await extractText(await getDocumentProxy(new Uint8Array(bytes)), { mergePages: true });
    expect(text.replace(/\s+/g, " ")).toContain("typed name adopted as the signature");
  });

  it("needs a confirmed e-mail in this browser", async () => {
    const x = await sent();
    const none = await rejection(m.signing.signProposal(await x.load(), x.token, signInput(), client, null), 403);
    expect(none.code).toBe("code_required");
    await confirmed(x);
    await rejection(m.signing.signProposal(await x.load(), x.token, signInput(), client, "another-browsers-secret-aaaaaaaaaaaaaaaaaaa"), 403);
  });

  it("refuses a signature that is not a PNG, and an offer that is not in the proposal", async () => {
    const x = await sent();
    const session = await confirmed(x);
    const gif = `data:image/png;base64,${Buffer.from("GIF89a\x01\x00\x01\x00\x00\x00\x00;").toString("base64")}`;
    const notPng = await rejection(m.signing.signProposal(await x.load(), x.token, { ...signInput(), signaturePng: gif }, client, session), 422);
    expect(notPng.fields?.signaturePng?.[0]).toBe("Your signature drawing could not be read. Clear the box and draw it again.");
    const noOffer = await rejection(m.signing.signProposal(await x.load(), x.token, signInput(3), client, session), 422);
    expect(noOffer.fields?.position).toBeDefined();
    const noConsent = await rejection(m.signing.signProposal(await x.load(), x.token, { ...signInput(), consent: false }, client, session), 422);
    expect(noConsent.fields?.consent).toBeDefined();
  });

  it("refuses in the homeowner's words and language, never naming a field by its path", async () => {
    const x = await sent();
    const session = await confirmed(x);
    const broken = { ...signInput(), signaturePng: "data:image/png;base64,@@@" };
    const refusals = async () => [
      await rejection(m.signing.signProposal(await x.load(), x.token, broken, client, session), 422),
      await rejection(m.signing.signProposal(await x.load(), x.token, signInput(3), client, session), 422),
      await rejection(m.signing.signProposal(await x.load(), x.token, { ...signInput(), signerName: "T" }, client, session), 422),
      await rejection(m.signing.verifySigningCode(await x.load(), { code: "12ab" }, client), 422),
    ];
    const english = await refusals();
    expect(english.map((r) => r.message)).toEqual([
      "Your signature did not come through. Clear the box and draw it again.",
      "Choose one of the offers in this proposal.",
      "Type your full name (at least 2 letters).",
      "Enter the 6 digits from the e-mail.",
    ]);
    expect(english[0].fields?.signaturePng).toEqual([english[0].message]);
    // The homeowner switched the page to Spanish: the same refusals in Spanish.
    await m.db.db().update(proposal).set({ locale: "es" }).where(eq(proposal.id, x.id));
    const spanish = await refusals();
    expect(spanish.map((r) => r.message)).toEqual([
      "Su firma no llegó bien. Borre el recuadro y dibújela de nuevo.",
      "Elija una de las ofertas de esta propuesta.",
      "Escriba su nombre completo (al menos 2 letras).",
      "Escriba los 6 dígitos del correo electrónico.",
    ]);
    for (const r of [...english, ...spanish]) expect(r.message).not.toMatch(/^\w+(\.\w+)*: /);
  });

  it("stamps and stores the signed PDF, records it, moves the deal to Signed and e-mails both copies; a second signing is refused", async () => {
    const x = await sent();
    const session = await confirmed(x);
    const p = await x.load();
    const chosen = p.snapshot.offers.find((o) => o.position === 2)!;
    const [first, second] = await Promise.allSettled([
      m.signing.signProposal(p, x.token, signInput(2), client, session),
      m.signing.signProposal(p, x.token, signInput(2), client, session),
    ]);
    const outcomes = [first, second];
    expect(outcomes.filter((o) => o.status === "fulfilled")).toHaveLength(1);
    const refused = outcomes.find((o) => o.status === "rejected") as PromiseRejectedResult;
    expect((refused.reason as { status: number }).status).toBe(409);
    const again = await rejection(m.signing.signProposal(await x.load(), x.token, signInput(1), client, session), 409);
    expect(again.code).toBe("already_signed");

    const signed = await x.load();
    expect(signed.status).toBe("signed");
    expect(signed.chosenPosition).toBe(2);
    expect(signed.signerName).toBe("Tess Testwell");
    expect(signed.signerEmail).toBe(x.email);
    expect(signed.signerIp).toBe(client.ip);
    expect(signed.signerUserAgent).toBe(client.userAgent);
    expect(signed.cancelDeadline).toMatch(/^\d{4}-\d{2}-\d{2}$/);
    expect(signed.signedStorageKey).toMatch(new RegExp(`^${w.owner.companyId}/signed/[0-9a-f-]{36}\\.pdf$`));
    const bytes = await m.proposals.readProposalPdf(signed, "signed");
    expect(sha(bytes)).toBe(signed.signedSha256);
    const doc = await PDFDocument.load(bytes);
    const unsigned = await PDFDocument.load(await m.proposals.readProposalPdf(signed, "unsigned"));
    expect(doc.getPageCount()).toBeGreaterThan(unsigned.getPageCount());
    const { extractText, getDocumentProxy } = await import("unpdf");
    const { text } = await extractText(await getDocumentProxy(new Uint8Array(bytes)), { mergePages: true });
    expect(text).toContain("Tess Testwell");
    expect(text).toContain(signed.pdfSha256);
    expect(text).toContain(client.ip);

    const [dealRow] = await m.db.db().select().from(deal).where(eq(deal.id, x.dealId));
    expect(dealRow.stage).toBe("signed");
    expect(dealRow.contractCents).toBe(chosen.figures.summary.contractCents);
    expect(dealRow.systemDcWatts).toBe(8_000);
    const timeline = await m.db.db().select().from(timelineEvent).where(eq(timelineEvent.dealId, x.dealId));
    expect(timeline.some((e) => e.kind === "proposal.signed")).toBe(true);
    const customerCopy = (await mailTo(x.email)).find((mm) => /Your signed agreement/.test(mm.subject));
    expect(customerCopy?.html).toContain(`/p/${x.token}`);
    expect((await mailTo(w.rep.email)).some((mm) => mm.subject === `Signed: the Testwell household (${x.label})`)).toBe(true);
    const list = await m.proposals.listProposalsForDeal(await openDeal(w.rep, x.dealId));
    expect(list[0].status).toBe("signed");
    // A signed agreement is not replaced by a new version.
    await rejection(m.proposals.sendProposal(w.rep, { dealId: x.dealId, toEmail: x.email }), 409);
  });
});

describe("verify", () => {
  it("matches the signed PDF, and fails it with one byte changed", async () => {
    const x = await sent();
    const session = await confirmed(x);
    await m.signing.signProposal(await x.load(), x.token, signInput(1), client, session);
    const signed = await x.load();
    const bytes = await m.proposals.readProposalPdf(signed, "signed");
    const answer = await m.signing.verifySignedPdf(bytes);
    expect(answer).toEqual({ match: true, label: x.label, signedOn: `${formatDate(signed.signedAt!, "America/New_York")} (${zoneName(signed.signedAt!, "America/New_York")})`, locale: "en" }); // the company's default zone
    const tampered = new Uint8Array(bytes);
    const i = Math.floor(tampered.length / 2);
    tampered[i] = tampered[i] ^ 0x01;
    expect(await m.signing.verifySignedPdf(tampered)).toEqual({ match: false });
    expect(await m.signing.verifySignedPdf(await m.proposals.readProposalPdf(signed, "unsigned"))).toEqual({ match: false });
    const notPdf = await rejection(m.signing.verifySignedPdf(new TextEncoder().encode("hello, not a pdf")), 415);
    expect(notPdf.code).toBe("not_pdf");
  });
});

describe("the right to cancel", () => {
  it("cancels inside the window: the proposal and the deal become Cancelled", async () => {
    const x = await sent();
    const session = await confirmed(x);
    await m.signing.signProposal(await x.load(), x.token, signInput(1), client, session);
    const out = await m.proposals.cancelSignedProposal(await x.load(), client);
    expect(out.dealId).toBe(x.dealId);
    const p = await x.load();
    expect(p.status).toBe("cancelled");
    expect(p.cancelledAt).not.toBeNull();
    const [dealRow] = await m.db.db().select().from(deal).where(eq(deal.id, x.dealId));
    expect(dealRow.stage).toBe("cancelled");
    const timeline = await m.db.db().select().from(timelineEvent).where(eq(timelineEvent.dealId, x.dealId));
    expect(timeline.some((e) => e.kind === "proposal.cancelled")).toBe(true);
    await rejection(m.proposals.cancelSignedProposal(await x.load(), client), 409);
    // The signed copy stays available.
    expect((await m.proposals.readProposalPdf(p, "signed")).byteLength).toBeGreaterThan(1000);
  });

  it("refuses after the deadline, naming it, and changes nothing", async () => {
    const x = await sent();
    const session = await confirmed(x);
    await m.signing.signProposal(await x.load(), x.token, signInput(1), client, session);
    await m.db.db().update(proposal).set({ cancelDeadline: "2026-01-09" }).where(eq(proposal.id, x.id));
    const err = await rejection(m.proposals.cancelSignedProposal(await x.load(), client), 409);
    expect(err.code).toBe("cancel_window_closed");
    expect(err.message).toContain("Friday, January 9, 2026");
    expect((await x.load()).status).toBe("signed");
    const [dealRow] = await m.db.db().select().from(deal).where(eq(deal.id, x.dealId));
    expect(dealRow.stage).toBe("signed");
  });

  it("a sale not made in the home has no cancellation window", async () => {
    const x = await sent({ inHomeSale: false });
    const session = await confirmed(x);
    const r = await m.signing.signProposal(await x.load(), x.token, signInput(1), client, session);
    expect(r.cancelDeadline).toBeNull();
    const err = await rejection(m.proposals.cancelSignedProposal(await x.load(), client), 409);
    expect(err.code).toBe("no_right_to_cancel");
  });

  it("keeps the stored signed file immutable under its own key", async () => {
    const x = await sent();
    const session = await confirmed(x);
    await m.signing.signProposal(await x.load(), x.token, signInput(1), client, session);
    const p = await x.load();
    const [row] = await m.db.db().select({ key: proposal.signedStorageKey, sha: proposal.signedSha256 }).from(proposal).where(eq(proposal.id, x.id));
    expect(row.key).not.toBe(p.pdfStorageKey);
    expect(sha((await m.storage.storage().get(row.key!))!)).toBe(row.sha);
  });
});
