// Manual stage moves against a real MariaDB: the rules, the audit trail in the same
// transaction, reps limited to their own deals and early stages, lost updates, tenancy.
import { and, asc, eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { deal, household, timelineEvent, type Stage } from "@/db/schema";
import { DEFAULT_TIME_ZONE } from "@/lib/schemas/company-settings";
import { todayInZone } from "@/lib/zoned-time";
import type { Member } from "@/server/session";
import { addMember, newCompany, rejects } from "../support/fixtures";

type Server = {
  stages: typeof import("@/server/stages");
  errors: typeof import("@/server/errors");
  db: typeof import("@/server/db");
};
let s: Server;
let owner: Member;
let office: Member;
let rep: Member;
let rep2: Member;
let stranger: Member;


/**
 * Waits until one of the app's connections is running its UPDATE of a deal (blocked on the row
 * lock), up to 10 s: the process list shows a user's own threads without extra privileges.
 */
/** Waits until an UPDATE of this deal's row (found by its id in the statement) waits on the row lock. */
async function waitForBlockedDealUpdate(dealId: string): Promise<void> {
  for (const start = Date.now(); Date.now() - start < 20_000; await new Promise((r) => setTimeout(r, 20))) {
    const [rows] = await s.db
      .pool()
      .query("SELECT COUNT(*) AS n FROM information_schema.PROCESSLIST WHERE INFO LIKE 'update `deal`%' AND INFO LIKE ? AND ID <> CONNECTION_ID()", [`%${dealId}%`]);
    if (Number((rows as { n: number }[])[0].n) > 0) return;
  }
  throw new Error("the move's UPDATE did not come to wait on the row lock within 20 s");
}

async function newDeal(by: Member, stage: Stage, name = "Testwood household"): Promise<string> {
  const householdId = crypto.randomUUID();
  const dealId = crypto.randomUUID();
  await s.db.db().insert(household).values({
    id: householdId,
    companyId: by.companyId,
    name,
    street: "1 Test Lane",
    city: "Testville",
    region: "NC",
    postalCode: "27000",
    latitude: 36,
    longitude: -80,
  });
  await s.db.db().insert(deal).values({ id: dealId, companyId: by.companyId, householdId, ownerUserId: by.userId, stage, source: "Referral" });
  return dealId;
}

async function stageOf(dealId: string): Promise<Stage> {
  const [row] = await s.db.db().select({ stage: deal.stage }).from(deal).where(eq(deal.id, dealId));
  return row.stage;
}

async function moves(dealId: string) {
  return s.db
    .db()
    .select()
    .from(timelineEvent)
    .where(and(eq(timelineEvent.dealId, dealId), eq(timelineEvent.kind, "stage.moved")))
    .orderBy(asc(timelineEvent.createdAt));
}

beforeAll(async () => {
  s = { stages: await import("@/server/stages"), errors: await import("@/server/errors"), db: await import("@/server/db") };
  owner = await newCompany("Stage Rules Solar");
  office = await addMember(owner, "office_manager", "Opal Office");
  rep = await addMember(owner, "sales_rep", "Reed Rep");
  rep2 = await addMember(owner, "sales_rep", "Rhea Rep");
  stranger = await newCompany("Other Solar");
});

describe("moveDealStage", () => {
  it("refuses Lost without a reason, and moves with one, writing exactly one Timeline event", async () => {
    const id = await newDeal(rep, "proposal_out", "Lindenfeld household");
    const refused = await rejects(s.stages.moveDealStage(office, id, "lost"), 422);
    expect(refused.code).toBe("stage_rule");
    expect(await stageOf(id)).toBe("proposal_out");
    expect(await moves(id)).toHaveLength(0);

    const moved = await s.stages.moveDealStage(office, id, "lost", "  Went with a roof replacement first  ");
    expect(moved).toMatchObject({ from: "proposal_out", to: "lost", reason: "Went with a roof replacement first" });
    const [row] = await s.db.db().select().from(deal).where(eq(deal.id, id));
    expect(row.stage).toBe("lost");
    expect(Math.abs(row.stageChangedAt.getTime() - moved.stageChangedAt.getTime())).toBeLessThan(1000);
    const events = await moves(id);
    expect(events).toHaveLength(1);
    expect(events[0]).toMatchObject({
      companyId: owner.companyId,
      actorUserId: office.userId,
      summary: "Opal Office moved Lindenfeld household from Proposal out to Lost: Went with a roof replacement first",
      data: { from: "proposal_out", to: "lost", reason: "Went with a roof replacement first", automatic: false },
    });
  });

  it("refuses Install booked without a permit approval date unless an admin gives a reason", async () => {
    const id = await newDeal(rep, "permitting");
    const byOffice = await rejects(s.stages.moveDealStage(office, id, "install_booked", "urgent"), 422);
    expect(byOffice.message).toMatch(/^No permit approval date is recorded for this deal/);
    const noReason = await s.stages.moveDealStage(owner, id, "install_booked").catch((e: unknown) => e);
    expect(noReason).toBeInstanceOf(s.stages.StageRuleError);
    expect((noReason as InstanceType<typeof s.stages.StageRuleError>).needs).toBe("admin_reason");
    expect(await stageOf(id)).toBe("permitting");
    expect(await moves(id)).toHaveLength(0);

    await s.stages.moveDealStage(owner, id, "install_booked", "Permit approved by phone; paper copy follows");
    expect(await stageOf(id)).toBe("install_booked");
    const events = await moves(id);
    expect(events).toHaveLength(1);
    expect(events[0].summary).toBe("Olive Owner moved Testwood household from Permitting to Install booked: Permit approved by phone; paper copy follows");
  });

  it("refuses Signed, Deposit paid and Cancelled by hand", async () => {
    const id = await newDeal(rep, "proposal_out");
    for (const to of ["signed", "deposit_paid", "cancelled"] as const) await rejects(s.stages.moveDealStage(owner, id, to, "because"), 422);
    expect(await stageOf(id)).toBe("proposal_out");
  });

  it("lets a rep move their own deal among the early stages, but not another rep's deal nor into Permitting", async () => {
    const own = await newDeal(rep, "lead");
    await s.stages.moveDealStage(rep, own, "bills_in");
    expect(await stageOf(own)).toBe("bills_in");

    const others = await newDeal(rep2, "lead");
    await rejects(s.stages.moveDealStage(rep, others, "bills_in"), 404);
    expect(await stageOf(others)).toBe("lead");

    const late = await newDeal(rep, "survey");
    await rejects(s.stages.moveDealStage(rep, late, "permitting"), 403);
    expect(await stageOf(late)).toBe("survey");
    expect(await moves(late)).toHaveLength(0);
  });

  it("answers 409 when someone moved the deal meanwhile (no lost update)", async () => {
    const id = await newDeal(rep, "survey");
    // Another person's move, holding the row while ours reads the deal and tries to update it.
    const other = await s.db.pool().getConnection();
    try {
      await other.beginTransaction();
      await other.query("SELECT id FROM deal WHERE id = ? FOR UPDATE", [id]);
      const ours = s.stages.moveDealStage(office, id, "permitting").then(
        () => null,
        (e: unknown) => e,
      );
      await waitForBlockedDealUpdate(id); // ours has read "Survey" and waits on the row lock
      await other.query("UPDATE deal SET stage = 'on_hold' WHERE id = ?", [id]);
      await other.commit();
      const err = await ours;
      expect(err).toBeInstanceOf(s.errors.HttpError);
      expect((err as InstanceType<typeof s.errors.HttpError>).status).toBe(409);
    } finally {
      other.release();
    }
    expect(await stageOf(id)).toBe("on_hold");
    expect(await moves(id)).toHaveLength(0);

    // Two people at once: one wins, and the Timeline tells the same story as the deal.
    const id2 = await newDeal(rep, "survey");
    const results = await Promise.allSettled([
      s.stages.moveDealStage(office, id2, "permitting"),
      s.stages.moveDealStage(owner, id2, "on_hold", "Waiting for the HOA"),
    ]);
    for (const r of results) if (r.status === "rejected") expect((r.reason as InstanceType<typeof s.errors.HttpError>).status).toBe(409);
    const events = await moves(id2);
    expect(events).toHaveLength(results.filter((r) => r.status === "fulfilled").length);
    expect(await stageOf(id2)).toBe((events.at(-1)?.data as { to: Stage }).to);
  });

  it("does not find another company's deal (404)", async () => {
    const id = await newDeal(rep, "survey");
    await rejects(s.stages.moveDealStage(stranger, id, "permitting"), 404);
    expect(await stageOf(id)).toBe("survey");
  });

  it("moves back only with a reason", async () => {
    const id = await newDeal(rep, "permitting");
    await rejects(s.stages.moveDealStage(office, id, "survey"), 422);
    await s.stages.moveDealStage(office, id, "survey", "Survey photos were missing");
    expect(await stageOf(id)).toBe("survey");
  });
});

describe("listBoardDeals", () => {
  it("shows a rep only their own deals and filters by rep and source for the office", async () => {
    const mine = await newDeal(rep, "lead");
    const theirs = await newDeal(rep2, "lead");
    const repView = await s.stages.listBoardDeals(rep, { rep: rep2.userId });
    expect(repView.map((d) => d.id)).toContain(mine);
    expect(repView.map((d) => d.id)).not.toContain(theirs);
    const officeView = await s.stages.listBoardDeals(office, { rep: rep2.userId, source: "Referral" });
    expect(officeView.map((d) => d.id)).toContain(theirs);
    expect(officeView.every((d) => d.ownerUserId === rep2.userId)).toBe(true);
    expect(await s.stages.listBoardDeals(office, { source: "Nowhere" })).toHaveLength(0);
    // The filter reads days on the company's clock (the default zone here), not UTC: between
    // midnight UTC and midnight in New York the two dates differ.
    const today = todayInZone(DEFAULT_TIME_ZONE);
    expect((await s.stages.listBoardDeals(office, { from: today, to: today })).map((d) => d.id)).toContain(theirs);
    expect(await s.stages.listBoardDeals(office, { to: "2000-01-01" })).toHaveLength(0);
    expect(await s.stages.listBoardDeals(stranger, {})).toHaveLength(0);
  });
});
