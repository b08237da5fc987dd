// The job's workflow rules through the real route handlers on a real MariaDB:
// 8. a cancelled deal cancels its job (frozen, out of the crew's feed, Today and the Jobs list,
//    every change refused with the reason), no install inside the buyer's right-to-cancel
//    window, and no cancellation once the work is done;
// 9. planned dates never move a deal; records of what happened do (never after the company's
//    today); a crew cannot mark a job installed before its install date (the office confirms with
//    a reason, on the Timeline); an inspection before the installation is refused.
import { and, asc, eq } from "drizzle-orm";
import ICAL from "ical.js";
import { NextRequest } from "next/server";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { deal, household, job, proposal, timelineEvent, type Stage } from "@/db/schema";
import { env } from "@/env";
import type { MailFake } from "@/fakes/mail-server";
import { addDaysToDate } from "@/lib/zoned-time";
import type { Member } from "@/server/session";
import { addMember } from "../support/fixtures";
import { signedInHeaders } from "../support/sign-in";
import { client, latestCode, latestToken, newDeal, newWorld, signatureDataUrl, startMailIfNeeded, type World } from "../proposals/support";

let fake: MailFake | null = null;
let w: World;
let installer: Member;
let crewId: string;
let feedToken: string;
let png: string;
let today: string;

type Mods = {
  db: typeof import("@/server/db");
  jobs: typeof import("@/server/jobs");
  proposals: typeof import("@/server/proposals");
  signing: typeof import("@/server/signing");
  today: typeof import("@/server/today");
  jobRoute: typeof import("@/app/api/jobs/[id]/route");
  jobsRoute: typeof import("@/app/api/jobs/route");
  installedRoute: typeof import("@/app/api/jobs/[id]/installed/route");
  checklistRoute: typeof import("@/app/api/jobs/[id]/checklist/route");
  calendarRoute: typeof import("@/app/api/calendar/[token]/route");
  cancelRoute: typeof import("@/app/api/public/proposals/[token]/cancel/route");
};
let m: Mods;

const headers = new Map<string, Record<string, string>>();
async function as(member: Member): Promise<Record<string, string>> {
  if (!headers.has(member.userId)) headers.set(member.userId, await signedInHeaders(member));
  return headers.get(member.userId)!;
}

type Answer = { status: number; body: { data?: unknown; error?: { code: string; message: string; fields?: Record<string, string[]> } } };
async function answer(res: Response): Promise<Answer> {
  return { status: res.status, body: (await res.json()) as Answer["body"] };
}
const jsonReq = async (member: Member, method: string, url: string, body?: unknown) =>
  new NextRequest(`http://localhost${url}`, { method, headers: { ...(await as(member)), "content-type": "application/json" }, body: body === undefined ? undefined : JSON.stringify(body) });
const params = <T>(p: T) => ({ params: Promise.resolve(p) });

const patchJob = async (member: Member, jobId: string, fields: Record<string, unknown>) => answer(await m.jobRoute.PATCH(await jsonReq(member, "PATCH", `/api/jobs/${jobId}`, fields), params({ id: jobId })));
const getJob = async (member: Member, jobId: string) => answer(await m.jobRoute.GET(await jsonReq(member, "GET", `/api/jobs/${jobId}`), params({ id: jobId })));
const listJobIds = async (member: Member) => ((await answer(await m.jobsRoute.GET(await jsonReq(member, "GET", "/api/jobs"), params({})))).body.data as { id: string }[]).map((j) => j.id);
const markInstalled = async (member: Member, jobId: string, body: unknown = {}) => answer(await m.installedRoute.POST(await jsonReq(member, "POST", `/api/jobs/${jobId}/installed`, body), params({ id: jobId })));
const tick = async (member: Member, jobId: string, itemId: string) => answer(await m.checklistRoute.PATCH(await jsonReq(member, "PATCH", `/api/jobs/${jobId}/checklist`, { itemId, done: true }), params({ id: jobId })));
const cancelByBuyer = async (token: string) =>
  answer(
    await m.cancelRoute.POST(new NextRequest(`http://localhost/api/public/proposals/${token}/cancel`, { method: "POST", headers: { origin: env().APP_URL, "content-type": "application/json" } }), params({ token })),
  );

async function feedUids(): Promise<string[]> {
  const res = await m.calendarRoute.GET(new NextRequest(`http://localhost/api/calendar/${feedToken}`), params({ token: feedToken }));
  expect(res.status).toBe(200);
  return new ICAL.Component(ICAL.parse(await res.text())).getAllSubcomponents("vevent").map((c) => String(c.getFirstPropertyValue("uid")));
}

async function stageOf(dealId: string): Promise<Stage> {
  const [row] = await m.db.db().select({ stage: deal.stage }).from(deal).where(eq(deal.id, dealId));
  return row.stage;
}

async function timeline(dealId: string, kind: string) {
  const rows = await m.db.db().select().from(timelineEvent).where(and(eq(timelineEvent.dealId, dealId), eq(timelineEvent.kind, kind))).orderBy(asc(timelineEvent.createdAt));
  return rows;
}

/**
 * A deal signed at home today (the buyer's window open) whose deposit is paid: the job is opened
 * the way the deposit's webhook opens it (createJobForDeal in the payment's transaction, the deal
 * moved to Deposit paid), with the crew assigned.
 */
async function signedJob(): Promise<{ dealId: string; jobId: string; token: string; proposalId: string; windowEnd: string }> {
  const d = await newDeal(w);
  const sent = await m.proposals.sendProposal(w.rep, { dealId: d.dealId, toEmail: d.email, inHomeSale: true });
  const token = await latestToken(d.email);
  const load = async () => (await m.proposals.findProposalByToken(token))!;
  await m.signing.sendSigningCode(await load(), token, client);
  const session = (await m.signing.verifySigningCode(await load(), { code: await latestCode(d.email) }, client)).session;
  const signed = await m.signing.signProposal(await load(), token, { position: 1, signerName: "Tess Testwell", consent: true, signaturePng: png }, client, session);
  const jobId = await m.db.db().transaction(async (tx) => {
    await tx.update(deal).set({ stage: "deposit_paid" }).where(eq(deal.id, d.dealId));
    return m.jobs.createJobForDeal(tx, { companyId: w.owner.companyId, dealId: d.dealId, proposalId: sent.id });
  });
  expect((await patchJob(w.office, jobId, { crewId })).status).toBe(200);
  return { dealId: d.dealId, jobId, token, proposalId: sent.id, windowEnd: signed.cancelDeadline! };
}

/** A job of a deal at `stage` with no agreement behind it (so no buyer's window), for the date rules. */
async function plainJob(stage: Stage, name: string): Promise<{ dealId: string; jobId: string }> {
  const householdId = crypto.randomUUID();
  const dealId = crypto.randomUUID();
  await m.db.db().insert(household).values({ id: householdId, companyId: w.owner.companyId, name, street: "9 Ridge Way", city: "Testville", region: "NC", postalCode: "27000", latitude: 36.05, longitude: -79.8 });
  await m.db.db().insert(deal).values({ id: dealId, companyId: w.owner.companyId, householdId, ownerUserId: w.rep.userId, stage });
  const jobId = await m.db.db().transaction((tx) => m.jobs.createJobForDeal(tx, { companyId: w.owner.companyId, dealId, proposalId: null }));
  expect((await patchJob(w.office, jobId, { crewId })).status).toBe(200);
  return { dealId, jobId };
}

beforeAll(async () => {
  fake = await startMailIfNeeded();
  m = {
    db: await import("@/server/db"),
    jobs: await import("@/server/jobs"),
    proposals: await import("@/server/proposals"),
    signing: await import("@/server/signing"),
    today: await import("@/server/today"),
    jobRoute: await import("@/app/api/jobs/[id]/route"),
    jobsRoute: await import("@/app/api/jobs/route"),
    installedRoute: await import("@/app/api/jobs/[id]/installed/route"),
    checklistRoute: await import("@/app/api/jobs/[id]/checklist/route"),
    calendarRoute: await import("@/app/api/calendar/[token]/route"),
    cancelRoute: await import("@/app/api/public/proposals/[token]/cancel/route"),
  };
  w = await newWorld("Workflow Rules Solar");
  png = await signatureDataUrl();
  const crews = await import("@/server/crews");
  const checklists = await import("@/server/checklists");
  await checklists.createChecklistTemplate(w.owner, { name: "Standard install", items: [{ id: "", label: "Roof attachments flashed" }] });
  installer = await addMember(w.owner, "crew", "Ira Installer");
  crewId = (await crews.createCrew(w.office, { name: "Rules Crew" })).id;
  await crews.updateCrew(w.office, crewId, { memberIds: [installer.membershipId] });
  feedToken = (await crews.getCrewOrThrow(w.office, crewId)).feedUrl.split("/").pop()!;
  today = await m.jobs.companyToday(w.owner.companyId);
}, 180_000);

afterAll(async () => {
  await fake?.close();
});

describe("8. cancelling cancels everything", () => {
  it("the buyer's cancellation cancels the job in the same transaction: frozen, out of the feed, Today and the Jobs list, every change refused with the reason", async () => {
    const x = await signedJob();
    const surveyOn = addDaysToDate(today, 1);
    expect((await patchJob(w.office, x.jobId, { surveyDate: surveyOn, notes: "Side gate" })).status).toBe(200);
    expect(await feedUids()).toContain(`job-${x.jobId}-survey@kilowright`);
    expect(await listJobIds(installer)).toContain(x.jobId);
    expect(await listJobIds(w.office)).toContain(x.jobId);

    const cancelled = await cancelByBuyer(x.token);
    expect(cancelled.status).toBe(200);
    expect(await stageOf(x.dealId)).toBe("cancelled");

    const [row] = await m.db.db().select().from(job).where(eq(job.id, x.jobId));
    expect(row.cancelledAt).not.toBeNull();
    expect(row.cancelReason).toMatch(/^the buyer cancelled P-\d+ v\d+ on \w+day, \w+ \d{1,2}, \d{4}, inside the right-to-cancel window$/);
    // Frozen, not cleared: the record of what was booked stays.
    expect([row.crewId, row.surveyDate, row.notes]).toEqual([crewId, surveyOn, "Side gate"]);
    const events = await timeline(x.dealId, "job.cancelled");
    expect(events).toHaveLength(1);
    // One transaction: the job's event is written with the deal's move and the proposal's.
    const [moved] = (await timeline(x.dealId, "stage.moved")).filter((e) => (e.data as { to: string }).to === "cancelled");
    expect(moved.data).toMatchObject({ automatic: true });

    // Out of the crew's feed (removed, not sent as cancelled), the Jobs list and Today.
    expect((await feedUids()).filter((uid) => uid.includes(x.jobId))).toEqual([]);
    expect(await listJobIds(installer)).not.toContain(x.jobId);
    expect(await listJobIds(w.office)).not.toContain(x.jobId);
    const crewToday = await m.today.getTodayQueues(installer, new Date(`${surveyOn}T15:00:00Z`));
    expect(JSON.stringify(crewToday)).not.toContain(x.jobId);
    const officeToday = await m.today.getTodayQueues(w.office);
    expect(officeToday.jobsToSchedule?.items.map((j) => j.jobId)).not.toContain(x.jobId);

    // Read only, saying why.
    const read = await getJob(w.office, x.jobId);
    expect(read.status).toBe(200);
    expect(read.body.data).toMatchObject({ cancelReason: row.cancelReason });
    const refused = await patchJob(w.office, x.jobId, { surveyDate: addDaysToDate(today, 2) });
    expect(refused.status).toBe(409);
    expect(refused.body.error).toMatchObject({ code: "job_cancelled" });
    expect(refused.body.error!.message).toContain("the buyer cancelled");
    const [item] = row.checklist!;
    expect((await tick(installer, x.jobId, item.id)).body.error?.code).toBe("job_cancelled");
    expect((await markInstalled(w.office, x.jobId, { earlyReason: "Done anyway" })).body.error?.code).toBe("job_cancelled");
    const [after] = await m.db.db().select().from(job).where(eq(job.id, x.jobId));
    expect([after.surveyDate, after.installedAt, after.checklist![0].doneAt]).toEqual([surveyOn, null, null]);
  });

  it("a signed deal put On hold is still the buyer's to cancel: the deal and its job are cancelled", async () => {
    const x = await signedJob();
    await m.db.db().update(deal).set({ stage: "on_hold" }).where(eq(deal.id, x.dealId));
    expect((await cancelByBuyer(x.token)).status).toBe(200);
    expect(await stageOf(x.dealId)).toBe("cancelled");
    const [row] = await m.db.db().select({ cancelledAt: job.cancelledAt }).from(job).where(eq(job.id, x.jobId));
    expect(row.cancelledAt).not.toBeNull();
  });

  it("a cancelled deal reopened and sold again gets its job back, open and afresh for the new sale (notes kept)", async () => {
    const x = await signedJob();
    expect((await patchJob(w.office, x.jobId, { surveyDate: addDaysToDate(today, 1), notes: "Side gate" })).status).toBe(200);
    expect((await cancelByBuyer(x.token)).status).toBe(200);
    // The office reopens the deal, the buyer signs a new proposal and pays its deposit: the
    // deposit's transaction opens the job as it does for any deal.
    const proposalId = (await m.proposals.sendProposal(w.rep, { dealId: x.dealId, toEmail: "again@example.test" })).id;
    expect(proposalId).not.toBe(x.proposalId);
    const jobId = await m.db.db().transaction(async (tx) => {
      await tx.update(deal).set({ stage: "deposit_paid" }).where(eq(deal.id, x.dealId));
      return m.jobs.createJobForDeal(tx, { companyId: w.owner.companyId, dealId: x.dealId, proposalId });
    });
    expect(jobId).toBe(x.jobId);
    const [row] = await m.db.db().select().from(job).where(eq(job.id, jobId));
    expect([row.cancelledAt, row.cancelReason, row.crewId, row.surveyDate, row.proposalId, row.notes]).toEqual([null, null, null, null, proposalId, "Side gate"]);
    expect(row.checklist!.every((i) => i.doneAt === null)).toBe(true);
    expect(await timeline(x.dealId, "job.reopened")).toHaveLength(1);
    // Open again: the office schedules it and it is back on the Jobs list.
    expect((await patchJob(w.office, jobId, { crewId, surveyDate: addDaysToDate(today, 3) })).status).toBe(200);
    expect(await listJobIds(w.office)).toContain(jobId);
  });

  it("no install inside the buyer's window: the route refuses an earlier date with the reason and takes the day after", async () => {
    const x = await signedJob();
    const refused = await patchJob(w.office, x.jobId, { installDate: x.windowEnd });
    expect(refused.status).toBe(422);
    const message = refused.body.error!.fields!.installDate[0];
    expect(message).toContain("The install cannot be booked before the buyer's right to cancel ends");
    const longEnd = new Intl.DateTimeFormat("en-US", { dateStyle: "full", timeZone: "UTC" }).format(new Date(`${x.windowEnd}T12:00:00Z`));
    expect(message).toContain(`runs through ${longEnd}`);
    expect((await getJob(w.office, x.jobId)).body.data).toMatchObject({ installDate: null });
    const ok = await patchJob(w.office, x.jobId, { installDate: addDaysToDate(x.windowEnd, 1) });
    expect(ok.status).toBe(200);
    // Nobody may mark it installed while the window is open, the office included.
    const early = await markInstalled(w.office, x.jobId, { earlyReason: "Crew was nearby" });
    expect(early.status).toBe(409);
    expect(early.body.error).toMatchObject({ code: "inside_cancel_window" });
  });

  it("refuses a cancellation once the system is installed, and changes nothing", async () => {
    const x = await signedJob();
    // Only a hand edit can get here (installs wait for the window): the cancel path refuses anyway.
    await m.db.db().update(job).set({ installedAt: new Date() }).where(eq(job.id, x.jobId));
    await m.db.db().update(deal).set({ stage: "installed" }).where(eq(deal.id, x.dealId));
    const refused = await cancelByBuyer(x.token);
    expect(refused.status).toBe(409);
    expect(refused.body.error).toMatchObject({ code: "work_done" });
    const [p] = await m.db.db().select({ status: proposal.status }).from(proposal).where(eq(proposal.id, x.proposalId));
    expect(p.status).toBe("signed");
    expect(await stageOf(x.dealId)).toBe("installed");
    const [row] = await m.db.db().select({ cancelledAt: job.cancelledAt }).from(job).where(eq(job.id, x.jobId));
    expect(row.cancelledAt).toBeNull();
  });
});

describe("9. dates move a deal when they happen", () => {
  it("planned survey, install and inspection dates move nothing; the survey done today does, on the Timeline as automatic", async () => {
    const { dealId, jobId } = await plainJob("deposit_paid", "Plans household");
    const planned = await patchJob(w.office, jobId, { surveyDate: addDaysToDate(today, 3), installDate: addDaysToDate(today, 30), inspectionOn: addDaysToDate(today, 40) });
    expect(planned.status).toBe(200);
    expect(planned.body.data).toMatchObject({ moved: [] });
    expect(await stageOf(dealId)).toBe("deposit_paid");

    const done = await patchJob(w.office, jobId, { surveyDoneOn: today });
    expect(done.body.data).toMatchObject({ moved: [{ to: "survey" }] });
    const [move] = await timeline(dealId, "stage.moved");
    expect(move.data).toMatchObject({ to: "survey", automatic: true });
  });

  it("a record of what happened cannot be after the company's today (422 naming the day), and moves nothing", async () => {
    const { dealId, jobId } = await plainJob("inspected", "Tomorrow household");
    const tomorrow = addDaysToDate(today, 1);
    const refused = await patchJob(w.office, jobId, { ptoOn: tomorrow });
    expect(refused.status).toBe(422);
    expect(refused.body.error!.fields!.ptoOn[0]).toMatch(/cannot be after today \(\w{3} \d{1,2}, \d{4}\)/);
    expect(await stageOf(dealId)).toBe("inspected");
    expect((await patchJob(w.office, jobId, { permitSubmittedOn: tomorrow })).status).toBe(422);
    const received = await patchJob(w.office, jobId, { ptoOn: today });
    expect(received.body.data).toMatchObject({ moved: [{ to: "live" }] });
  });

  it("a crew cannot mark the job installed before its install date; the office confirms with a reason, on the Timeline", async () => {
    const { dealId, jobId } = await plainJob("install_booked", "Early household");
    const booked = addDaysToDate(today, 4);
    expect((await patchJob(w.office, jobId, { installDate: booked })).status).toBe(200);

    const crewTry = await markInstalled(installer, jobId);
    expect(crewTry.status).toBe(409);
    expect(crewTry.body.error!.code).toBe("install_date_ahead");
    expect(crewTry.body.error!.message).toContain("Ask the office to confirm an early install");
    expect(await stageOf(dealId)).toBe("install_booked");

    const noReason = await markInstalled(w.office, jobId);
    expect(noReason.status).toBe(422);
    expect(noReason.body.error!.fields!.earlyReason[0]).toMatch(/Say why the job was installed before its install date/);

    const confirmed = await markInstalled(w.office, jobId, { earlyReason: "Weather window opened; customer agreed" });
    expect(confirmed.status).toBe(200);
    expect(await stageOf(dealId)).toBe("installed");
    const [installed] = await timeline(dealId, "job.installed");
    expect(installed.summary).toContain("confirmed by the office: Weather window opened; customer agreed");
    expect(installed.data).toMatchObject({ early: true, installDate: booked });
  });

  it("a crew marks the job installed on its install date", async () => {
    const { dealId, jobId } = await plainJob("install_booked", "On-time household");
    expect((await patchJob(w.office, jobId, { installDate: today })).status).toBe(200);
    expect((await markInstalled(installer, jobId)).status).toBe(200);
    expect(await stageOf(dealId)).toBe("installed");
  });

  it("an inspection recorded before the installation is refused with the reason; after it, the deal moves to Inspected", async () => {
    const { dealId, jobId } = await plainJob("install_booked", "Inspection household");
    expect((await patchJob(w.office, jobId, { installDate: addDaysToDate(today, -2) })).status).toBe(200);
    const early = await patchJob(w.office, jobId, { inspectionPassedOn: today });
    expect(early.status).toBe(422);
    expect(early.body.error!.fields!.inspectionPassedOn[0]).toBe("An inspection cannot be recorded before the installation: the crew has not marked this job installed yet.");
    expect(await stageOf(dealId)).toBe("install_booked");

    expect((await markInstalled(installer, jobId)).status).toBe(200);
    const before = await patchJob(w.office, jobId, { inspectionPassedOn: addDaysToDate(today, -1) });
    expect(before.status).toBe(422);
    expect(before.body.error!.fields!.inspectionPassedOn[0]).toMatch(/cannot have passed before the installation on/);
    const passed = await patchJob(w.office, jobId, { inspectionPassedOn: today });
    expect(passed.body.data).toMatchObject({ moved: [{ to: "inspected" }] });
  });
});
