// Jobs against a real MariaDB: creation when the deposit is paid (idempotent), the office's
// dates moving the deal with the Timeline in the same transaction, crews seeing only their own
// jobs, the checklist, photos (content-checked, resized, stored), the crews' calendar feeds
// and tenancy.
import { readdir } from "node:fs/promises";
import path from "node:path";
import { and, asc, eq } from "drizzle-orm";
import ICAL from "ical.js";
import { PDFDocument } from "pdf-lib";
import sharp from "sharp";
import { beforeAll, describe, expect, it } from "vitest";
import { checklistTemplate, deal, household, job, jobPhoto, timelineEvent, type Stage } from "@/db/schema";
import type { Member } from "@/server/session";
import { addMember, newCompany, rejects } from "../support/fixtures";

type Server = {
  jobs: typeof import("@/server/jobs");
  crews: typeof import("@/server/crews");
  checklists: typeof import("@/server/checklists");
  db: typeof import("@/server/db");
  calendarRoute: typeof import("@/app/api/calendar/[token]/route");
};
let s: Server;
let owner: Member;
let office: Member;
let installerA: Member;
let installerB: Member;
let installerNone: Member;
let stranger: Member;
let crewA: string;
let crewB: string;


async function newDeal(by: Member, stage: Stage, name: string): Promise<string> {
  const householdId = crypto.randomUUID();
  const dealId = crypto.randomUUID();
  await s.db.db().insert(household).values({
    id: householdId,
    companyId: by.companyId,
    name,
    contactName: `Pat ${name.split(" ")[0]}`,
    phone: "336-555-0199",
    street: "12 Gable Row",
    city: "Testville",
    region: "NC",
    postalCode: "27000",
    latitude: 36.05,
    longitude: -79.8,
  });
  await s.db.db().insert(deal).values({ id: dealId, companyId: by.companyId, householdId, ownerUserId: by.userId, stage, source: "Referral" });
  return dealId;
}

async function newJob(by: Member, stage: Stage, name: string): Promise<{ dealId: string; jobId: string }> {
  const dealId = await newDeal(by, stage, name);
  const jobId = await s.db.db().transaction((tx) => s.jobs.createJobForDeal(tx, { companyId: by.companyId, dealId, proposalId: null }));
  return { dealId, jobId };
}

async function stageOf(dealId: string): Promise<Stage> {
  const [row] = await s.db.db().select({ stage: deal.stage }).from(deal).where(eq(deal.id, dealId));
  return row.stage;
}

async function events(dealId: string, kind?: string) {
  const rows = await s.db.db().select().from(timelineEvent).where(eq(timelineEvent.dealId, dealId)).orderBy(asc(timelineEvent.createdAt));
  return kind ? rows.filter((r) => r.kind === kind) : rows;
}

async function jobFiles(companyId: string): Promise<string[]> {
  try {
    return await readdir(path.join(process.env.STORAGE_DIR ?? "", companyId, "jobs"));
  } catch {
    return [];
  }
}

async function feed(token: string): Promise<Response> {
  return s.calendarRoute.GET(new Request(`http://localhost/api/calendar/${token}`) as never, { params: Promise.resolve({ token }) });
}

beforeAll(async () => {
  s = {
    jobs: await import("@/server/jobs"),
    crews: await import("@/server/crews"),
    checklists: await import("@/server/checklists"),
    db: await import("@/server/db"),
    calendarRoute: await import("@/app/api/calendar/[token]/route"),
  };
  owner = await newCompany("Jobs Test Solar");
  office = await addMember(owner, "office_manager", "Opal Office");
  installerA = await addMember(owner, "crew", "Ansel Installer");
  installerB = await addMember(owner, "crew", "Bea Installer");
  installerNone = await addMember(owner, "crew", "Nico Newhire");
  stranger = await newCompany("Elsewhere Solar");
  // Two templates: the active one first by name is copied.
  await s.checklists.createChecklistTemplate(owner, { name: "Standard install", items: [{ id: "", label: "Roof attachments flashed" }, { id: "", label: "Rapid shutdown tested" }] });
  const other = await s.checklists.createChecklistTemplate(owner, { name: "Battery add-on", items: [{ id: "", label: "Battery anchored" }] });
  expect(other.active).toBe(false); // only the company's first template starts active
  crewA = (await s.crews.createCrew(office, { name: "Ridge Crew" })).id;
  crewB = (await s.crews.createCrew(office, { name: "Valley Crew" })).id;
  await s.crews.updateCrew(office, crewA, { memberIds: [installerA.membershipId] });
  await s.crews.updateCrew(office, crewB, { memberIds: [installerB.membershipId] });
});

describe("createJobForDeal", () => {
  it("creates one job per deal with the active checklist copied, and returns the same id when called again", async () => {
    const dealId = await newDeal(owner, "deposit_paid", "Ashgrove household");
    const first = await s.db.db().transaction((tx) => s.jobs.createJobForDeal(tx, { companyId: owner.companyId, dealId, proposalId: null }));
    const second = await s.db.db().transaction((tx) => s.jobs.createJobForDeal(tx, { companyId: owner.companyId, dealId, proposalId: null }));
    expect(second).toBe(first);
    const rows = await s.db.db().select().from(job).where(and(eq(job.companyId, owner.companyId), eq(job.dealId, dealId)));
    expect(rows).toHaveLength(1);
    const view = await s.jobs.getJobOrThrow(office, first);
    expect(view.checklist.map((i) => i.label)).toEqual(["Roof attachments flashed", "Rapid shutdown tested"]);
    expect(view.checklist.every((i) => i.doneAt === null && i.doneByUserId === null)).toBe(true);
    expect(await events(dealId, "job.created")).toHaveLength(1);
  });

  it("a rolled-back transaction leaves no job behind", async () => {
    const dealId = await newDeal(owner, "deposit_paid", "Rollback household");
    await expect(
      s.db.db().transaction(async (tx) => {
        await s.jobs.createJobForDeal(tx, { companyId: owner.companyId, dealId, proposalId: null });
        throw new Error("ledger write failed");
      }),
    ).rejects.toThrow("ledger write failed");
    expect(await s.jobs.findJobForDeal(owner.companyId, dealId)).toBeNull();
  });

  it("activating another template makes new jobs copy it, and leaves existing jobs alone", async () => {
    const { jobId: before } = await newJob(owner, "deposit_paid", "Beforehand household");
    const templates = await s.checklists.listChecklistTemplates(owner);
    const battery = templates.find((t) => t.name === "Battery add-on")!;
    const standard = templates.find((t) => t.name === "Standard install")!;
    await s.checklists.updateChecklistTemplate(owner, battery.id, { active: true });
    expect((await s.checklists.getChecklistTemplateOrThrow(owner, standard.id)).active).toBe(false);
    const { jobId: after } = await newJob(owner, "deposit_paid", "Afterward household");
    expect((await s.jobs.getJobOrThrow(office, after)).checklist.map((i) => i.label)).toEqual(["Battery anchored"]);
    expect((await s.jobs.getJobOrThrow(office, before)).checklist).toHaveLength(2);
    await s.checklists.updateChecklistTemplate(owner, standard.id, { active: true });
    const rows = await s.db.db().select().from(checklistTemplate).where(and(eq(checklistTemplate.companyId, owner.companyId), eq(checklistTemplate.active, true)));
    expect(rows.map((r) => r.name)).toEqual(["Standard install"]);
  });
});

describe("office dates move the deal", () => {
  it("survey → permitting → (install date waits for the permit) → install booked → installed → inspected → live, each on the Timeline", async () => {
    const { dealId, jobId } = await newJob(owner, "deposit_paid", "Copperfield household");
    const fields = (f: Parameters<typeof s.jobs.updateJob>[2]) => s.jobs.updateJob(office, jobId, f);

    // The planned survey moves nothing; the survey done does.
    let r = await fields({ surveyDate: "2026-04-02" });
    expect(r.moved).toEqual([]);
    expect(await stageOf(dealId)).toBe("deposit_paid");
    r = await fields({ surveyDoneOn: "2026-04-02" });
    expect(r.moved).toEqual([{ to: "survey" }]);
    expect(await stageOf(dealId)).toBe("survey");

    r = await fields({ permitNumber: "BP-2026-0113", permitSubmittedOn: "2026-04-06" });
    expect(await stageOf(dealId)).toBe("permitting");

    // An install date before the permit's approval is kept, but the deal waits in Permitting.
    r = await fields({ installDate: "2026-05-12", crewId: crewA });
    expect(r.moved).toEqual([]);
    expect(r.job.installDate).toBe("2026-05-12");
    expect(r.job.crewName).toBe("Ridge Crew");
    expect(await stageOf(dealId)).toBe("permitting");

    r = await fields({ permitApprovedOn: "2026-04-28" });
    expect(r.moved).toEqual([{ to: "install_booked" }]);
    expect(await stageOf(dealId)).toBe("install_booked");

    // A planned inspection is not a stage move.
    r = await fields({ inspectionOn: "2026-05-20" });
    expect(r.moved).toEqual([]);
    expect(await stageOf(dealId)).toBe("install_booked");

    await s.jobs.markJobInstalled(installerA, jobId, {}, new Date("2026-05-12T20:00:00Z"));
    expect(await stageOf(dealId)).toBe("installed");

    // The inspection passed moves it; then PTO.
    r = await fields({ inspectionPassedOn: "2026-05-21" });
    expect(r.moved).toEqual([{ to: "inspected" }]);
    r = await fields({ ptoOn: "2026-06-03" });
    expect(r.moved).toEqual([{ to: "live" }]);
    expect(await stageOf(dealId)).toBe("live");

    const moves = await events(dealId, "stage.moved");
    expect(moves.map((m) => (m.data as { to: string }).to)).toEqual(["survey", "permitting", "install_booked", "installed", "inspected", "live"]);
    expect(moves.every((m) => (m.data as { automatic: boolean }).automatic)).toBe(true);
    expect(moves[0].summary).toContain("site survey done on Apr 2, 2026");
    const updates = await events(dealId, "job.updated");
    expect(updates.length).toBe(8);
    expect(updates[3].summary).toContain("crew: Ridge Crew");
  });

  it("refuses an approval before the submission (422) and changes nothing", async () => {
    const { dealId, jobId } = await newJob(owner, "deposit_paid", "Dovetail household");
    await s.jobs.updateJob(office, jobId, { permitSubmittedOn: "2026-04-10" });
    const refused = await rejects(s.jobs.updateJob(office, jobId, { permitApprovedOn: "2026-04-01" }), 422);
    expect(refused.message).toMatch(/approved before it was submitted/);
    expect((await s.jobs.getJobOrThrow(office, jobId)).permitApprovedOn).toBeNull();
    expect(await stageOf(dealId)).toBe("permitting");
  });

  it("never drags a deal backwards: a survey done on a deal already in Permitting moves nothing", async () => {
    const { dealId, jobId } = await newJob(owner, "permitting", "Evergreen household");
    const r = await s.jobs.updateJob(office, jobId, { surveyDoneOn: "2026-03-01" });
    expect(r.moved).toEqual([]);
    expect(await stageOf(dealId)).toBe("permitting");
  });

  it("only the office schedules: an installer is refused (403)", async () => {
    const { jobId } = await newJob(owner, "deposit_paid", "Foxglove household");
    await s.jobs.updateJob(office, jobId, { crewId: crewA });
    await rejects(s.jobs.updateJob(installerA, jobId, { surveyDate: "2026-04-02" }), 403);
  });

  it("refuses another company's crew", async () => {
    const { jobId } = await newJob(owner, "deposit_paid", "Gorse household");
    const foreignCrew = await s.crews.createCrew(stranger, { name: "Far Crew" });
    await rejects(s.jobs.updateJob(office, jobId, { crewId: foreignCrew.id }), 422);
  });
});

describe("crews see only their own jobs", () => {
  it("lists and reads by id only the crew's jobs; an installer without a crew sees none", async () => {
    const a = await newJob(owner, "install_booked", "Hawthorn household");
    const b = await newJob(owner, "install_booked", "Ivybridge household");
    await s.jobs.updateJob(office, a.jobId, { crewId: crewA, installDate: "2030-01-10" });
    await s.jobs.updateJob(office, b.jobId, { crewId: crewB, installDate: "2030-01-11" });

    const listA = await s.jobs.listJobs(installerA);
    expect(listA.map((j) => j.id)).toContain(a.jobId);
    expect(listA.map((j) => j.id)).not.toContain(b.jobId);
    expect(listA.every((j) => j.crewId === crewA)).toBe(true);
    const listB = await s.jobs.listJobs(installerB);
    expect(listB.map((j) => j.id)).toContain(b.jobId);
    expect(listB.map((j) => j.id)).not.toContain(a.jobId);
    expect(await s.jobs.listJobs(installerNone)).toEqual([]);

    await rejects(s.jobs.getJobOrThrow(installerA, b.jobId), 404);
    await rejects(s.jobs.getJobPacket(installerA, b.jobId), 404);
    await rejects(s.jobs.setChecklistItem(installerA, b.jobId, { itemId: "x", done: true }), 404);
    await rejects(s.jobs.markJobInstalled(installerA, b.jobId), 404);
    await rejects(s.jobs.listJobPhotos(installerA, b.jobId), 404);
    const packet = await s.jobs.getJobPacket(installerA, a.jobId);
    expect(packet.customer.name).toBe("Hawthorn household");
    expect(packet.site.mapUri).toMatch(/^geo:36\.05,-79\.8\?q=12%20Gable%20Row/);

    // The office sees both.
    const all = (await s.jobs.listJobs(office)).map((j) => j.id);
    expect(all).toEqual(expect.arrayContaining([a.jobId, b.jobId]));
  });

  it("orders a crew's jobs today first, then this week, then later", async () => {
    const now = new Date("2031-03-10T15:00:00Z");
    const later = await newJob(owner, "install_booked", "Juniper household");
    const today = await newJob(owner, "install_booked", "Kestrel household");
    const week = await newJob(owner, "survey", "Larch household");
    await s.jobs.updateJob(office, later.jobId, { crewId: crewA, installDate: "2031-04-01" });
    await s.jobs.updateJob(office, today.jobId, { crewId: crewA, installDate: "2031-03-10" });
    await s.jobs.updateJob(office, week.jobId, { crewId: crewA, surveyDate: "2031-03-13" });
    const list = (await s.jobs.listJobs(installerA, now)).filter((j) => [later.jobId, today.jobId, week.jobId].includes(j.id));
    expect(list.map((j) => [j.householdName, j.bucket])).toEqual([
      ["Kestrel household", "today"],
      ["Larch household", "week"],
      ["Juniper household", "later"],
    ]);
  });

  it("moving an installer to another crew changes what they see; only installers can join", async () => {
    const c = await s.crews.createCrew(office, { name: "Summit Crew" });
    await rejects(s.crews.updateCrew(office, c.id, { memberIds: [office.membershipId] }), 422);
    await rejects(s.crews.updateCrew(office, c.id, { memberIds: [stranger.membershipId] }), 422);
    await s.crews.updateCrew(office, c.id, { memberIds: [installerNone.membershipId] });
    expect((await s.crews.getCrewOrThrow(office, c.id)).members.map((m) => m.name)).toEqual(["Nico Newhire"]);
    await s.crews.updateCrew(office, crewA, { memberIds: [installerA.membershipId, installerNone.membershipId] });
    expect((await s.crews.getCrewOrThrow(office, c.id)).members).toEqual([]);
    expect((await s.jobs.listJobs(installerNone)).every((j) => j.crewId === crewA)).toBe(true);
    await s.crews.updateCrew(office, crewA, { memberIds: [installerA.membershipId] });
    expect(await s.jobs.listJobs(installerNone)).toEqual([]);
  });
});

describe("checklist and installed", () => {
  it("ticks and unticks an item with who and when", async () => {
    const { jobId } = await newJob(owner, "install_booked", "Marigold household");
    await s.jobs.updateJob(office, jobId, { crewId: crewA });
    const [first] = (await s.jobs.getJobOrThrow(installerA, jobId)).checklist;
    let items = await s.jobs.setChecklistItem(installerA, jobId, { itemId: first.id, done: true });
    expect(items[0].doneByUserId).toBe(installerA.userId);
    expect(Date.parse(items[0].doneAt ?? "")).toBeGreaterThan(Date.now() - 60_000);
    expect((await s.jobs.getJobOrThrow(office, jobId)).checklist[0].doneAt).toBe(items[0].doneAt);
    items = await s.jobs.setChecklistItem(installerA, jobId, { itemId: first.id, done: false });
    expect(items[0]).toMatchObject({ doneAt: null, doneByUserId: null });
    await rejects(s.jobs.setChecklistItem(installerA, jobId, { itemId: "not-an-item", done: true }), 422);
  });

  it("marking installed twice records one event", async () => {
    const { dealId, jobId } = await newJob(owner, "install_booked", "Nettle household");
    await s.jobs.updateJob(office, jobId, { crewId: crewA, installDate: "2026-11-30" });
    const first = await s.jobs.markJobInstalled(installerA, jobId);
    const second = await s.jobs.markJobInstalled(installerA, jobId);
    expect(second.installedAt?.getTime()).toBe(first.installedAt?.getTime());
    expect(await events(dealId, "job.installed")).toHaveLength(1);
    expect(await stageOf(dealId)).toBe("installed");
  });
});

describe("photos", () => {
  it("stores a real JPEG resized to 2048 px on its long side, and refuses a text file named .jpg storing nothing", async () => {
    const { dealId, jobId } = await newJob(owner, "install_booked", "Oakmoss household");
    await s.jobs.updateJob(office, jobId, { crewId: crewA });
    const jpeg = await sharp({ create: { width: 3000, height: 2000, channels: 3, background: { r: 181, g: 84, b: 45 } } }).jpeg().toBuffer();
    const filesBefore = await jobFiles(owner.companyId);

    const photo = await s.jobs.addJobPhoto(installerA, jobId, { bytes: new Uint8Array(jpeg), caption: "Array, south face" });
    expect(photo).toMatchObject({ jobId, mimeType: "image/jpeg", widthPx: 2048, heightPx: 1365, caption: "Array, south face", uploadedByName: "Ansel Installer" });
    const stored = await s.jobs.getJobPhotoFile(installerA, photo.id);
    const meta = await sharp(Buffer.from(stored.bytes)).metadata();
    expect([meta.format, meta.width, meta.height]).toEqual(["jpeg", 2048, 1365]);
    expect(stored.bytes.byteLength).toBe(photo.sizeBytes);
    expect(await jobFiles(owner.companyId)).toEqual(expect.arrayContaining([...filesBefore, `${photo.id}.jpg`]));
    expect(await events(dealId, "job.photo")).toHaveLength(1);

    // A small PNG stays its size and becomes JPEG.
    const png = await sharp({ create: { width: 300, height: 400, channels: 4, background: { r: 0, g: 0, b: 0, alpha: 1 } } }).png().toBuffer();
    const small = await s.jobs.addJobPhoto(installerA, jobId, { bytes: new Uint8Array(png), caption: "" });
    expect([small.widthPx, small.heightPx, small.mimeType, small.caption]).toEqual([300, 400, "image/jpeg", null]);

    const rowsBefore = await s.db.db().select().from(jobPhoto).where(eq(jobPhoto.jobId, jobId));
    const filesMid = await jobFiles(owner.companyId);
    const text = new TextEncoder().encode("This is not a photo, just text saved as roof.jpg\n");
    const refused = await rejects(s.jobs.addJobPhoto(installerA, jobId, { bytes: text, caption: "" }), 422);
    expect(refused.message).toMatch(/JPEG, PNG or WebP/);
    // A PDF is recognised and refused by name.
    const pdf = new TextEncoder().encode("%PDF-1.4\n1 0 obj<<>>endobj\ntrailer<<>>\n%%EOF\n");
    expect((await rejects(s.jobs.addJobPhoto(installerA, jobId, { bytes: pdf, caption: "" }), 422)).message).toMatch(/PDF/);
    // A JPEG cut short after its header is refused too.
    await rejects(s.jobs.addJobPhoto(installerA, jobId, { bytes: new Uint8Array(jpeg.subarray(0, 200)), caption: "" }), 422);
    expect(await s.db.db().select().from(jobPhoto).where(eq(jobPhoto.jobId, jobId))).toHaveLength(rowsBefore.length);
    expect((await jobFiles(owner.companyId)).sort()).toEqual(filesMid.sort());

    // Another crew cannot read it.
    await rejects(s.jobs.getJobPhotoOrThrow(installerB, photo.id), 404);
    await rejects(s.jobs.getJobPhotoFile(installerB, photo.id), 404);
  });
});

describe("the packet as a PDF", () => {
  it("carries the customer, the schedule, the checklist with ticks, the cautions and the photos, on framed pages", async () => {
    const { jobId } = await newJob(owner, "install_booked", "Sorrel household");
    await s.jobs.updateJob(office, jobId, { crewId: crewA, installDate: "2031-06-09", permitNumber: "BP-77", notes: "Ladder on the east side." });
    // The survey was planned for one day and done the next: the crew reads both.
    await s.jobs.updateJob(office, jobId, { surveyDate: "2031-05-19", surveyDoneOn: "2031-05-20" }, new Date("2031-06-01T12:00:00Z"));
    const [first] = (await s.jobs.getJobOrThrow(installerA, jobId)).checklist;
    await s.jobs.setChecklistItem(installerA, jobId, { itemId: first.id, done: true });
    const jpeg = await sharp({ create: { width: 800, height: 600, channels: 3, background: { r: 90, g: 120, b: 100 } } }).jpeg().toBuffer();
    await s.jobs.addJobPhoto(installerA, jobId, { bytes: new Uint8Array(jpeg), caption: "Main panel" });

    const { bytes, fileName } = await s.jobs.getJobPacketPdf(installerA, jobId, new Date("2031-06-01T12:00:00Z"));
    expect(fileName).toBe("job-packet-sorrel-household.pdf");
    const doc = await PDFDocument.load(bytes);
    expect(doc.getPageCount()).toBeGreaterThanOrEqual(1);
    expect(doc.getTitle()).toBe("Job packet for Sorrel household");
    const { extractText, getDocumentProxy } = await import("unpdf");
    const { text } = await extractText(await getDocumentProxy(new Uint8Array(bytes)), { mergePages: true });
    for (const expected of ["Job packet: Sorrel household", "Pat Sorrel", "336-555-0199", "12 Gable Row", "BP-77", "Ladder on the east side.", "Install checklist", "Rapid shutdown tested", "licensed professional", "Main panel", "Jobs Test Solar", "page 1 of"]) {
      expect(text).toContain(expected);
    }
    expect(text).toMatch(/done Jun 1, 2031|done [A-Z][a-z]{2} \d{1,2}, \d{4}/);
    expect(text).toContain("Printed Jun 1, 2031, 8:00 AM EDT"); // the company's clock (New York), not UTC
    expect(text).toMatch(/Site survey\s+done Tue, May 20, 2031 \(planned Mon, May 19, 2031\)/);
    // Same input, same bytes.
    const again = await s.jobs.getJobPacketPdf(installerA, jobId, new Date("2031-06-01T12:00:00Z"));
    expect(Buffer.from(again.bytes).equals(Buffer.from(bytes))).toBe(true);
    await rejects(s.jobs.getJobPacketPdf(installerB, jobId), 404);
  });
});

describe("calendar feeds", () => {
  it("parses with ical.js and lists only the crew's visits, with stable UIDs and links", async () => {
    const a = await newJob(owner, "survey", "Primrose household");
    const b = await newJob(owner, "survey", "Quince household");
    const soon = new Date(Date.now() + 3 * 86_400_000).toISOString().slice(0, 10);
    await s.jobs.updateJob(office, a.jobId, { crewId: crewA, surveyDate: soon, installDate: "2031-05-02" });
    await s.jobs.updateJob(office, b.jobId, { crewId: crewB, surveyDate: soon });
    const crew = await s.crews.getCrewOrThrow(office, crewA);
    const token = crew.feedUrl.split("/").pop()!;
    expect(token).toMatch(/^[A-Za-z0-9_-]{43}$/);

    const res = await feed(token);
    expect(res.status).toBe(200);
    expect(res.headers.get("content-type")).toMatch(/^text\/calendar/);
    const text = await res.text();
    const vcal = new ICAL.Component(ICAL.parse(text));
    const vevents = vcal.getAllSubcomponents("vevent").map((c) => new ICAL.Event(c));
    const summaries = vevents.map((e) => e.summary);
    expect(summaries).toEqual(expect.arrayContaining(["Site survey: Primrose household", "Install: Primrose household"]));
    expect(summaries.some((x) => x.includes("Quince"))).toBe(false);
    const install = vevents.find((e) => e.summary === "Install: Primrose household")!;
    expect(install.startDate.isDate).toBe(true);
    expect(install.startDate.toString()).toBe("2031-05-02");
    expect(install.uid).toBe(`job-${a.jobId}-install@kilowright`);
    expect(install.location).toContain("12 Gable Row, Testville, NC 27000");
    expect(install.component.getFirstPropertyValue("url")).toBe(`${process.env.APP_URL}/jobs/${a.jobId}`);
    // The same feed twice: the same UIDs.
    const again = new ICAL.Component(ICAL.parse(await (await feed(`${token}.ics`)).text()));
    expect(again.getAllSubcomponents("vevent").map((c) => c.getFirstPropertyValue("uid")).sort()).toEqual(vevents.map((e) => e.uid).sort());
  });

  it("rotating the token makes the old URL 404; an unknown token is 404", async () => {
    const before = await s.crews.getCrewOrThrow(office, crewB);
    const oldToken = before.feedUrl.split("/").pop()!;
    expect((await feed(oldToken)).status).toBe(200);
    const after = await s.crews.rotateCrewFeed(office, crewB);
    const newToken = after.feedUrl.split("/").pop()!;
    expect(newToken).not.toBe(oldToken);
    const gone = await feed(oldToken);
    expect(gone.status).toBe(404);
    expect((await gone.json()).error.code).toBe("not_found");
    expect((await feed(newToken)).status).toBe(200);
    expect((await feed("nope")).status).toBe(404);
  });
});

describe("the customer's project page", () => {
  it("shows the stage and the next step with its date from the job, and nothing internal", async () => {
    const { nextStep } = await import("@/app/p/[token]/project-panel");
    const { dealId, jobId } = await newJob(owner, "deposit_paid", "Tansy household");
    const now = new Date("2031-07-01T15:00:00Z");
    let progress = (await s.jobs.getProjectProgress(owner.companyId, dealId, now))!;
    expect(progress.stage).toBe("deposit_paid");
    expect(nextStep(progress, "Jobs Test Solar")).toMatchObject({ title: "Site survey", date: null });

    await s.jobs.updateJob(office, jobId, { surveyDate: "2031-07-03", notes: "Internal: customer haggled hard", permitNumber: "SECRET-1" }, now);
    progress = (await s.jobs.getProjectProgress(owner.companyId, dealId, now))!;
    expect(progress.stage).toBe("deposit_paid"); // a planned survey is a plan
    expect(nextStep(progress, "Jobs Test Solar")).toMatchObject({ title: "Site survey", date: "2031-07-03" });
    expect(JSON.stringify(progress)).not.toMatch(/haggled|SECRET|Opal/);

    await s.jobs.updateJob(office, jobId, { surveyDoneOn: "2031-07-03", permitSubmittedOn: "2031-07-05", installDate: "2031-07-20" }, new Date("2031-07-10T15:00:00Z"));
    progress = (await s.jobs.getProjectProgress(owner.companyId, dealId, new Date("2031-07-10T15:00:00Z")))!;
    expect(nextStep(progress, "Jobs Test Solar")).toMatchObject({ title: "Installation (planned)", date: "2031-07-20" });
    await s.jobs.updateJob(office, jobId, { permitApprovedOn: "2031-07-12" }, new Date("2031-07-13T15:00:00Z"));
    progress = (await s.jobs.getProjectProgress(owner.companyId, dealId, new Date("2031-07-13T15:00:00Z")))!;
    expect(progress.stage).toBe("install_booked");
    expect(nextStep(progress, "Jobs Test Solar")).toMatchObject({ title: "Installation", date: "2031-07-20" });
  });
});

describe("tenancy", () => {
  it("another company's job, photo, crew and checklist are not found", async () => {
    const { jobId } = await newJob(owner, "install_booked", "Rowan household");
    await s.jobs.updateJob(office, jobId, { crewId: crewA });
    const png = await sharp({ create: { width: 10, height: 10, channels: 3, background: { r: 1, g: 2, b: 3 } } }).png().toBuffer();
    const photo = await s.jobs.addJobPhoto(office, jobId, { bytes: new Uint8Array(png), caption: "" });
    await rejects(s.jobs.getJobOrThrow(stranger, jobId), 404);
    await rejects(s.jobs.updateJob(stranger, jobId, { surveyDate: "2026-01-01" }), 404);
    await rejects(s.jobs.setChecklistItem(stranger, jobId, { itemId: "x", done: true }), 404);
    await rejects(s.jobs.addJobPhoto(stranger, jobId, { bytes: new Uint8Array(png), caption: "" }), 404);
    await rejects(s.jobs.getJobPhotoOrThrow(stranger, photo.id), 404);
    await rejects(s.crews.getCrewOrThrow(stranger, crewA), 404);
    await rejects(s.crews.rotateCrewFeed(stranger, crewA), 404);
    const [template] = await s.checklists.listChecklistTemplates(owner);
    await rejects(s.checklists.getChecklistTemplateOrThrow(stranger, template.id), 404);
    await rejects(s.checklists.updateChecklistTemplate(stranger, template.id, { active: false }), 404);
    expect(await s.jobs.listJobs(stranger)).toEqual([]);
  });
});
