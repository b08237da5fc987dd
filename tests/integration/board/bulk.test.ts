// Bulk moves and reassignment from the deals table against a real MariaDB: the same rules as
// one deal at a time, one result per deal, Timeline events in the same transaction.
import { eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { job, membership } from "@/db/schema";
import { BULK_MAX_DEALS, dealBulkSchema } from "@/lib/schemas/deal-table";
import { db } from "@/server/db";
import { bulkDealAction } from "@/server/deal-table";
import type { Member } from "@/server/session";
import { addMember, newCompany } from "../support/fixtures";
import { dealRow, eventsOf, newDeal, rejects } from "./support";

let owner: Member;
let office: Member;
let rep: Member;
let rep2: Member;
let crew: Member;
let stranger: Member;

const bulk = (m: Member, input: unknown) => bulkDealAction(m, dealBulkSchema.parse(input));

beforeAll(async () => {
  owner = await newCompany("Bulk Solar");
  office = await addMember(owner, "office_manager", "Opal Office");
  rep = await addMember(owner, "sales_rep", "Reed Rep");
  rep2 = await addMember(owner, "sales_rep", "Rhea Rep");
  crew = await addMember(owner, "crew", "Cass Crew");
  stranger = await newCompany("Stranger Solar");
});

describe("bulk stage move", () => {
  it("moves the deals the rules allow and reports each refusal with its reason", async () => {
    const survey = await newDeal(owner, "survey", { name: "Surveyfield household", owner: rep });
    const permitting = await newDeal(owner, "permitting", { name: "Permitfield household", owner: rep });
    const lead = await newDeal(owner, "lead", { name: "Leadfield household", owner: rep2 });
    const foreign = await newDeal(stranger, "survey", { name: "Foreign household" });
    const missing = crypto.randomUUID();

    const answer = await bulk(office, { dealIds: [survey, permitting, lead, foreign, missing, survey], action: { kind: "move", to: "permitting" } });
    expect(answer.results.map((r) => [r.dealId, r.outcome])).toEqual([
      [survey, "moved"],
      [permitting, "refused"],
      [lead, "refused"],
      [foreign, "refused"],
      [missing, "refused"],
    ]);
    expect(answer).toMatchObject({ done: 1, refused: 4 });
    const byId = new Map(answer.results.map((r) => [r.dealId, r]));
    expect(byId.get(survey)).toMatchObject({ householdName: "Surveyfield household", message: null });
    expect(byId.get(permitting)?.message).toBe("The deal is already in Permitting.");
    expect(byId.get(lead)?.message).toMatch(/must be signed and its deposit paid/);
    expect(byId.get(foreign)).toMatchObject({ householdName: null, message: "Deal not found." });

    expect((await dealRow(survey)).stage).toBe("permitting");
    expect((await dealRow(lead)).stage).toBe("lead");
    expect((await dealRow(foreign)).stage).toBe("survey");
    const events = await eventsOf(survey, "stage.moved");
    expect(events).toHaveLength(1);
    expect(events[0]).toMatchObject({ actorUserId: office.userId, data: { from: "survey", to: "permitting", automatic: false } });
  });

  it("applies the permit rule per deal: a job with an approval date moves, one without is refused", async () => {
    const withDate = await newDeal(owner, "permitting", { name: "Dated household" });
    const without = await newDeal(owner, "permitting", { name: "Undated household" });
    await db().insert(job).values({ id: crypto.randomUUID(), companyId: owner.companyId, dealId: withDate, permitApprovedOn: "2026-02-10" });
    const answer = await bulk(office, { dealIds: [withDate, without], action: { kind: "move", to: "install_booked", reason: "Crew free next week" } });
    expect(answer.results.map((r) => r.outcome)).toEqual(["moved", "refused"]);
    expect(answer.results[1].message).toMatch(/^No permit approval date is recorded for this deal/);
    expect((await eventsOf(withDate, "stage.moved"))[0].summary).toBe("Opal Office moved Dated household from Permitting to Install booked: Crew free next week");
    // The owner's reason overrides the missing date.
    const again = await bulk(owner, { dealIds: [without], action: { kind: "move", to: "install_booked", reason: "Approved at the counter" } });
    expect(again.results[0].outcome).toBe("moved");
  });

  it("needs a reason for Lost, and takes one for all", async () => {
    const a = await newDeal(owner, "proposal_out");
    const b = await newDeal(owner, "designing");
    const refused = await bulk(office, { dealIds: [a, b], action: { kind: "move", to: "lost" } });
    expect(refused.results.every((r) => r.outcome === "refused" && r.message === "Say why the deal is lost.")).toBe(true);
    const moved = await bulk(office, { dealIds: [a, b], action: { kind: "move", to: "lost", reason: "  Moved out of state " } });
    expect(moved.done).toBe(2);
    expect((await eventsOf(a, "stage.moved"))[0].data).toMatchObject({ reason: "Moved out of state" });
  });

  it("lets a rep move only their own deals, among the early stages", async () => {
    const own = await newDeal(owner, "lead", { owner: rep });
    const others = await newDeal(owner, "lead", { owner: rep2 });
    const late = await newDeal(owner, "signed", { owner: rep });
    const answer = await bulk(rep, { dealIds: [own, others, late], action: { kind: "move", to: "bills_in" } });
    expect(answer.results.map((r) => r.outcome)).toEqual(["moved", "refused", "refused"]);
    expect(answer.results[1].message).toBe("Deal not found.");
    expect(answer.results[2].message).toMatch(/^Your role can move deals only between/);
    expect((await dealRow(others)).stage).toBe("lead");
  });
});

describe("bulk reassignment", () => {
  it("gives the deals a new owner with an owner.changed event, skipping those already theirs", async () => {
    const a = await newDeal(owner, "designing", { name: "Ashgrove household", owner: rep });
    const b = await newDeal(owner, "lead", { name: "Birchgrove household", owner: null });
    const c = await newDeal(owner, "lead", { name: "Cedargrove household", owner: rep2 });
    const foreign = await newDeal(stranger, "lead");
    const answer = await bulk(office, { dealIds: [a, b, c, foreign], action: { kind: "reassign", ownerUserId: rep2.userId } });
    expect(answer.results.map((r) => r.outcome)).toEqual(["reassigned", "reassigned", "unchanged", "refused"]);
    expect(answer).toMatchObject({ done: 2, refused: 1 });
    expect((await dealRow(a)).ownerUserId).toBe(rep2.userId);
    expect((await dealRow(b)).ownerUserId).toBe(rep2.userId);
    expect((await dealRow(foreign)).ownerUserId).toBe(stranger.userId);
    const [ev] = await eventsOf(a, "owner.changed");
    expect(ev).toMatchObject({
      actorUserId: office.userId,
      summary: "Opal Office reassigned Ashgrove household from Reed Rep to Rhea Rep",
      data: { fromUserId: rep.userId, toUserId: rep2.userId },
    });
    expect((await eventsOf(b, "owner.changed"))[0].summary).toBe("Opal Office reassigned Birchgrove household from no one to Rhea Rep");
    expect(await eventsOf(c, "owner.changed")).toHaveLength(0);
  });

  it("reassigns only to an active seller of the company, and only the office may", async () => {
    const d = await newDeal(owner, "lead", { owner: rep });
    const invalid = async (ownerUserId: string) => {
      const err = await rejects(bulk(office, { dealIds: [d], action: { kind: "reassign", ownerUserId } }), 422);
      expect(err.fields).toHaveProperty(["action.ownerUserId"]);
    };
    await invalid(crew.userId);
    await invalid(stranger.userId);
    await invalid(crypto.randomUUID());
    const gone = await addMember(owner, "sales_rep", "Gone Rep");
    await db().update(membership).set({ status: "deactivated" }).where(eq(membership.id, gone.membershipId));
    await invalid(gone.userId);
    await rejects(bulk(rep, { dealIds: [d], action: { kind: "reassign", ownerUserId: rep2.userId } }), 403);
    expect((await dealRow(d)).ownerUserId).toBe(rep.userId);
    expect(await eventsOf(d, "owner.changed")).toHaveLength(0);
    // An office manager may own deals too.
    expect((await bulk(owner, { dealIds: [d], action: { kind: "reassign", ownerUserId: office.userId } })).results[0].outcome).toBe("reassigned");
  });
});

describe("bulk input", () => {
  it("takes 1 to 200 deal ids and a known action", () => {
    const ids = (n: number) => Array.from({ length: n }, () => crypto.randomUUID());
    expect(dealBulkSchema.safeParse({ dealIds: ids(BULK_MAX_DEALS), action: { kind: "move", to: "survey" } }).success).toBe(true);
    expect(dealBulkSchema.safeParse({ dealIds: ids(BULK_MAX_DEALS + 1), action: { kind: "move", to: "survey" } }).success).toBe(false);
    expect(dealBulkSchema.safeParse({ dealIds: [], action: { kind: "move", to: "survey" } }).success).toBe(false);
    expect(dealBulkSchema.safeParse({ dealIds: ["nope"], action: { kind: "move", to: "survey" } }).success).toBe(false);
    expect(dealBulkSchema.safeParse({ dealIds: ids(1), action: { kind: "delete" } }).success).toBe(false);
    expect(dealBulkSchema.safeParse({ dealIds: ids(1), action: { kind: "move", to: "paid" } }).success).toBe(false);
    expect(dealBulkSchema.safeParse({ dealIds: ids(1), action: { kind: "reassign", ownerUserId: "x" } }).success).toBe(false);
  });
});
