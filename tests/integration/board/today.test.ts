// Each person's Today against a real MariaDB: a rep's follow-ups, opened proposals and
// customers' questions; the office's stalled deals (by the company's limits), flagged deposits,
// refunds due and jobs to schedule; a crew member's visits today and this week. Company-scoped.
import { eq, sql } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { company, crew, job, membership, payment, proposal, proposalEvent } from "@/db/schema";
import { DEFAULT_STALL_SETTINGS, storedCompanySettingsSchema } from "@/lib/schemas/company-settings";
import { db } from "@/server/db";
import type { Member } from "@/server/session";
import { addDaysToDate, todayInZone } from "@/lib/zoned-time";
import { getTodayQueues, getTodaySummary } from "@/server/today";
import { addMember, newCompany } from "../support/fixtures";
import { newDeal } from "./support";

let owner: Member;
let office: Member;
let rep: Member;
let rep2: Member;
let installer: Member;
let otherInstaller: Member;
let stranger: Member;
let proposalNumber = 1;

async function newProposal(by: Member, dealId: string, p: Partial<typeof proposal.$inferInsert> = {}): Promise<string> {
  const id = crypto.randomUUID();
  await db()
    .insert(proposal)
    .values({
      id,
      companyId: by.companyId,
      dealId,
      number: proposalNumber++,
      version: 1,
      snapshot: sql`${JSON.stringify({})}`,
      pdfStorageKey: `proposals/${id}.pdf`,
      pdfSha256: "0".repeat(64),
      tokenHash: crypto.randomUUID().replaceAll("-", "").padEnd(64, "0"),
      expiresAt: new Date(Date.now() + 20 * 86_400_000),
      sentToEmail: "home@example.com",
      ...p,
    });
  return id;
}

async function newPayment(by: Member, dealId: string, p: Partial<typeof payment.$inferInsert>): Promise<string> {
  const proposalId = await newProposal(by, dealId, { status: "signed" });
  const id = crypto.randomUUID();
  await db()
    .insert(payment)
    .values({ id, companyId: by.companyId, dealId, proposalId, checkoutSessionId: `cs_test_${id}`, amountCents: 100_000, ...p });
  return id;
}

async function newCrew(by: Member, name: string): Promise<string> {
  const id = crypto.randomUUID();
  await db().insert(crew).values({ id, companyId: by.companyId, name, feedToken: crypto.randomUUID() });
  return id;
}

async function newJob(by: Member, dealId: string, j: Partial<typeof job.$inferInsert> = {}): Promise<string> {
  const id = crypto.randomUUID();
  await db().insert(job).values({ id, companyId: by.companyId, dealId, ...j });
  return id;
}

const names = (q: { items: { householdName: string }[] } | null) => (q?.items ?? []).map((i) => i.householdName);

beforeAll(async () => {
  owner = await newCompany("Today Solar");
  office = await addMember(owner, "office_manager", "Opal Office");
  rep = await addMember(owner, "sales_rep", "Reed Rep");
  rep2 = await addMember(owner, "sales_rep", "Rhea Rep");
  installer = await addMember(owner, "crew", "Ike Installer");
  otherInstaller = await addMember(owner, "crew", "Oda Installer");
  stranger = await newCompany("Not Today Solar");
  // Stall limits of this company: Lead after 3 days, Designing never, Survey after 10.
  await db()
    .update(company)
    .set({ settings: storedCompanySettingsSchema.parse({ stallDays: { ...DEFAULT_STALL_SETTINGS, lead: 3, designing: null, survey: 10 } }) })
    .where(eq(company.id, owner.companyId));
});

describe("a rep's Today", () => {
  it("lists their own stalled early deals by the company's limits, not others' nor fresh ones", async () => {
    await newDeal(owner, "lead", { name: "Stale lead household", owner: rep, daysAgo: 4 });
    await newDeal(owner, "lead", { name: "Fresh lead household", owner: rep, daysAgo: 3 }); // 3 days = the limit, not over it
    await newDeal(owner, "designing", { name: "Slow design household", owner: rep, daysAgo: 90 }); // never flagged here
    await newDeal(owner, "bills_in", { name: "Old bills household", owner: rep, daysAgo: 8 }); // default 7
    await newDeal(owner, "lead", { name: "Other rep lead household", owner: rep2, daysAgo: 30 });
    await newDeal(owner, "survey", { name: "Late survey household", owner: rep, daysAgo: 11 });
    await newDeal(stranger, "lead", { name: "Stranger lead household", owner: stranger, daysAgo: 30 });

    const q = await getTodayQueues(rep);
    expect(names(q.followUps).sort()).toEqual(["Old bills household", "Stale lead household"]);
    expect(q.followUps?.items.find((d) => d.householdName === "Stale lead household")?.limitDays).toBe(3);
    // Past the early stages, a rep's own stalled deals are listed apart.
    expect(names(q.stalled)).toEqual(["Late survey household"]);
    expect(q.depositsFlagged).toBeNull();
    expect(q.jobsToSchedule).toBeNull();
    expect(q.crew).toBeNull();
  });

  it("lists proposals opened and not signed, and customers' questions, on their own deals only", async () => {
    const opened = await newDeal(owner, "proposal_out", { name: "Opened household", owner: rep });
    const unopened = await newDeal(owner, "proposal_out", { name: "Unopened household", owner: rep });
    const signed = await newDeal(owner, "signed", { name: "Signed household", owner: rep });
    const replaced = await newDeal(owner, "proposal_out", { name: "Replaced household", owner: rep });
    const others = await newDeal(owner, "proposal_out", { name: "Rhea's household", owner: rep2 });
    const openedAt = new Date(Date.now() - 2 * 86_400_000);
    const p1 = await newProposal(owner, opened, { firstOpenedAt: openedAt, lastViewedAt: new Date() });
    await newProposal(owner, unopened);
    await newProposal(owner, signed, { status: "signed", firstOpenedAt: openedAt, signedAt: new Date() });
    await newProposal(owner, replaced, { status: "replaced", firstOpenedAt: openedAt });
    const p5 = await newProposal(owner, others, { firstOpenedAt: openedAt });

    await db()
      .insert(proposalEvent)
      .values([
        { id: crypto.randomUUID(), companyId: owner.companyId, proposalId: p1, kind: "question", body: "Can the panels go on the garage roof instead?" },
        { id: crypto.randomUUID(), companyId: owner.companyId, proposalId: p1, kind: "viewed" },
        { id: crypto.randomUUID(), companyId: owner.companyId, proposalId: p5, kind: "question", body: "Not for Reed" },
        {
          id: crypto.randomUUID(),
          companyId: owner.companyId,
          proposalId: p1,
          kind: "question",
          body: "An old question",
          createdAt: new Date(Date.now() - 40 * 86_400_000),
        },
      ]);

    const q = await getTodayQueues(rep);
    expect(names(q.proposalsOpened)).toEqual(["Opened household"]);
    expect(q.proposalsOpened?.items[0]).toMatchObject({ dealId: opened, proposalId: p1, version: 1 });
    expect(q.questions?.items.map((x) => x.body)).toEqual(["Can the panels go on the garage roof instead?"]);
    expect(q.questions?.items[0].dealId).toBe(opened);

    const theirs = await getTodayQueues(rep2);
    expect(names(theirs.proposalsOpened)).toEqual(["Rhea's household"]);
    expect(theirs.questions?.items.map((x) => x.body)).toEqual(["Not for Reed"]);
  });
});

describe("the office's Today", () => {
  it("lists the company's stalled deals by its limits", async () => {
    const q = await getTodayQueues(office);
    const stalled = names(q.stalled);
    expect(stalled).toEqual(expect.arrayContaining(["Stale lead household", "Other rep lead household", "Late survey household", "Old bills household"]));
    expect(stalled).not.toContain("Fresh lead household");
    expect(stalled).not.toContain("Slow design household");
    expect(stalled).not.toContain("Stranger lead household");
    expect(q.stalled?.total).toBe(stalled.length);
    // Oldest first.
    const times = q.stalled!.items.map((d) => d.stageChangedAt.getTime());
    expect(times).toEqual([...times].sort((a, b) => a - b));
  });

  it("lists flagged deposits and cancelled deals with money still to refund", async () => {
    const flaggedDeal = await newDeal(owner, "signed", { name: "Flagged household" });
    await newPayment(owner, flaggedDeal, { status: "flagged", paidCents: 90_000, flagReason: "Paid 900.00, asked 1,000.00" });
    const cancelled = await newDeal(owner, "cancelled", { name: "Cancelled paid household" });
    await newPayment(owner, cancelled, { status: "paid", paidCents: 100_000 });
    const partly = await newDeal(owner, "cancelled", { name: "Cancelled partly refunded household" });
    await newPayment(owner, partly, { status: "partially_refunded", paidCents: 100_000, refundedCents: 40_000 });
    const done = await newDeal(owner, "cancelled", { name: "Cancelled refunded household" });
    await newPayment(owner, done, { status: "refunded", paidCents: 100_000, refundedCents: 100_000 });
    const unpaid = await newDeal(owner, "cancelled", { name: "Cancelled unpaid household" });
    await newPayment(owner, unpaid, { status: "expired" });
    const live = await newDeal(owner, "deposit_paid", { name: "Paid and going household" });
    await newPayment(owner, live, { status: "paid", paidCents: 100_000 });
    const foreign = await newDeal(stranger, "cancelled", { name: "Foreign cancelled household" });
    await newPayment(stranger, foreign, { status: "paid", paidCents: 100_000 });

    const q = await getTodayQueues(office);
    expect(names(q.depositsFlagged)).toEqual(["Flagged household"]);
    expect(q.depositsFlagged?.items[0].flagReason).toBe("Paid 900.00, asked 1,000.00");
    expect(names(q.refundsDue).sort()).toEqual(["Cancelled paid household", "Cancelled partly refunded household"]);
    expect(q.refundsDue?.items.find((p) => p.dealId === partly)).toMatchObject({ paidCents: 100_000, refundedCents: 40_000 });
    expect((await getTodayQueues(stranger)).refundsDue?.items.map((p) => p.householdName)).toEqual(["Foreign cancelled household"]);
  });

  it("lists jobs without an install date or a crew, not installed ones nor closed deals", async () => {
    const crewId = await newCrew(owner, "Crew Schedule");
    const a = await newDeal(owner, "deposit_paid", { name: "No date household" });
    await newJob(owner, a, { crewId });
    const b = await newDeal(owner, "permitting", { name: "No crew household" });
    await newJob(owner, b, { installDate: "2030-05-01" });
    const c = await newDeal(owner, "install_booked", { name: "Scheduled household" });
    await newJob(owner, c, { installDate: "2030-05-02", crewId });
    const d = await newDeal(owner, "installed", { name: "Installed household" });
    await newJob(owner, d, { installedAt: new Date() });
    const e = await newDeal(owner, "cancelled", { name: "Cancelled job household" });
    await newJob(owner, e);

    const q = await getTodayQueues(office);
    expect(names(q.jobsToSchedule).sort()).toEqual(["No crew household", "No date household"]);
    expect(q.jobsToSchedule?.items.find((j) => j.householdName === "No crew household")).toMatchObject({ installDate: "2030-05-01", hasCrew: false });
    expect((await getTodayQueues(stranger)).jobsToSchedule?.total).toBe(0);
    // Office queues are the office's: a rep has none of them.
    const repQ = await getTodayQueues(rep);
    expect(repQ.refundsDue).toBeNull();
    expect(repQ.jobsToSchedule).toBeNull();
  });
});

describe("a crew member's Today", () => {
  it("lists their crew's surveys, installs and inspections today and in the next six days", async () => {
    const crewA = await newCrew(owner, "Crew A");
    const crewB = await newCrew(owner, "Crew B");
    await db().update(membership).set({ crewId: crewA }).where(eq(membership.id, installer.membershipId));
    await db().update(membership).set({ crewId: crewB }).where(eq(membership.id, otherInstaller.membershipId));
    // A fixed instant: 2026-06-10 15:00 UTC is 11:00 in New York.
    const now = new Date("2026-06-10T15:00:00Z");
    const today = todayInZone("America/New_York", now);
    expect(today).toBe("2026-06-10");

    const d1 = await newDeal(owner, "install_booked", { name: "Install today household" });
    await newJob(owner, d1, { crewId: crewA, installDate: today });
    const d2 = await newDeal(owner, "survey", { name: "Survey later household" });
    await newJob(owner, d2, { crewId: crewA, surveyDate: addDaysToDate(today, 6), inspectionOn: addDaysToDate(today, 7) });
    const d3 = await newDeal(owner, "installed", { name: "Inspection soon household" });
    await newJob(owner, d3, { crewId: crewA, installDate: addDaysToDate(today, -3), inspectionOn: addDaysToDate(today, 2) });
    const d4 = await newDeal(owner, "install_booked", { name: "Crew B household" });
    await newJob(owner, d4, { crewId: crewB, installDate: today });
    const d5 = await newDeal(owner, "cancelled", { name: "Cancelled install household" });
    await newJob(owner, d5, { crewId: crewA, installDate: addDaysToDate(today, 1) });

    const q = await getTodayQueues(installer, now);
    expect(q.today).toBe(today);
    expect(q.crew?.today.map((v) => [v.householdName, v.kind])).toEqual([["Install today household", "install"]]);
    expect(q.crew?.thisWeek.map((v) => [v.householdName, v.kind, v.date])).toEqual([
      ["Inspection soon household", "inspection", "2026-06-12"],
      ["Survey later household", "survey", "2026-06-16"],
    ]);
    expect(q.followUps).toBeNull();
    expect(q.stalled).toBeNull();

    const other = await getTodayQueues(otherInstaller, now);
    expect(other.crew?.today.map((v) => v.householdName)).toEqual(["Crew B household"]);
    expect(other.crew?.thisWeek).toEqual([]);

    // The company's day, not the server's: 02:00 UTC on the 11th is still the 10th in New York.
    expect((await getTodayQueues(installer, new Date("2026-06-11T02:00:00Z"))).crew?.today.map((v) => v.householdName)).toEqual(["Install today household"]);
  });

  it("says so when the installer is on no crew", async () => {
    const loose = await addMember(owner, "crew", "Lou Loose");
    expect((await getTodayQueues(loose)).crew).toEqual({ crewId: null, today: [], thisWeek: [] });
  });
});

describe("summary", () => {
  it("counts by stage in SQL, open deals and the open pipeline, for the person's scope", async () => {
    const s = await getTodaySummary(office);
    const total = Object.values(s.counts).reduce((a, b) => a + b, 0);
    expect(total).toBeGreaterThan(10);
    expect(s.open).toBe(total - s.counts.live - s.counts.lost - s.counts.cancelled);
    expect(s.recent).toHaveLength(5);
    const mine = await getTodaySummary(rep2);
    expect(Object.values(mine.counts).reduce((a, b) => a + b, 0)).toBe(2); // Rhea's lead and proposal
    expect((await getTodaySummary(stranger)).recent.map((d) => d.householdName)).not.toContain("Opened household");
  });
});
