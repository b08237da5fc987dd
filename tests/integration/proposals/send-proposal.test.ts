// Sending proposals against a real MariaDB and the dev outbox: the frozen snapshot, numbering
// and versions, revoke and re-send, expired links, the token kept only as a hash, what the
// customer's page records, questions, and tenancy.
import { createHash } from "node:crypto";
import { and, eq, sql } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { deal, proposal, proposalEvent, timelineEvent } from "@/db/schema";
import type { MailFake } from "@/fakes/mail-server";
import { newCompany } from "../support/fixtures";
import { client, latestToken, mailTo, newDeal, newWorld, rejection, startMailIfNeeded, type World } from "./support";
import { openDeal } from "@/server/deal-scope";

let fake: MailFake | null = null;
let w: World;

type Mods = {
  proposals: typeof import("@/server/proposals");
  signing: typeof import("@/server/signing");
  offers: typeof import("@/server/offers");
  catalog: typeof import("@/server/catalog");
  db: typeof import("@/server/db");
};
let m: Mods;

beforeAll(async () => {
  fake = await startMailIfNeeded();
  m = {
    proposals: await import("@/server/proposals"),
    signing: await import("@/server/signing"),
    offers: await import("@/server/offers"),
    catalog: await import("@/server/catalog"),
    db: await import("@/server/db"),
  };
  w = await newWorld("Proposal Send Solar");
}, 180_000);

afterAll(async () => {
  await fake?.close();
});

const sha = (b: Uint8Array) => createHash("sha256").update(b).digest("hex");

async function row(id: string) {
  const [r] = await m.db.db().select().from(proposal).where(eq(proposal.id, id));
  return r;
}

describe("sending", () => {
  it("freezes the deal's offers, numbers the proposal, stores the PDF and moves the deal to Proposal out", async () => {
    const d = await newDeal(w);
    const sent = await m.proposals.sendProposal(w.rep, { dealId: d.dealId, toEmail: d.email, validDays: 30 });
    expect(sent.label).toBe("P-1001 v1");
    expect(sent.mailSent).toBe(true);
    const p = await m.proposals.getProposalOrThrow(w.rep, sent.id);
    expect(p.snapshot.offers.map((o) => o.name)).toEqual(["Whole roof, cash", "Whole roof, loan"]);
    expect(p.snapshot.company.name).toBe("Proposal Send Solar");
    expect(p.snapshot.rep.email).toBe(w.rep.email);
    expect(p.snapshot.usage.monthlyKwh).toHaveLength(12);
    expect(p.snapshot.assumptions.some((a) => a.startsWith("Weather:"))).toBe(true);
    expect(p.snapshot.assumptions.some((a) => /System losses: 14 %/.test(a))).toBe(true);
    expect(p.snapshot.assumptions.some((a) => /program runs 2020-01-01 to 2099-12-31/.test(a))).toBe(true);
    // 10 % of $24,000 = $2,400, capped at the policy's $1,500 maximum.
    expect(p.snapshot.offers[0].depositCents).toBe(150_000);
    expect(p.snapshot.offers[0].equipment.faces.map((f) => f.moduleCount)).toEqual([14, 6]);
    expect(Math.abs(p.expiresAt.getTime() - Date.now() - 30 * 86_400_000)).toBeLessThan(60_000);
    const pdf = await m.proposals.readProposalPdf(p, "unsigned");
    expect(Buffer.from(pdf.subarray(0, 5)).toString()).toBe("%PDF-");
    expect(sha(pdf)).toBe(p.pdfSha256);
    expect(p.pdfStorageKey).toMatch(new RegExp(`^${w.owner.companyId}/proposals/[0-9a-f-]{36}\\.pdf$`));
    const [dealRow] = await m.db.db().select({ stage: deal.stage }).from(deal).where(eq(deal.id, d.dealId));
    expect(dealRow.stage).toBe("proposal_out");
    const events = await m.db.db().select().from(timelineEvent).where(eq(timelineEvent.dealId, d.dealId));
    expect(events.some((e) => e.kind === "proposal.sent")).toBe(true);
    expect(events.some((e) => e.kind === "stage.moved")).toBe(true);
    const mails = await mailTo(d.email);
    expect(mails[0].subject).toMatch(/Your solar proposal from Proposal Send Solar \(P-1001 v1\)/);
  });

  it("keeps the snapshot and its PDF frozen when the offer and the catalog change afterwards", async () => {
    const d = await newDeal(w);
    const sent = await m.proposals.sendProposal(w.rep, { dealId: d.dealId, toEmail: d.email });
    const before = await m.proposals.getProposalOrThrow(w.rep, sent.id);
    const offer = await m.offers.getOfferOrThrow(w.rep, d.cashOfferId);
    await m.offers.updateOffer(w.rep, d.cashOfferId, { inputs: { ...offer.inputs, name: "Changed later", discountCents: 20_000 } });
    await m.catalog.patchModule(w.owner, w.moduleId, { model: "TL-400 renamed" } as Parameters<typeof m.catalog.patchModule>[2]);
    const after = await m.proposals.getProposalOrThrow(w.rep, sent.id);
    expect(after.snapshot).toEqual(before.snapshot);
    expect(after.snapshot.offers[0].name).toBe("Whole roof, cash");
    expect(after.snapshot.offers[0].equipment.module.model).toBe("TL-400");
    expect(sha(await m.proposals.readProposalPdf(after, "unsigned"))).toBe(before.pdfSha256);
    await m.catalog.patchModule(w.owner, w.moduleId, { model: "TL-400" } as Parameters<typeof m.catalog.patchModule>[2]);
  });

  it("numbers a deal's next proposal as a new version and another deal's with the next number", async () => {
    const a = await newDeal(w);
    const b = await newDeal(w);
    const a1 = await m.proposals.sendProposal(w.rep, { dealId: a.dealId, toEmail: a.email });
    const a2 = await m.proposals.sendProposal(w.rep, { dealId: a.dealId, toEmail: a.email, offerIds: [a.loanOfferId] });
    const b1 = await m.proposals.sendProposal(w.rep, { dealId: b.dealId, toEmail: b.email });
    expect(a2.number).toBe(a1.number);
    expect(a2.version).toBe(a1.version + 1);
    expect(b1.number).toBe(a1.number + 1);
    expect(b1.version).toBe(1);
    const old = await row(a1.id);
    expect(old.status).toBe("replaced");
    expect(old.replacedByProposalId).toBe(a2.id);
    const list = await m.proposals.listProposalsForDeal(await openDeal(w.rep, a.dealId));
    expect(list.map((v) => [v.label, v.status])).toEqual([
      [`P-${a1.number} v2`, "sent"],
      [`P-${a1.number} v1`, "replaced"],
    ]);
    expect(list[1].replacedByLabel).toBe(`P-${a1.number} v2`);
  });

  it("refuses an offer whose discount waits for approval, naming it, and sends without it", async () => {
    const d = await newDeal(w);
    const pending = await m.offers.createOffer(w.rep, { dealId: d.dealId, inputs: { name: "Big discount", discountCents: 100_000, discountReason: "Neighbour's quote", payment: { kind: "cash" } } });
    expect(pending.discountStatus).toBe("pending");
    const err = await rejection(m.proposals.sendProposal(w.rep, { dealId: d.dealId, toEmail: d.email }), 422);
    expect(err.fields?.offerIds?.[0]).toMatch(/"Big discount" has a discount waiting/);
    expect(await m.db.db().select().from(proposal).where(eq(proposal.dealId, d.dealId))).toHaveLength(0);
    const ok = await m.proposals.sendProposal(w.rep, { dealId: d.dealId, toEmail: d.email, offerIds: [d.cashOfferId, d.loanOfferId] });
    expect((await m.proposals.getProposalOrThrow(w.rep, ok.id)).snapshot.offers).toHaveLength(2);
  });

  it("validates the input: bad e-mail, too many days, another deal's offer", async () => {
    const d = await newDeal(w);
    const other = await newDeal(w);
    const bad = await rejection(m.proposals.sendProposal(w.rep, { dealId: d.dealId, toEmail: "not-an-address", validDays: 200 }), 422);
    expect(bad.fields?.toEmail).toBeDefined();
    expect(bad.fields?.validDays).toBeDefined();
    const foreignOffer = await rejection(m.proposals.sendProposal(w.rep, { dealId: d.dealId, toEmail: d.email, offerIds: [other.cashOfferId] }), 422);
    expect(foreignOffer.fields?.offerIds?.[0]).toMatch(/offers of this deal/);
  });

  it("stores the link token only as its SHA-256", async () => {
    const d = await newDeal(w);
    const sent = await m.proposals.sendProposal(w.rep, { dealId: d.dealId, toEmail: d.email });
    const token = await latestToken(d.email);
    expect(token).toMatch(/^[A-Za-z0-9_-]{43}$/);
    const r = await row(sent.id);
    expect(r.tokenHash).toBe(createHash("sha256").update(token).digest("hex"));
    const [raw] = (await m.db.db().execute(sql`SELECT * FROM proposal WHERE id = ${sent.id}`))[0] as unknown as Record<string, unknown>[];
    expect(JSON.stringify(raw)).not.toContain(token);
    const events = await m.db.db().select().from(proposalEvent).where(eq(proposalEvent.proposalId, sent.id));
    const timeline = await m.db.db().select().from(timelineEvent).where(eq(timelineEvent.dealId, d.dealId));
    expect(JSON.stringify([events, timeline])).not.toContain(token);
    expect((await m.proposals.findProposalByToken(token))?.id).toBe(sent.id);
    // A different last character (the 43rd of a 256-bit base64url token carries 4 bits, so a fixed "A" is the real one 1 time in 16).
    const otherLast = token.endsWith("A") ? "Q" : "A";
    expect(await m.proposals.findProposalByToken(`${token.slice(0, 42)}${otherLast}`)).toBeNull();
    expect(await m.proposals.findProposalByToken("../../etc/passwd")).toBeNull();
  });
});

describe("links: replaced, revoked, expired, re-sent", () => {
  it("shows a replaced version as replaced; it cannot get a code or be signed", async () => {
    const d = await newDeal(w);
    await m.proposals.sendProposal(w.rep, { dealId: d.dealId, toEmail: d.email });
    const oldToken = await latestToken(d.email);
    await m.proposals.sendProposal(w.rep, { dealId: d.dealId, toEmail: d.email });
    const old = await m.proposals.findProposalByToken(oldToken);
    expect(old && (await import("@/lib/proposal-snapshot")).proposalLinkState(old)).toBe("replaced");
    const err = await rejection(m.signing.sendSigningCode(old!, oldToken, client), 409);
    expect(err.code).toBe("replaced");
    await rejection(m.signing.signProposal(old!, oldToken, { position: 1, signerName: "Tess Testwell", consent: true, signaturePng: "data:image/png;base64,iVBORw0KGgo=" }, client, "x"), 409);
  });

  it("revokes: a rep on their own deal, not another rep; a revoked link gets no code", async () => {
    const d = await newDeal(w);
    const sent = await m.proposals.sendProposal(w.rep, { dealId: d.dealId, toEmail: d.email });
    const token = await latestToken(d.email);
    await rejection(m.proposals.revokeProposal(w.rep2, sent.id), 404);
    const revoked = await m.proposals.revokeProposal(w.rep, sent.id);
    expect(revoked.status).toBe("revoked");
    expect(revoked.revokedAt).not.toBeNull();
    const p = await m.proposals.findProposalByToken(token);
    const err = await rejection(m.signing.sendSigningCode(p!, token, client), 410);
    expect(err.code).toBe("revoked");
    await rejection(m.proposals.revokeProposal(w.office, sent.id), 409);
    await rejection(m.proposals.resendProposal(w.rep, sent.id), 409);
  });

  it("the office revokes any deal's proposal", async () => {
    const d = await newDeal(w);
    const sent = await m.proposals.sendProposal(w.rep, { dealId: d.dealId, toEmail: d.email });
    expect((await m.proposals.revokeProposal(w.office, sent.id)).status).toBe("revoked");
  });

  it("refuses an expired link", async () => {
    const d = await newDeal(w);
    const sent = await m.proposals.sendProposal(w.rep, { dealId: d.dealId, toEmail: d.email, validDays: 1 });
    const token = await latestToken(d.email);
    await m.db.db().update(proposal).set({ expiresAt: new Date(Date.now() - 60_000) }).where(eq(proposal.id, sent.id));
    const p = await m.proposals.findProposalByToken(token);
    const err = await rejection(m.signing.sendSigningCode(p!, token, client), 410);
    expect(err.code).toBe("expired");
    await rejection(m.signing.signProposal(p!, token, { position: 1, signerName: "Tess Testwell", consent: true, signaturePng: "data:image/png;base64,iVBORw0KGgo=" }, client, "x"), 410);
    await rejection(m.proposals.askQuestion(p!, { question: "Still valid?" }, client), 409);
  });

  it("re-sends a new link for the same version; the old token stops working", async () => {
    const d = await newDeal(w);
    const sent = await m.proposals.sendProposal(w.rep, { dealId: d.dealId, toEmail: d.email });
    const first = await latestToken(d.email);
    const again = await m.proposals.resendProposal(w.rep, sent.id);
    expect(again.label).toBe(sent.label);
    expect(again.mailSent).toBe(true);
    const second = await latestToken(d.email);
    expect(second).not.toBe(first);
    expect(await m.proposals.findProposalByToken(first)).toBeNull();
    expect((await m.proposals.findProposalByToken(second))?.id).toBe(sent.id);
  });
});

describe("the customer's page", () => {
  it("records opened once, then a view at most every 10 minutes, on the Timeline with IP and browser", async () => {
    const d = await newDeal(w);
    const sent = await m.proposals.sendProposal(w.rep, { dealId: d.dealId, toEmail: d.email });
    const token = await latestToken(d.email);
    const load = async () => (await m.proposals.findProposalByToken(token))!;
    await m.proposals.recordProposalView(await load(), client);
    await m.proposals.recordProposalView(await load(), client);
    let events = await m.db.db().select().from(proposalEvent).where(eq(proposalEvent.proposalId, sent.id));
    expect(events.filter((e) => e.kind === "opened")).toHaveLength(1);
    expect(events.filter((e) => e.kind === "viewed")).toHaveLength(0);
    expect(events.find((e) => e.kind === "opened")?.ip).toBe(client.ip);
    expect(events.find((e) => e.kind === "opened")?.userAgent).toBe(client.userAgent);
    await m.db.db().update(proposal).set({ lastViewedAt: new Date(Date.now() - 11 * 60_000) }).where(eq(proposal.id, sent.id));
    await m.proposals.recordProposalView(await load(), client);
    events = await m.db.db().select().from(proposalEvent).where(eq(proposalEvent.proposalId, sent.id));
    expect(events.filter((e) => e.kind === "viewed")).toHaveLength(1);
    const timeline = await m.db.db().select().from(timelineEvent).where(and(eq(timelineEvent.dealId, d.dealId)));
    expect(timeline.filter((e) => e.kind === "proposal.opened")).toHaveLength(1);
    expect(timeline.filter((e) => e.kind === "proposal.viewed")).toHaveLength(1);
    const list = await m.proposals.listProposalsForDeal(await openDeal(w.rep, d.dealId));
    expect(list[0].status).toBe("viewed");
  });

  it("stores a question with its text and e-mails it to the rep", async () => {
    const d = await newDeal(w);
    const sent = await m.proposals.sendProposal(w.rep, { dealId: d.dealId, toEmail: d.email });
    const token = await latestToken(d.email);
    const p = (await m.proposals.findProposalByToken(token))!;
    const bad = await rejection(m.proposals.askQuestion(p, { question: "" }, client), 422);
    expect(bad.fields?.question).toBeDefined();
    await m.proposals.askQuestion(p, { question: "Can the loan be repaid early without a fee?" }, client);
    const [event] = await m.db.db().select().from(proposalEvent).where(and(eq(proposalEvent.proposalId, sent.id), eq(proposalEvent.kind, "question")));
    expect(event.body).toBe("Can the loan be repaid early without a fee?");
    const mail = (await mailTo(w.rep.email)).find((x) => /Question from the Testwell household/.test(x.subject));
    expect(mail?.text).toContain("Can the loan be repaid early without a fee?");
  });
});

describe("tenancy", () => {
  it("another company's proposal and event ids are not found; a rep sees only their own deals'", async () => {
    const d = await newDeal(w);
    const sent = await m.proposals.sendProposal(w.rep, { dealId: d.dealId, toEmail: d.email });
    const other = await newCompany("Elsewhere Solar");
    await rejection(m.proposals.getProposalOrThrow(other, sent.id), 404);
    await rejection(m.proposals.revokeProposal(other, sent.id), 404);
    await rejection(m.proposals.resendProposal(other, sent.id), 404);
    await rejection(openDeal(other, d.dealId).then(m.proposals.listProposalsForDeal), 404);
    await rejection(m.proposals.sendProposal(other, { dealId: d.dealId, toEmail: d.email }), 404);
    await rejection(m.proposals.getProposalOrThrow(w.rep2, sent.id), 404);
    const [event] = await m.db.db().select().from(proposalEvent).where(eq(proposalEvent.proposalId, sent.id));
    await rejection(m.proposals.getProposalEventOrThrow(other, event.id), 404);
    await rejection(m.proposals.getProposalEventOrThrow(w.rep2, event.id), 404);
    expect((await m.proposals.getProposalEventOrThrow(w.office, event.id)).id).toBe(event.id);
    expect((await m.proposals.getProposalOrThrow(w.office, sent.id)).id).toBe(sent.id);
  });
});
