// Stages follow the work, against a real MariaDB: saving a usage year moves a lead to Bills in,
// saving a design moves it on to Designing, only sending a proposal puts a deal in Proposal out,
// every automatic move is on the Timeline with its cause, and nothing drags a deal back. A
// string-inverter design without a string plan cannot go into a proposal.
import path from "node:path";
import { readFile } from "node:fs/promises";
import { and, asc, eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { deal, timelineEvent, type Stage } from "@/db/schema";
import type { MailFake } from "@/fakes/mail-server";
import type { Member } from "@/server/session";
import { uniqueEmail } from "../support/fixtures";
import { newWorld, rejection, setServicePanel, startMailIfNeeded, type World } from "../proposals/support";

type Mods = {
  deals: typeof import("@/server/deals");
  energy: typeof import("@/server/energy");
  designs: typeof import("@/server/designs");
  offers: typeof import("@/server/offers");
  proposals: typeof import("@/server/proposals");
  stages: typeof import("@/server/stages");
  scope: typeof import("@/server/deal-scope");
  db: typeof import("@/server/db");
};
let m: Mods;
let w: World;
let fake: MailFake | null = null;

beforeAll(async () => {
  fake = await startMailIfNeeded();
  m = {
    deals: await import("@/server/deals"),
    energy: await import("@/server/energy"),
    designs: await import("@/server/designs"),
    offers: await import("@/server/offers"),
    proposals: await import("@/server/proposals"),
    stages: await import("@/server/stages"),
    scope: await import("@/server/deal-scope"),
    db: await import("@/server/db"),
  };
  w = await newWorld("Stages Follow Work Solar");
}, 180_000);

afterAll(async () => {
  await fake?.close();
});

const KWH = [1100, 950, 850, 700, 800, 1100, 1300, 1250, 1000, 750, 800, 1050];
const bills = (months = 12) =>
  KWH.slice(0, months).map((kwh, i) => ({
    periodStart: new Date(Date.UTC(2025, i, 1)).toISOString().slice(0, 10),
    periodEnd: new Date(Date.UTC(2025, i + 1, 0)).toISOString().slice(0, 10),
    kwh,
    costCents: null,
  }));
const PLAN = { stringSizes: [10, 10], lowestTempC: -10, highestTempC: 35 };

async function newLead(rep: Member = w.rep, withPanel = true): Promise<{ dealId: string; email: string }> {
  const email = uniqueEmail("stages");
  const { dealId } = await m.deals.createLead(rep, {
    name: "Followwork household",
    contactName: "Fay Followwork",
    email,
    street: "1 Test Lane",
    city: "Greensboro",
    region: "NC",
    postalCode: "27405",
    latitude: 36.1,
    longitude: -79.8,
    source: "Website",
    ratePlanId: w.ratePlanId,
  } as Parameters<typeof m.deals.createLead>[1]);
  if (withPanel) await setServicePanel(rep, dealId);
  return { dealId, email };
}

const saveBills = async (dealId: string, months = 12) =>
  m.energy.saveBills(await m.scope.openDeal(w.rep, dealId), { bills: bills(months) } as Parameters<typeof m.energy.saveBills>[1]);

const saveDesign = (dealId: string, stringPlan: typeof PLAN | null = PLAN) =>
  m.designs.saveDesign(w.rep, {
    dealId,
    document: {
      moduleId: w.moduleId,
      inverterId: w.inverterId, // a string inverter
      faces: [{ id: "south", name: "South", tiltDeg: 25, azimuthDeg: 180, usableSlots: 24, solarAccessPct: 95, moduleCount: 20 }],
      weather: { kind: "nearest" },
      stringPlan,
    },
  });

async function stageOf(dealId: string): Promise<Stage> {
  const [row] = await m.db.db().select({ stage: deal.stage }).from(deal).where(eq(deal.id, dealId));
  return row.stage;
}

async function stageEvents(dealId: string) {
  return m.db
    .db()
    .select({ summary: timelineEvent.summary, data: timelineEvent.data, actorUserId: timelineEvent.actorUserId })
    .from(timelineEvent)
    .where(and(eq(timelineEvent.dealId, dealId), eq(timelineEvent.kind, "stage.moved")))
    .orderBy(asc(timelineEvent.createdAt), asc(timelineEvent.id));
}

async function setStage(dealId: string, stage: Stage): Promise<void> {
  await m.db.db().update(deal).set({ stage }).where(eq(deal.id, dealId));
}

describe("automatic moves", () => {
  it("a lead moves to Bills in when its usage year is saved and to Designing when a design is saved, each with its cause", async () => {
    const { dealId } = await newLead();
    expect(await stageOf(dealId)).toBe("lead");

    await saveBills(dealId);
    expect(await stageOf(dealId)).toBe("bills_in");
    await saveDesign(dealId);
    expect(await stageOf(dealId)).toBe("designing");

    expect(await stageEvents(dealId)).toEqual([
      {
        summary: "Moved to Bills in: usage year saved from 12 bills",
        data: expect.objectContaining({ from: "lead", to: "bills_in", automatic: true, cause: "usage", usageSource: "bills" }),
        actorUserId: w.rep.userId,
      },
      {
        summary: "Moved to Designing: design saved (20 modules, 8.00 kW DC)",
        data: expect.objectContaining({ from: "bills_in", to: "designing", automatic: true, cause: "design" }),
        actorUserId: w.rep.userId,
      },
    ]);

    // Saving bills again later changes the usage, not the stage.
    await saveBills(dealId, 6);
    expect(await stageOf(dealId)).toBe("designing");
    expect(await stageEvents(dealId)).toHaveLength(2);
  });

  it("an empty bills table moves nobody; Green Button data moves the lead, naming the file", async () => {
    const { dealId } = await newLead();
    await saveBills(dealId, 0);
    expect(await stageOf(dealId)).toBe("lead");
    expect(await stageEvents(dealId)).toHaveLength(0);

    const xml = await readFile(path.join(process.cwd(), "tests/fixtures/green-button/espi-two-days-invented.xml"));
    await m.energy.acceptDealUpload(await m.scope.openDeal(w.rep, dealId), { name: "usage.xml", bytes: new Uint8Array(xml) });
    expect(await stageOf(dealId)).toBe("bills_in");
    const [moved] = await stageEvents(dealId);
    expect(moved.summary).toBe("Moved to Bills in: usage year saved from Green Button data in “usage.xml”");
    expect(moved.data).toMatchObject({ automatic: true, usageSource: "interval" });
  });

  it("a design saved on a lead without bills moves it straight to Designing", async () => {
    const { dealId } = await newLead();
    await saveDesign(dealId);
    expect(await stageOf(dealId)).toBe("designing");
    expect((await stageEvents(dealId)).map((e) => e.data)).toEqual([expect.objectContaining({ from: "lead", to: "designing", automatic: true })]);
  });

  it("never drags a deal back from a later stage or out of On hold", async () => {
    for (const later of ["proposal_out", "survey", "on_hold", "lost"] as const) {
      const { dealId } = await newLead();
      await setStage(dealId, later);
      await saveBills(dealId);
      await saveDesign(dealId);
      expect(await stageOf(dealId), later).toBe(later);
      expect(await stageEvents(dealId), later).toHaveLength(0);
    }
    const { dealId } = await newLead();
    await saveDesign(dealId);
    await saveBills(dealId); // bills after the design: Designing stays
    expect(await stageOf(dealId)).toBe("designing");
  });
});

describe("Proposal out", () => {
  async function readyDeal(): Promise<{ dealId: string; email: string; offerId: string }> {
    const lead = await newLead();
    await saveBills(lead.dealId);
    await saveDesign(lead.dealId);
    const offer = await m.offers.createOffer(w.rep, { dealId: lead.dealId, inputs: { name: "Whole roof, cash", payment: { kind: "cash" } } });
    return { ...lead, offerId: offer.id };
  }

  it("is refused on the board without a sent proposal, for a rep and for the owner with a reason", async () => {
    const { dealId } = await readyDeal();
    for (const [who, reason] of [
      [w.rep, null],
      [w.owner, "Sent it on paper"],
    ] as const) {
      const err = await rejection(m.stages.moveDealStage(who, dealId, "proposal_out", reason), 422);
      expect(err.code).toBe("stage_rule");
      expect(err.message).toBe("Proposal out happens by itself when a proposal is sent from the deal's Proposal tab; this deal has no sent proposal with an open link.");
    }
    expect(await stageOf(dealId)).toBe("designing");
  });

  it("comes from sending; a deal put on hold goes back while the link is open, not once it is revoked", async () => {
    const { dealId, email } = await readyDeal();
    const sent = await m.proposals.sendProposal(w.rep, { dealId, toEmail: email });
    expect(await stageOf(dealId)).toBe("proposal_out");
    expect((await stageEvents(dealId)).at(-1)).toMatchObject({ summary: `Moved to Proposal out: proposal ${sent.label} sent`, data: { automatic: true } });

    await m.stages.moveDealStage(w.rep, dealId, "on_hold", "Waiting for the roofer's quote");
    await m.stages.moveDealStage(w.rep, dealId, "proposal_out");
    expect(await stageOf(dealId)).toBe("proposal_out");

    await m.proposals.revokeProposal(w.rep, sent.id);
    await m.stages.moveDealStage(w.rep, dealId, "on_hold", "Customer travelling");
    const err = await rejection(m.stages.moveDealStage(w.rep, dealId, "proposal_out"), 422);
    expect(err.message).toMatch(/no sent proposal with an open link/);
    expect(await stageOf(dealId)).toBe("on_hold");
  });
});

describe("string plan before a proposal", () => {
  it("refuses to send an offer on a string-inverter design without a string plan, naming why", async () => {
    const lead = await newLead();
    await saveBills(lead.dealId);
    await saveDesign(lead.dealId, null);
    const offer = await m.offers.createOffer(w.rep, { dealId: lead.dealId, inputs: { name: "Whole roof, cash", payment: { kind: "cash" } } });

    const err = await rejection(m.proposals.sendProposal(w.rep, { dealId: lead.dealId, toEmail: lead.email }), 422);
    expect(err.fields?.offerIds).toEqual([
      "\"Whole roof, cash\" cannot go into a proposal yet. The design uses a string inverter (Testline TI-7600) but has no string plan: lay out the strings on the Design tab and save the design first.",
    ]);
    expect(await m.proposals.listProposalsForDeal(await m.scope.openDeal(w.rep, lead.dealId))).toHaveLength(0);
    expect(await stageOf(lead.dealId)).toBe("designing");

    await saveDesign(lead.dealId, PLAN);
    await m.offers.updateOffer(w.rep, offer.id, { inputs: { name: "Whole roof, cash", payment: { kind: "cash" } } });
    await m.proposals.sendProposal(w.rep, { dealId: lead.dealId, toEmail: lead.email });
    expect(await stageOf(lead.dealId)).toBe("proposal_out");
  });
  // Complete or refused (issue #20 item 6): the same rule refuses a design whose service panel is
  // not known, or whose electrical checks fail; the design itself is saved as a draft.
  it("refuses a design without the service panel's ratings, then one that fails the busbar rule, naming why", async () => {
    const lead = await newLead(w.rep, false);
    await saveBills(lead.dealId);
    const saved = await saveDesign(lead.dealId);
    expect(saved).toBeTruthy(); // the draft is kept
    await m.offers.createOffer(w.rep, { dealId: lead.dealId, inputs: { name: "Whole roof, cash", payment: { kind: "cash" } } });
    const send = () => m.proposals.sendProposal(w.rep, { dealId: lead.dealId, toEmail: lead.email });

    let err = await rejection(send(), 422);
    expect(err.fields?.offerIds).toEqual([
      "\"Whole roof, cash\" cannot go into a proposal yet. The electrical design is incomplete: the service panel's busbar rating, the service panel's main breaker rating are missing (the service panel's ratings go on the Household tab).",
    ]);

    // A 100 A panel behind a 100 A main: 7.6 kW at 240 V is 31.67 A; × 1.25 = 39.58 A + 100 A > 120 A (NEC 2020 705.12(B)(3)(2)).
    await setServicePanel(w.rep, lead.dealId, { serviceBusbarA: 100, serviceMainBreakerA: 100, serviceVoltageV: 240 });
    err = await rejection(send(), 422);
    expect(err.fields?.offerIds?.[0]).toMatch(/^"Whole roof, cash" cannot go into a proposal yet\. The electrical design fails a check: 31\.67 A × 1\.25 = 39\.58 A \+ 100 A main = 139\.58 A > 100 A × 1\.2 = 120 A \(NEC 2020 705\.12\(B\)\(3\)\(2\)/);
    expect(await m.proposals.listProposalsForDeal(await m.scope.openDeal(w.rep, lead.dealId))).toHaveLength(0);

    // The Proposal tab's reason is the same rule: a 225 A busbar passes and the proposal goes out.
    await setServicePanel(w.rep, lead.dealId, { serviceBusbarA: 225, serviceMainBreakerA: 200, serviceVoltageV: 240 });
    await send();
    expect(await stageOf(lead.dealId)).toBe("proposal_out");
  });
});
