// One clock everywhere: a company in Honolulu (UTC−10) sends and a customer signs at 05:30 UTC
// on December 6, which is 7:30 PM on December 5 there. The Timeline, the e-mails from the dev
// outbox, the proposal PDF, the signed copy and its certificate all say December 5 on the
// company's clock (the certificate adds UTC); a formatter on UTC would say December 6.
import { and, eq } from "drizzle-orm";
import { extractText } from "unpdf";
import { afterAll, afterEach, beforeAll, describe, expect, it, vi } from "vitest";
import { company, timelineEvent } from "@/db/schema";
import type { MailFake } from "@/fakes/mail-server";
import { storedCompanySettingsSchema } from "@/lib/schemas/company-settings";
import { client, latestCode, latestToken, mailTo, newDeal, newWorld, signatureDataUrl, startMailIfNeeded, type World } from "./support";

const SENT_AT = new Date("2026-12-06T05:30:00.000Z"); // Dec 5, 7:30 PM HST
const SIGNED_AT = new Date("2026-12-06T05:45:10.000Z"); // Dec 5, 7:45 PM HST

type Mods = {
  proposals: typeof import("@/server/proposals");
  signing: typeof import("@/server/signing");
  db: typeof import("@/server/db");
};
let m: Mods;
let w: World;
let fake: MailFake | null = null;

beforeAll(async () => {
  fake = await startMailIfNeeded();
  m = { proposals: await import("@/server/proposals"), signing: await import("@/server/signing"), db: await import("@/server/db") };
  w = await newWorld("Island Clock Solar");
  const [row] = await m.db.db().select({ settings: company.settings }).from(company).where(eq(company.id, w.owner.companyId));
  await m.db
    .db()
    .update(company)
    .set({ settings: storedCompanySettingsSchema.parse({ ...row?.settings, timeZone: "Pacific/Honolulu" }) })
    .where(eq(company.id, w.owner.companyId));
}, 180_000);

afterEach(() => {
  vi.useRealTimers();
});

afterAll(async () => {
  await fake?.close();
});

/** Only Date is faked: timers, the database driver and fetch keep running. */
function clockAt(at: Date): void {
  vi.useFakeTimers({ toFake: ["Date"] });
  vi.setSystemTime(at);
}

const pdfText = async (bytes: Uint8Array) => (await extractText(bytes.slice(), { mergePages: true })).text;
const plain = (html: string | null) => (html ?? "").replace(/<[^>]+>/g, " ").replace(/&nbsp;|\s+/g, " ");

describe("a Honolulu company near midnight UTC", () => {
  it("dates the proposal, its e-mail, the Timeline, the signed copy, its certificate and the signed-copy e-mail on Honolulu's day", async () => {
    const d = await newDeal(w);
    clockAt(SENT_AT);
    const sent = await m.proposals.sendProposal(w.rep, { dealId: d.dealId, toEmail: d.email, validDays: 30, inHomeSale: true });
    // 30 days on: 05:30 UTC on January 5 is January 4 in Honolulu.
    const [event] = await m.db
      .db()
      .select({ summary: timelineEvent.summary })
      .from(timelineEvent)
      .where(and(eq(timelineEvent.dealId, d.dealId), eq(timelineEvent.kind, "proposal.sent")));
    expect(event.summary).toMatch(/link valid until Jan 4, 2027$/);

    const linkMail = (await mailTo(d.email)).find((x) => /solar proposal/.test(x.subject));
    expect(plain(linkMail?.html ?? null)).toContain("works until Jan 4, 2027, 7:30 PM HST");

    const p = (await m.proposals.findProposalByToken(await latestToken(d.email)))!;
    expect(p.id).toBe(sent.id);
    const unsigned = await pdfText(await m.proposals.readProposalPdf(p, "unsigned"));
    expect(unsigned).toContain("Dec 5, 2026");
    expect(unsigned).toContain("Jan 4, 2027");
    expect(unsigned).not.toContain("Dec 6, 2026");
    expect(unsigned).not.toContain("Jan 5, 2027");

    const token = await latestToken(d.email);
    vi.setSystemTime(SIGNED_AT.getTime() - 60_000); // the customer confirms the e-mail a minute before signing
    await m.signing.sendSigningCode(p, token, client);
    const code = await latestCode(d.email);
    const { session } = await m.signing.verifySigningCode((await m.proposals.findProposalByToken(token))!, { code }, client);
    vi.setSystemTime(SIGNED_AT);
    const signed = await m.signing.signProposal((await m.proposals.findProposalByToken(token))!, token, { position: 1, signerName: "Tess Testwell", consent: true, signaturePng: await signatureDataUrl() }, client, session);
    vi.useRealTimers();
    expect(signed.signedAt.toISOString()).toBe(SIGNED_AT.toISOString());
    // The right to cancel counts from Honolulu's Saturday Dec 5: Mon 7, Tue 8, Wed 9.
    expect(signed.cancelDeadline).toBe("2026-12-09");

    const signedText = await pdfText(await m.proposals.readProposalPdf((await m.proposals.findProposalByToken(token))!, "signed"));
    expect(signedText).toContain("Dec 5, 2026, 7:45 PM HST"); // the signature page's date
    expect(signedText).toContain("Dec 5, 2026, 7:45:10 PM HST"); // the certificate, on the company's clock
    expect(signedText).toContain("2026-12-06T05:45:10.000Z"); // and in UTC
    expect(signedText).toContain("Saturday, December 5, 2026"); // the notice's date of transaction
    expect(signedText).not.toMatch(/Dec 6, 2026|December 6, 2026/);

    const copy = (await mailTo(d.email)).find((x) => x.subject.startsWith("Your signed agreement"));
    expect(copy, "the customer's signed copy e-mail").toBeDefined();
    expect(plain(copy?.html ?? null)).toContain("on Dec 5, 2026, 7:45 PM HST");

    const verify = await m.signing.verifySignedPdf(await m.proposals.readProposalPdf((await m.proposals.findProposalByToken(token))!, "signed"));
    expect(verify).toEqual({ match: true, label: sent.label, signedOn: "Dec 5, 2026 (HST)", locale: "en" });
  });
});
