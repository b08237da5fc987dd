// A rep's site photos: checked by content and resized like the crew's photos, kept with the
// deal, scoped to who may see the deal, and shown to the assigned crew in the job packet.
import { readdir } from "node:fs/promises";
import path from "node:path";
import { and, eq } from "drizzle-orm";
import sharp from "sharp";
import { beforeAll, describe, expect, it } from "vitest";
import { deal, household, timelineEvent, upload } from "@/db/schema";
import type { Member } from "@/server/session";
import { addMember, newCompany, rejects } from "../support/fixtures";

type Server = {
  sitePhotos: typeof import("@/server/site-photos");
  jobs: typeof import("@/server/jobs");
  crews: typeof import("@/server/crews");
  db: typeof import("@/server/db");
};
let s: Server;
let owner: Member;
let office: Member;
let rep: Member;
let otherRep: Member;
let installer: Member;
let stranger: Member;
let dealId: string;
let jobId: string;


async function sitePhotoRows(): Promise<number> {
  const rows = await s.db.db().select({ id: upload.id }).from(upload).where(and(eq(upload.dealId, dealId), eq(upload.purpose, "site_photo")));
  return rows.length;
}

async function storedFiles(companyId: string): Promise<string[]> {
  try {
    return await readdir(path.join(process.env.STORAGE_DIR ?? "", companyId, "uploads"));
  } catch {
    return [];
  }
}

beforeAll(async () => {
  s = {
    sitePhotos: await import("@/server/site-photos"),
    jobs: await import("@/server/jobs"),
    crews: await import("@/server/crews"),
    db: await import("@/server/db"),
  };
  owner = await newCompany("Site Photo Solar");
  office = await addMember(owner, "office_manager", "Oona Office");
  rep = await addMember(owner, "sales_rep", "Reese Rep");
  otherRep = await addMember(owner, "sales_rep", "Rowan Rep");
  installer = await addMember(owner, "crew", "Ines Installer");
  stranger = await newCompany("Elsewhere Site Solar");
  const householdId = crypto.randomUUID();
  dealId = crypto.randomUUID();
  await s.db.db().insert(household).values({ id: householdId, companyId: owner.companyId, name: "Quillon household", street: "4 Vane Street", city: "Testville", region: "NC", postalCode: "27000", latitude: 36.05, longitude: -79.8 });
  await s.db.db().insert(deal).values({ id: dealId, companyId: owner.companyId, householdId, ownerUserId: rep.userId, stage: "deposit_paid", source: "Referral" });
  jobId = await s.db.db().transaction((tx) => s.jobs.createJobForDeal(tx, { companyId: owner.companyId, dealId, proposalId: null }));
  const crewId = (await s.crews.createCrew(office, { name: "Site Crew" })).id;
  await s.crews.updateCrew(office, crewId, { memberIds: [installer.membershipId] });
  await s.jobs.updateJob(office, jobId, { crewId });
});

describe("site photos", () => {
  it("keeps a rep's photo upright, resized, as JPEG without its metadata, and the crew sees it in the packet", async () => {
    const shot = await sharp({ create: { width: 3000, height: 2000, channels: 3, background: { r: 120, g: 96, b: 80 } } })
      .withExif({ IFD0: { Copyright: "Reese's phone" } })
      .png()
      .toBuffer();
    const photo = await s.sitePhotos.addSitePhoto(rep, dealId, { name: "roof-south.png", bytes: new Uint8Array(shot) });
    expect(photo.fileName).toBe("roof-south.jpg");
    expect(photo.uploadedByName).toBe("Reese Rep");

    const bytes = await s.sitePhotos.getSitePhotoFile(rep, dealId, photo.id);
    const meta = await sharp(Buffer.from(bytes)).metadata();
    expect(meta.format).toBe("jpeg");
    expect([meta.width, meta.height]).toEqual([2048, 1365]);
    expect(meta.exif).toBeUndefined();

    expect((await s.sitePhotos.listSitePhotos(office, dealId)).map((p) => p.id)).toEqual([photo.id]);
    const packet = await s.jobs.getJobPacket(installer, jobId);
    expect(packet.sitePhotos.map((p) => p.id)).toEqual([photo.id]);
    const forCrew = await s.jobs.getJobSitePhotoFile(installer, jobId, photo.id);
    expect(forCrew.mimeType).toBe("image/jpeg");
    expect(Buffer.from(forCrew.bytes).equals(Buffer.from(bytes))).toBe(true);

    const notes = await s.db.db().select().from(timelineEvent).where(and(eq(timelineEvent.dealId, dealId), eq(timelineEvent.kind, "upload.added")));
    expect(notes.map((n) => n.summary)).toContain("Reese Rep added the site photo “roof-south.jpg”");
  });

  it("refuses what is not a readable photo, with the reason, and stores nothing", async () => {
    const rows = await sitePhotoRows();
    const files = (await storedFiles(owner.companyId)).length;
    const pdf = new TextEncoder().encode("%PDF-1.4\n1 0 obj<<>>endobj\ntrailer<<>>\n%%EOF");
    expect((await rejects(s.sitePhotos.addSitePhoto(rep, dealId, { name: "roof.jpg", bytes: pdf }), 422)).message).toMatch(/PDF/);
    expect((await rejects(s.sitePhotos.addSitePhoto(rep, dealId, { name: "roof.jpg", bytes: new TextEncoder().encode("just text") }), 422)).code).toBe("unsupported_file");
    const jpeg = await sharp({ create: { width: 400, height: 300, channels: 3, background: { r: 1, g: 2, b: 3 } } }).jpeg().toBuffer();
    expect((await rejects(s.sitePhotos.addSitePhoto(rep, dealId, { name: "cut.jpg", bytes: new Uint8Array(jpeg.subarray(0, 200)) }), 422)).code).toBe("unreadable_image");
    expect((await rejects(s.sitePhotos.addSitePhoto(rep, dealId, { name: "empty.jpg", bytes: new Uint8Array() }), 422)).code).toBe("empty_file");
    expect(await sitePhotoRows()).toBe(rows);
    expect((await storedFiles(owner.companyId)).length).toBe(files);
  });

  it("is kept to those who may see the deal: another rep and another company get 404", async () => {
    const png = await sharp({ create: { width: 20, height: 20, channels: 3, background: { r: 9, g: 9, b: 9 } } }).png().toBuffer();
    await rejects(s.sitePhotos.addSitePhoto(otherRep, dealId, { name: "x.png", bytes: new Uint8Array(png) }), 404);
    await rejects(s.sitePhotos.addSitePhoto(stranger, dealId, { name: "x.png", bytes: new Uint8Array(png) }), 404);
    await rejects(s.sitePhotos.addSitePhoto(installer, dealId, { name: "x.png", bytes: new Uint8Array(png) }), 404);
    const [first] = await s.sitePhotos.listSitePhotos(rep, dealId);
    await rejects(s.sitePhotos.getSitePhotoFile(stranger, dealId, first.id), 404);
    await rejects(s.sitePhotos.getSitePhotoFile(otherRep, dealId, first.id), 404);
    await rejects(s.sitePhotos.deleteSitePhoto(stranger, dealId, first.id), 404);
    await rejects(s.sitePhotos.listSitePhotos(otherRep, dealId), 404);
  });

  it("removes a photo: the row, the file and the packet's entry, with a timeline note", async () => {
    const png = await sharp({ create: { width: 64, height: 48, channels: 3, background: { r: 200, g: 10, b: 10 } } }).png().toBuffer();
    const photo = await s.sitePhotos.addSitePhoto(rep, dealId, { name: "blurred.png", bytes: new Uint8Array(png) });
    const files = (await storedFiles(owner.companyId)).length;
    await s.sitePhotos.deleteSitePhoto(office, dealId, photo.id);
    expect((await s.sitePhotos.listSitePhotos(rep, dealId)).map((p) => p.id)).not.toContain(photo.id);
    expect((await s.jobs.getJobPacket(installer, jobId)).sitePhotos.map((p) => p.id)).not.toContain(photo.id);
    expect((await storedFiles(owner.companyId)).length).toBe(files - 1);
    await rejects(s.sitePhotos.getSitePhotoFile(rep, dealId, photo.id), 404);
    const notes = await s.db.db().select().from(timelineEvent).where(and(eq(timelineEvent.dealId, dealId), eq(timelineEvent.kind, "upload.removed")));
    expect(notes.map((n) => n.summary)).toContain("Oona Office removed the site photo “blurred.jpg”");
  });
});
