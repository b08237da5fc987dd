import { readdir, readFile } from "node:fs/promises";
import path from "node:path";
import { and, eq } from "drizzle-orm";
import { PDFDocument, StandardFonts } from "pdf-lib";
import sharp from "sharp";
import { describe, expect, it } from "vitest";
import { bill, intervalProfile, upload } from "@/db/schema";
import { db } from "@/server/db";
import { createLead } from "@/server/deals";
import { acceptBillPhotoSet, acceptDealUpload, getDealUsage, saveBills } from "@/server/energy";
import { HttpError } from "@/server/errors";
import type { Member } from "@/server/session";
import { newCompany } from "../support/fixtures";
import { openDeal } from "@/server/deal-scope";
import { billsFromReading } from "@/lib/bill-reader/to-bills";

async function newDeal(member: Member): Promise<string> {
  const { dealId } = await createLead(member, {
    name: "Testwood household",
    contactName: "Pat Testwood",
    street: "1 Example Row",
    city: "Greensboro",
    region: "NC",
    postalCode: "27401",
    latitude: 36.07,
    longitude: -79.79,
    source: "Referral",
  });
  return dealId;
}

async function textPdf(lines: string[]): Promise<Uint8Array> {
  const doc = await PDFDocument.create();
  const page = doc.addPage([612, 792]);
  const font = await doc.embedFont(StandardFonts.Helvetica);
  lines.forEach((line, i) => page.drawText(line, { x: 50, y: 740 - i * 18, size: 11, font }));
  return doc.save();
}

// A 1×1 PNG (the smallest valid image), drawn big: a page that is only a picture, like a scan.
const PNG_1PX = Buffer.from("iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNk+M9QDwADhgGAWjR9awAAAABJRU5ErkJggg==", "base64");
async function scannedPdf(): Promise<Uint8Array> {
  const doc = await PDFDocument.create();
  const page = doc.addPage([612, 792]);
  const image = await doc.embedPng(PNG_1PX);
  page.drawImage(image, { x: 0, y: 0, width: 612, height: 792 });
  return doc.save();
}

async function refused(promise: Promise<unknown>, status: number, text: RegExp) {
  const err = await promise.then(
    () => null,
    (e: unknown) => e,
  );
  expect(err).toBeInstanceOf(HttpError);
  expect((err as HttpError).status).toBe(status);
  expect((err as HttpError).message).toMatch(text);
}

async function storedFiles(companyId: string): Promise<string[]> {
  try {
    return await readdir(path.join(process.env.STORAGE_DIR ?? "", companyId, "uploads"));
  } catch {
    return [];
  }
}

describe("bill uploads are checked by content", () => {
  it("a text PDF is kept and read: the period, kWh and amount due with where they were printed", async () => {
    const member = await newCompany();
    const dealId = await newDeal(member);
    const bytes = await textPdf(["Piedmont Electric Cooperative", "Billing period 01/03/2026 - 02/02/2026", "Energy used 1,024 kWh", "Basic charge $14.00", "Amount due $142.37"]);
    const outcome = await acceptDealUpload(await openDeal(member, dealId), { name: "january.pdf", bytes });
    expect(outcome.kind).toBe("bill-text");
    if (outcome.kind !== "bill-text") return;
    const r = outcome.reading;
    expect([r.period?.start.value, r.period?.end.value, r.kwh?.value, r.amountDue?.value]).toEqual(["2026-01-03", "2026-02-02", 1024, 14237]);
    expect(r.amountDue?.where).toMatchObject({ page: 1, line: 5 });
    expect(await storedFiles(member.companyId)).toHaveLength(1);
  });

  it("a bill with a 13-month history fills the usage year in one save, its months marked as from the bill's history", async () => {
    const member = await newCompany();
    const dealId = await newDeal(member);
    const bytes = new Uint8Array(await readFile(path.resolve("tests/fixtures/bills/larkhaven-classic.pdf")));
    const scope = await openDeal(member, dealId);
    const outcome = await acceptDealUpload(scope, { name: "larkhaven.pdf", bytes });
    if (outcome.kind !== "bill-text") throw new Error(`read as ${outcome.kind}`);
    const r = outcome.reading;
    const rows = billsFromReading({ start: r.period!.start.value, end: r.period!.end.value, kwh: r.kwh!.value, amountDueCents: r.amountDue!.value }, r.history!.months);
    await saveBills(scope, { bills: rows.map((b) => ({ ...b, uploadId: outcome.upload.id })) });
    const stored = await db().select({ source: bill.source, periodEstimated: bill.periodEstimated, kwh: bill.kwh }).from(bill).where(and(eq(bill.companyId, member.companyId), eq(bill.dealId, dealId)));
    expect(stored).toHaveLength(12);
    expect(stored.filter((b) => b.source === "history" && b.periodEstimated)).toHaveLength(11);
    expect(stored.filter((b) => b.source === "bill" && b.kwh === 972)).toHaveLength(1);
    const usage = await getDealUsage(scope);
    expect(usage.estimatedMonths.filter((e) => !e)).toHaveLength(12);
  });

  it("a scanned PDF and a photo are kept, with the request to type the numbers", async () => {
    const member = await newCompany();
    const dealId = await newDeal(member);
    const scan = await acceptDealUpload(await openDeal(member, dealId), { name: "scan.pdf", bytes: await scannedPdf() });
    expect(scan).toMatchObject({ kind: "bill-image" });
    expect(scan.message).toMatch(/scanned PDF with no text and could not be read well enough to use: Only 0 words could be read with confidence/);
    const photo = await acceptDealUpload(await openDeal(member, dealId), { name: "photo.png", bytes: new Uint8Array(PNG_1PX) });
    expect(photo.kind).toBe("bill-image");
    expect(photo.message).toMatch(/^The photo “photo.png” could not be read well enough to use: .* It was kept with the deal; type the billing period, kWh and amount from it\.$/);
    const rows = await db().select().from(upload).where(eq(upload.dealId, dealId));
    expect(rows.map((r) => r.mimeType).sort()).toEqual(["application/pdf", "image/png"]);
  });

  it("a photo of a real bill too blurred to read says so plainly, keeps the file without text and saves no bill", { timeout: 120_000 }, async () => {
    const member = await newCompany();
    const dealId = await newDeal(member);
    const blurred = await sharp(await readFile("tests/fixtures/bills/photos/larkhaven-classic-photo.jpg")).resize({ width: 500 }).blur(4).jpeg().toBuffer();
    const outcome = await acceptDealUpload(await openDeal(member, dealId), { name: "blurred.jpg", bytes: new Uint8Array(blurred) });
    expect(outcome.kind).toBe("bill-image");
    expect(outcome.message).toMatch(
      /^The photo “blurred.jpg” could not be read well enough to use: Only \d+ words? could be read with confidence \(at least 25 are needed\): the picture is too blurred, dark or small\. It was kept with the deal; type the billing period, kWh and amount from it\.$/,
    );
    const [kept] = await db().select().from(upload).where(eq(upload.dealId, dealId));
    expect(kept.extractedText).toBeNull();
    expect(await db().select().from(bill).where(eq(bill.dealId, dealId))).toEqual([]);
  });

  it("a photo of a bill is read by OCR into the same reading, marked as read from a picture", { timeout: 150_000 }, async () => {
    const member = await newCompany();
    const dealId = await newDeal(member);
    const bytes = new Uint8Array(await readFile("tests/fixtures/bills/photos/cobble-creek-across-photo.jpg"));
    const outcome = await acceptDealUpload(await openDeal(member, dealId), { name: "bill-photo.jpg", bytes });
    if (outcome.kind !== "bill-text") throw new Error(`not read: ${outcome.message}`);
    expect(outcome.source).toBe("ocr");
    expect(outcome.message).toMatch(/It was read from a picture: check each figure\.$/);
    expect([outcome.reading.period?.start.value, outcome.reading.kwh?.value, outcome.reading.amountDue?.value, outcome.reading.history?.months.length]).toEqual(["2025-09-14", 1086, 12137, 12]);
    const [row] = await db().select({ mimeType: upload.mimeType, extractedText: upload.extractedText }).from(upload).where(and(eq(upload.companyId, member.companyId), eq(upload.id, outcome.upload.id)));
    expect(row.mimeType).toBe("image/jpeg");
    expect(row.extractedText).toContain("Energy used");
  });

  it("photos of a bill's two pages are read as one bill: page 2's history joins page 1's fields; each photo is kept", { timeout: 300_000 }, async () => {
    const member = await newCompany();
    const dealId = await newDeal(member);
    const dir = "tests/fixtures/bills/photo-sets/birchfield-two-page";
    const pages = await Promise.all(["page-1.jpg", "page-2.jpg"].map(async (name) => ({ name, bytes: new Uint8Array(await readFile(path.join(dir, name))) })));
    const outcome = await acceptBillPhotoSet(await openDeal(member, dealId), pages);
    if (outcome.kind !== "bill-text") throw new Error(`not read: ${outcome.message}`);
    expect(outcome.source).toBe("ocr");
    expect([outcome.reading.period?.start.value, outcome.reading.kwh?.value, outcome.reading.amountDue?.value, outcome.reading.history?.months.length]).toEqual(["2025-09-30", 765, 8815, 12]);
    expect(outcome.message).toMatch(/from “page-1\.jpg \+ page-2\.jpg”/);
    const rows = await db().select({ fileName: upload.fileName }).from(upload).where(and(eq(upload.companyId, member.companyId), eq(upload.dealId, dealId)));
    expect(rows.map((r) => r.fileName).sort()).toEqual(["page-1.jpg", "page-2.jpg"]);
  });

  it("several files make one bill only when each is a photo, at most four; nothing is kept otherwise", async () => {
    const member = await newCompany();
    const dealId = await newDeal(member);
    const scope = await openDeal(member, dealId);
    const photo = { name: "page-1.jpg", bytes: new Uint8Array(await readFile("tests/fixtures/bills/photo-sets/birchfield-two-page/page-1.jpg")) };
    await refused(acceptBillPhotoSet(scope, [photo, { name: "bill.pdf", bytes: await textPdf(["Energy used 972 kWh"]) }]), 415, /“bill\.pdf” is not a photo \(JPEG or PNG\): several files make one bill only when each is a photo of one of its pages/);
    await refused(acceptBillPhotoSet(scope, [photo, photo, photo, photo, photo]), 422, /One bill takes up to 4 photos \(one a page\); 5 were chosen/);
    expect(await storedFiles(member.companyId)).toEqual([]);
  });

  it("a renamed program, an oversize file and a corrupt PDF are refused and nothing is stored", async () => {
    const member = await newCompany();
    const dealId = await newDeal(member);
    // ELF header (the start of a Linux program), named like a bill.
    const elf = new Uint8Array(4096);
    elf.set([0x7f, 0x45, 0x4c, 0x46, 0x02, 0x01, 0x01, 0x00]);
    await refused(acceptDealUpload(await openDeal(member, dealId), { name: "bill.pdf", bytes: elf }), 415, /is a program/);
    await refused(acceptDealUpload(await openDeal(member, dealId), { name: "huge.csv", bytes: new Uint8Array(21 * 1024 * 1024) }), 413, /MB; files up to 20 MB/);
    const bigPdf = new Uint8Array(11 * 1024 * 1024);
    bigPdf.set(new TextEncoder().encode("%PDF-1.7\n"));
    await refused(acceptDealUpload(await openDeal(member, dealId), { name: "big.pdf", bytes: bigPdf }), 413, /bill files up to 10 MB/);
    const corrupt = new TextEncoder().encode("%PDF-1.7\n1 0 obj << /Type /Catalog /Pages 2 0 R >>\nthis is not a real pdf body\n%%EOF");
    await refused(acceptDealUpload(await openDeal(member, dealId), { name: "damaged.pdf", bytes: corrupt }), 422, /cannot be read/);
    await refused(acceptDealUpload(await openDeal(member, dealId), { name: "notes.csv", bytes: new TextEncoder().encode("hello,world\n1,2\n") }), 422, /could not be read as interval CSV/);
    expect(await db().select().from(upload).where(eq(upload.dealId, dealId))).toEqual([]);
    expect(await storedFiles(member.companyId)).toEqual([]);
  });

  it("Green Button XML becomes the deal's hourly usage", async () => {
    const { readFile } = await import("node:fs/promises");
    const member = await newCompany();
    const dealId = await newDeal(member);
    const xml = await readFile(path.join(process.cwd(), "tests/fixtures/green-button/espi-two-days-invented.xml"));
    const outcome = await acceptDealUpload(await openDeal(member, dealId), { name: "usage.xml", bytes: new Uint8Array(xml) });
    expect(outcome.kind).toBe("interval");
    const [profile] = await db().select().from(intervalProfile).where(and(eq(intervalProfile.dealId, dealId), eq(intervalProfile.companyId, member.companyId)));
    expect(profile.hourlyKwh).toHaveLength(8760);
    const usage = await getDealUsage(await openDeal(member, dealId));
    expect(usage.source).toBe("interval");
  });
});

describe("the bills table", () => {
  it("overlapping bills are refused naming the bill, and what was saved stays", async () => {
    const member = await newCompany();
    const dealId = await newDeal(member);
    await saveBills(await openDeal(member, dealId), { bills: [{ periodStart: "2026-01-03", periodEnd: "2026-02-02", kwh: 1024, costCents: 14237 }] });
    const err = await saveBills(await openDeal(member, dealId), {
      bills: [
        { periodStart: "2026-01-03", periodEnd: "2026-02-02", kwh: 1024 },
        { periodStart: "2026-01-20", periodEnd: "2026-02-20", kwh: 900 },
      ],
    }).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(HttpError);
    expect((err as HttpError).status).toBe(422);
    expect(Object.keys((err as HttpError).fields ?? {})).toContain("bills.1.startDate");
    const kept = await db().select().from(bill).where(eq(bill.dealId, dealId));
    expect(kept.map((b) => b.kwh)).toEqual([1024]);
  });

  it("twelve bills give twelve measured months", async () => {
    const member = await newCompany();
    const dealId = await newDeal(member);
    const bills = Array.from({ length: 12 }, (_, m) => {
      const start = new Date(Date.UTC(2025, m, 1)).toISOString().slice(0, 10);
      const end = new Date(Date.UTC(2025, m + 1, 1)).toISOString().slice(0, 10);
      return { periodStart: start, periodEnd: end, kwh: 800 + 50 * Math.abs(6 - m), costCents: 12_000 };
    });
    await saveBills(await openDeal(member, dealId), { bills });
    const usage = await getDealUsage(await openDeal(member, dealId));
    expect(usage.estimatedMonths.filter(Boolean)).toHaveLength(0);
    // Σ (800 + 50·|6 − m|) for m = 0..11 = 9600 + 50·(6+5+4+3+2+1+0+1+2+3+4+5) = 9600 + 1800 (hand-worked)
    expect(usage.annualKwh).toBeCloseTo(11_400, 6);
  });
});
