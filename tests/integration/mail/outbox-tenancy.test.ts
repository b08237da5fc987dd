// The dev outbox lists a company's own mail only: another company's owner never reads its proposal
// links, signing codes or invitation links (they would let them sign or join in its place).
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { MailFake } from "@/fakes/mail-server";
import type { Member } from "@/server/session";
import { newCompany, uniqueEmail } from "../support/fixtures";
import { client, latestToken, newDeal, newWorld, startMailIfNeeded, type World } from "../proposals/support";

let fake: MailFake | null = null;
let w: World;
let stranger: Member;
let mail: typeof import("@/server/mail");

beforeAll(async () => {
  fake = await startMailIfNeeded();
  mail = await import("@/server/mail");
  w = await newWorld("Outbox Tenancy Solar");
  stranger = await newCompany("Self-registered Stranger Solar");
}, 120_000);

afterAll(async () => {
  await fake?.close();
});

describe("the dev outbox across companies", () => {
  it("company B's owner sees none of company A's proposal links, signing codes or invitation links", async () => {
    const { sendProposal, findProposalByToken } = await import("@/server/proposals");
    const { sendSigningCode } = await import("@/server/signing");
    const { invitePerson } = await import("@/server/people");
    const d = await newDeal(w);
    await sendProposal(w.rep, { dealId: d.dealId, toEmail: d.email, inHomeSale: true });
    const token = await latestToken(d.email);
    const found = await findProposalByToken(token);
    if (!found) throw new Error("the proposal link does not open");
    await sendSigningCode(found, token, client);
    const invited = uniqueEmail("invited");
    await invitePerson(w.owner, { email: invited, name: "Ivy Invited", role: "crew" });

    const ours = await mail.listOutbox({ companyId: w.owner.companyId, limit: 1000 });
    const subjects = ours.map((m) => m.subject);
    expect(subjects.some((s) => /Your solar proposal/.test(s))).toBe(true);
    expect(subjects.some((s) => /Your signing code/.test(s))).toBe(true);
    expect(subjects.some((s) => /invited you to Outbox Tenancy Solar/.test(s))).toBe(true);

    const theirs = await mail.listOutbox({ companyId: stranger.companyId, limit: 1000 });
    const leaked = theirs.filter((m) => [...m.to].some((a) => a === d.email || a === invited) || (m.html ?? "").includes(token));
    expect(leaked).toEqual([]);
    expect(theirs.every((m) => m.tags.some((t) => t.name === "company_id" && t.value === stranger.companyId))).toBe(true);
  });
});
