// Demo jobs: two invented crews (Crew North with crew@, Crew South with crew2@), the company's
// install checklist, and a job for every deal from "deposit paid" on, with dates that match its
// stage relative to today in the company's time zone: Crew North installs at the Iwasaki house
// today and surveyed the Galloway house 19 days ago (the deal has waited in Survey since, for its
// permit to be filed: the Board flags it as stalled); Crew South inspects at the Jablonski house
// this week. One job photo (a generated JPEG) and one rep's site photo live in seed storage.
import { createHash, randomBytes } from "node:crypto";
import { and, desc, eq } from "drizzle-orm";
import sharp from "sharp";
import { checklistTemplate, crew, job, jobPhoto, membership, proposal, timelineEvent, upload } from "../../../src/db/schema";
import { DEFAULT_TIME_ZONE } from "../../../src/lib/schemas/company-settings";
import { addDaysToDate, todayInZone } from "../../../src/lib/zoned-time";
import type { ChecklistTemplateItem, JobChecklistItem } from "../../../src/lib/schemas/jobs";
import type { SeedContext } from "../seed-demo";
import { seedStore } from "../seed-files";

export const order = 80;

const uid = (n: number) => `7a11a55e-0000-4000-8000-${String(n).padStart(12, "0")}`;

/** Fixed ids, for tests. */
export const DEMO_CREW_IDS = { north: uid(801), south: uid(802) } as const;
export const DEMO_CHECKLIST_TEMPLATE_ID = uid(811);
export const DEMO_JOB_IDS = {
  fairweather: uid(821),
  galloway: uid(822),
  halvorsen: uid(823),
  iwasaki: uid(824),
  jablonski: uid(825),
  kowalczyk: uid(826),
  lindgren: uid(827),
} as const;
export const DEMO_JOB_PHOTO_ID = uid(841);
export const DEMO_SITE_PHOTO_UPLOAD_ID = uid(851);

/** The install steps, in our own words, in the order a crew works. */
const CHECKLIST: ChecklistTemplateItem[] = [
  { id: "plan-match", label: "Roof faces, module count and layout match the plan set" },
  { id: "attachments", label: "Roof attachments flashed and sealed at every penetration" },
  { id: "rails", label: "Rails level and torqued to the racking maker's values" },
  { id: "bonding", label: "Modules and rails bonded; grounding path checked end to end" },
  { id: "labels", label: "Conductors labelled per NEC 690.31 and held off the roof surface" },
  { id: "voc", label: "Open-circuit voltage of every string measured and written down" },
  { id: "rapid-shutdown", label: "Rapid shutdown tested (NEC 690.12) and its label placed" },
  { id: "commissioned", label: "Inverter commissioned and monitoring reporting" },
  { id: "walkthrough", label: "Site cleaned; homeowner shown the system and its shutdown switch" },
];

/** Today in the company's time zone, shifted by whole days (job dates are calendar days). */
function day(offset: number): string {
  return addDaysToDate(todayInZone(DEFAULT_TIME_ZONE), offset);
}
const at = (offsetDays: number, hour = 15) => new Date(Date.parse(`${day(offsetDays)}T${String(hour).padStart(2, "0")}:00:00Z`));

type DemoJob = {
  key: keyof typeof DEMO_JOB_IDS;
  dealIndex: number;
  crew: keyof typeof DEMO_CREW_IDS | null;
  /** How many checklist items are ticked (from the top). */
  ticked: number;
  fields: Partial<typeof job.$inferInsert>;
};

// Deal indexes follow seed-demo.ts HOUSEHOLDS: 5 deposit paid … 11 live.
const JOBS: DemoJob[] = [
  { key: "fairweather", dealIndex: 5, crew: null, ticked: 0, fields: {} },
  { key: "galloway", dealIndex: 6, crew: "north", ticked: 0, fields: { surveyDate: day(-19), surveyDoneOn: day(-19), notes: "Dog in the back yard; use the side gate. Attic access is in the garage." } },
  {
    key: "halvorsen",
    dealIndex: 7,
    crew: "north",
    ticked: 0,
    fields: {
      surveyDate: day(-16),
      surveyDoneOn: day(-16),
      permitNumber: "KRN-BP-26-0418",
      permitSubmittedOn: day(-12),
      installDate: day(12),
      interconnectionNumber: "PEC-IX-7731",
      interconnectionSubmittedOn: day(-11),
      notes: "Install date held for when the permit comes back.",
    },
  },
  {
    key: "iwasaki",
    dealIndex: 8,
    crew: "north",
    ticked: 0,
    fields: {
      surveyDate: day(-24),
      surveyDoneOn: day(-24),
      permitNumber: "GSO-BP-26-1187",
      permitSubmittedOn: day(-20),
      permitApprovedOn: day(-6),
      installDate: day(0),
      interconnectionNumber: "PEC-IX-7702",
      interconnectionSubmittedOn: day(-19),
      interconnectionApprovedOn: day(-4),
      notes: "Park on the street; the driveway is shared. Main panel is on the north wall outside.",
    },
  },
  {
    key: "jablonski",
    dealIndex: 9,
    crew: "south",
    ticked: CHECKLIST.length,
    fields: {
      surveyDate: day(-40),
      surveyDoneOn: day(-40),
      permitNumber: "GC-BP-26-0902",
      permitSubmittedOn: day(-36),
      permitApprovedOn: day(-15),
      installDate: day(-3),
      installedAt: at(-3, 21),
      interconnectionNumber: "PEC-IX-7655",
      interconnectionSubmittedOn: day(-35),
      interconnectionApprovedOn: day(-10),
      inspectionOn: day(4),
    },
  },
  {
    key: "kowalczyk",
    dealIndex: 10,
    crew: "north",
    ticked: CHECKLIST.length,
    fields: {
      surveyDate: day(-60),
      surveyDoneOn: day(-60),
      permitNumber: "GSO-BP-26-0733",
      permitSubmittedOn: day(-55),
      permitApprovedOn: day(-34),
      installDate: day(-25),
      installedAt: at(-25, 22),
      interconnectionNumber: "PEC-IX-7590",
      interconnectionSubmittedOn: day(-54),
      interconnectionApprovedOn: day(-30),
      inspectionOn: day(-12),
      inspectionPassedOn: day(-12),
    },
  },
  {
    key: "lindgren",
    dealIndex: 11,
    crew: "south",
    ticked: CHECKLIST.length,
    fields: {
      surveyDate: day(-110),
      surveyDoneOn: day(-110),
      permitNumber: "GC-BP-26-0311",
      permitSubmittedOn: day(-104),
      permitApprovedOn: day(-85),
      installDate: day(-74),
      installedAt: at(-74, 20),
      interconnectionNumber: "PEC-IX-7418",
      interconnectionSubmittedOn: day(-103),
      interconnectionApprovedOn: day(-80),
      inspectionOn: day(-60),
      inspectionPassedOn: day(-60),
      ptoOn: day(-30),
    },
  },
];

/** A small invented picture of a roof with panels, as JPEG (no camera needed). */
async function demoJpeg(width: number, height: number, sky: string): Promise<Uint8Array> {
  const panels = Array.from({ length: 8 }, (_, i) => {
    const x = 150 + (i % 4) * 85;
    const y = 190 + Math.floor(i / 4) * 62;
    return `<rect x="${x}" y="${y}" width="78" height="56" fill="#1f2933" stroke="#7b8794" stroke-width="2"/>`;
  }).join("");
  const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}" viewBox="0 0 640 480">
    <rect width="640" height="480" fill="${sky}"/>
    <polygon points="60,380 320,120 580,380" fill="#8f3f1f"/>
    <rect x="60" y="380" width="520" height="100" fill="#f1ebe1"/>
    ${panels}
  </svg>`;
  return new Uint8Array(await sharp(Buffer.from(svg)).jpeg({ quality: 80 }).toBuffer());
}

export async function seed(ctx: SeedContext): Promise<void> {
  const { tx, companyId } = ctx;
  const store = seedStore("job photos");

  await tx.insert(crew).values([
    { id: DEMO_CREW_IDS.north, companyId, name: "Crew North", feedToken: randomBytes(32).toString("base64url") },
    { id: DEMO_CREW_IDS.south, companyId, name: "Crew South", feedToken: randomBytes(32).toString("base64url") },
  ]);
  const installers: [string, keyof typeof DEMO_CREW_IDS][] = [
    ["crew@tallgrass.example", "north"],
    ["crew2@tallgrass.example", "south"],
  ];
  for (const [email, key] of installers) {
    const person = ctx.people.find((p) => p.email === email);
    if (!person) throw new Error(`demo seed: ${email} missing from the demo people`);
    await tx
      .update(membership)
      .set({ crewId: DEMO_CREW_IDS[key] })
      .where(and(eq(membership.companyId, companyId), eq(membership.userId, person.id)));
  }

  await tx.insert(checklistTemplate).values({ id: DEMO_CHECKLIST_TEMPLATE_ID, companyId, name: "Roof-mount install", items: CHECKLIST, active: true });

  const doneBy: Record<keyof typeof DEMO_CREW_IDS, string | undefined> = {
    north: ctx.people.find((p) => p.email === "crew@tallgrass.example")?.id,
    south: ctx.people.find((p) => p.email === "crew2@tallgrass.example")?.id,
  };
  for (const j of JOBS) {
    const dealId = ctx.dealIds[j.dealIndex];
    const [signed] = await tx
      .select({ id: proposal.id })
      .from(proposal)
      .where(and(eq(proposal.companyId, companyId), eq(proposal.dealId, dealId), eq(proposal.status, "signed")))
      .orderBy(desc(proposal.signedAt))
      .limit(1);
    const doneAt = (j.fields.installedAt ?? at(0)).toISOString();
    const checklist: JobChecklistItem[] = CHECKLIST.map((item, i) => ({
      id: item.id,
      label: item.label,
      doneAt: i < j.ticked ? doneAt : null,
      doneByUserId: i < j.ticked && j.crew ? (doneBy[j.crew] ?? null) : null,
    }));
    const values = { ...j.fields, crewId: j.crew ? DEMO_CREW_IDS[j.crew] : null, proposalId: signed?.id ?? null, checklist };
    // The deposits seed may already have opened the job when it booked the deposit: complete it.
    const [existing] = await tx.select({ id: job.id }).from(job).where(and(eq(job.companyId, companyId), eq(job.dealId, dealId))).limit(1);
    if (existing) {
      await tx.update(job).set(values).where(and(eq(job.id, existing.id), eq(job.companyId, companyId)));
    } else {
      await tx.insert(job).values({ id: DEMO_JOB_IDS[j.key], companyId, dealId, ...values });
      await tx.insert(timelineEvent).values({
        id: crypto.randomUUID(),
        companyId,
        dealId,
        kind: "job.created",
        summary: "Job created: ready to schedule the survey",
        actorUserId: null,
        data: { jobId: DEMO_JOB_IDS[j.key], proposalId: signed?.id ?? null, checklistItems: CHECKLIST.length },
        // Some days before the survey (when it is in the past), else an hour ago.
        createdAt: j.fields.surveyDate && j.fields.surveyDate < day(0) ? new Date(Date.parse(`${j.fields.surveyDate}T14:00:00Z`) - 5 * 86_400_000) : new Date(Date.now() - 3_600_000),
      });
    }
  }

  // One photo Crew South took at the Jablonski install.
  const jablonski = await tx.select({ id: job.id }).from(job).where(and(eq(job.companyId, companyId), eq(job.dealId, ctx.dealIds[9]))).limit(1);
  const photoBytes = await demoJpeg(1024, 768, "#dce4ec");
  const photoKey = `${companyId}/jobs/${DEMO_JOB_PHOTO_ID}.jpg`;
  await store.put(photoKey, photoBytes);
  const crew2 = doneBy.south ?? null;
  await tx.insert(jobPhoto).values({
    id: DEMO_JOB_PHOTO_ID,
    companyId,
    jobId: jablonski[0].id,
    storageKey: photoKey,
    mimeType: "image/jpeg",
    widthPx: 1024,
    heightPx: 768,
    sizeBytes: photoBytes.byteLength,
    caption: "Array finished, south face",
    uploadedByUserId: crew2,
    createdAt: at(-3, 21),
  });

  // The rep's photo of the Iwasaki roof from the first visit, for today's packet.
  const siteBytes = await demoJpeg(800, 600, "#f3dccf");
  const siteKey = `${companyId}/uploads/${DEMO_SITE_PHOTO_UPLOAD_ID}.jpg`;
  await store.put(siteKey, siteBytes);
  const rep = ctx.people.find((p) => p.email === "rep@tallgrass.example");
  await tx.insert(upload).values({
    id: DEMO_SITE_PHOTO_UPLOAD_ID,
    companyId,
    dealId: ctx.dealIds[8],
    purpose: "site_photo",
    fileName: "iwasaki-roof-south.jpg",
    mimeType: "image/jpeg",
    sizeBytes: siteBytes.byteLength,
    sha256: createHash("sha256").update(siteBytes).digest("hex"),
    storageKey: siteKey,
    uploadedByUserId: rep?.id ?? null,
  });
}
