import "server-only";
import { siteTimeZone } from "@/engine/site-time-zone";
import { standardOffsetMinutes } from "@/engine/year-calendar";
import { createHash } from "node:crypto";
import { and, asc, desc, eq, getTableColumns, sql } from "drizzle-orm";
import { fileTypeFromBuffer } from "file-type";
import type { z } from "zod";
import { bill, dealUsage, intervalProfile, upload } from "@/db/schema";
import { usageFromBills } from "@/engine/bills";
import { EngineInputError } from "@/engine/errors";
import { importIntervalData } from "@/engine/green-button";
import { readBill, type BillReading } from "@/lib/bill-reader";
import { MAX_BILL_PHOTOS, OcrError, ocrTooPoor, readBillByOcr } from "@/lib/bill-reader/ocr-pages";
import { pagesText, pdfPages } from "@/lib/bill-reader/pdf-pages";
import type { BillSource } from "@/lib/enums";
import { MAX_BILL_FILE_BYTES, MAX_INTERVAL_FILE_BYTES, type billsTableSchema } from "@/lib/schemas/energy";
import { deriveUsageYear, type UsageYear } from "@/lib/usage-year";
import { db, transaction, type Tx } from "@/server/db";
import { inDealOrThrow, type DealScope } from "@/server/deal-scope";
import { engineFields, HttpError } from "@/server/errors";
import type { Member } from "@/server/session";
import { inOcrQueue } from "@/server/ocr-queue";
import { reencodeBillImage } from "@/server/photos";
import { withFilesUndoneOnFailure } from "@/server/storage";
import { autoMoveStage } from "@/server/stages";
import { recordEvent } from "@/server/timeline";

export type BillRow = { id: string; periodStart: string; periodEnd: string; kwh: number; costCents: number | null; uploadId: string | null; source: BillSource; periodEstimated: boolean };

const billColumns = { id: bill.id, periodStart: bill.periodStart, periodEnd: bill.periodEnd, kwh: bill.kwh, costCents: bill.costCents, uploadId: bill.uploadId, source: bill.source, periodEstimated: bill.periodEstimated };

function billsOf(q: Tx | ReturnType<typeof db>, companyId: string, dealId: string): Promise<BillRow[]> {
  return q
    .select(billColumns)
    .from(bill)
    .where(and(eq(bill.companyId, companyId), eq(bill.dealId, dealId)))
    .orderBy(asc(bill.periodStart));
}

export async function listBills(scope: DealScope): Promise<BillRow[]> {
  return billsOf(db(), scope.companyId, scope.dealId);
}

export async function getBillOrThrow(member: Member, billId: string) {
  return inDealOrThrow(member, "Bill", await db().select().from(bill).where(and(eq(bill.id, billId), eq(bill.companyId, member.companyId))).limit(1));
}

export async function getIntervalProfileOrThrow(member: Member, profileId: string) {
  const { id, dealId, uploadId, annualKwh, coveragePct, createdAt } = getTableColumns(intervalProfile);
  const rows = await db()
    .select({ id, dealId, uploadId, annualKwh, coveragePct, createdAt })
    .from(intervalProfile)
    .where(and(eq(intervalProfile.id, profileId), eq(intervalProfile.companyId, member.companyId)))
    .limit(1);
  return inDealOrThrow(member, "Interval profile", rows);
}

/** Turns the engine's named issues into a 422 naming each bad bill. */
function engineToHttp(err: unknown, what: string): never {
  if (err instanceof EngineInputError) {
    throw new HttpError(422, "invalid_input", `${what}: ${err.issues.map((i) => i.message).slice(0, 3).join("; ")}`, engineFields(err));
  }
  throw err;
}

/**
 * Saves the bills table as a whole (what the rep sees is what is stored) and rebuilds the usage
 * year in the same transaction. The engine checks the periods first (overlaps, impossible
 * lengths), so a bad table changes nothing.
 */
export async function saveBills(scope: DealScope, input: z.output<typeof billsTableSchema>): Promise<BillRow[]> {
  const { member, dealId } = scope;
  if (input.bills.length > 0) {
    try {
      usageFromBills({ bills: input.bills.map((b) => ({ startDate: b.periodStart, endDate: b.periodEnd, kwh: b.kwh })), fill: "seasonal" });
    } catch (err) {
      engineToHttp(err, "These bills do not fit together");
    }
  }
  const uploadIds = [...new Set(input.bills.map((b) => b.uploadId).filter((u): u is string => !!u))];
  for (const id of uploadIds) {
    const [u] = await db().select({ id: upload.id }).from(upload).where(and(eq(upload.id, id), eq(upload.companyId, member.companyId), eq(upload.dealId, dealId))).limit(1);
    if (!u) throw new HttpError(422, "validation_failed", "A bill refers to a file that is not part of this deal.");
  }
  return transaction(async (tx) => {
    await tx.delete(bill).where(and(eq(bill.companyId, member.companyId), eq(bill.dealId, dealId)));
    if (input.bills.length > 0) {
      await tx.insert(bill).values(
        input.bills.map((b) => ({
          id: crypto.randomUUID(),
          companyId: member.companyId,
          dealId,
          periodStart: b.periodStart,
          periodEnd: b.periodEnd,
          kwh: b.kwh,
          costCents: b.costCents ?? null,
          uploadId: b.uploadId ?? null,
          source: b.source ?? "typed",
          periodEstimated: b.periodEstimated ?? false,
        })),
      );
    }
    const year = await rebuildDealUsage(tx, member.companyId, dealId);
    const billsText = `${input.bills.length} bill${input.bills.length === 1 ? "" : "s"}`;
    await recordEvent(tx, {
      companyId: member.companyId,
      dealId,
      kind: "bills.saved",
      summary: `${member.name} saved ${billsText}`,
      actorUserId: member.userId,
    });
    await moveToBillsIn(tx, member, dealId, year, `usage year saved from ${billsText}`);
    return billsOf(tx, member.companyId, dealId);
  });
}

// ── The stored usage year ──────────────────────────────────────────────────────────────────

/** The usage year as stored, with its row id and version (offers record the version). */
export type DealUsage = UsageYear & { id: string | null; version: number };

const usageColumns = {
  id: dealUsage.id,
  version: dealUsage.version,
  monthlyKwh: dealUsage.monthlyKwh,
  hourlyKwh: dealUsage.hourlyKwh,
  annualKwh: dealUsage.annualKwh,
  source: dealUsage.source,
  estimatedMonths: dealUsage.estimatedMonths,
  warnings: dealUsage.warnings,
  averageCentsPerKwh: dealUsage.averageCentsPerKwh,
  fillMethod: dealUsage.fillMethod,
};


function toUsage(r: Pick<typeof dealUsage.$inferSelect, keyof typeof usageColumns>): DealUsage {
  return {
    id: r.id,
    version: r.version,
    monthlyKwh: r.monthlyKwh,
    hourlyKwh: r.hourlyKwh,
    annualKwh: r.annualKwh,
    source: r.source,
    estimatedMonths: r.estimatedMonths,
    warnings: r.warnings,
    averageCentsPerKwh: r.averageCentsPerKwh,
    fillMethod: r.fillMethod,
  };
}

/**
 * Derives the deal's usage year from its stored bills and newest interval data and stores it
 * with the next version, in the caller's transaction (the one that changed them). The row is
 * locked first, so two saves at once number their versions one after the other.
 */
export async function rebuildDealUsage(tx: Tx, companyId: string, dealId: string): Promise<UsageYear> {
  const [current] = await tx
    .select({ id: dealUsage.id, version: dealUsage.version })
    .from(dealUsage)
    .where(and(eq(dealUsage.companyId, companyId), eq(dealUsage.dealId, dealId)))
    .for("update");
  const [profile] = await tx
    .select({ hourlyKwh: intervalProfile.hourlyKwh, coveragePct: intervalProfile.coveragePct })
    .from(intervalProfile)
    .where(and(eq(intervalProfile.companyId, companyId), eq(intervalProfile.dealId, dealId)))
    .orderBy(desc(intervalProfile.createdAt))
    .limit(1);
  const year = deriveUsageYear(await billsOf(tx, companyId, dealId), profile ? { hourlyKwh: profile.hourlyKwh, coveragePct: profile.coveragePct } : null);
  if (current) {
    await tx
      .update(dealUsage)
      .set({ ...year, version: sql`${dealUsage.version} + 1` })
      .where(and(eq(dealUsage.id, current.id), eq(dealUsage.companyId, companyId)));
  } else {
    // Two first builds at once (a deal's first bills, a first read of older bills): the later one counts as a change.
    await tx
      .insert(dealUsage)
      .values({ id: crypto.randomUUID(), companyId, dealId, version: 1, ...year })
      .onDuplicateKeyUpdate({ set: { ...year, version: sql`${dealUsage.version} + 1` } });
  }
  return year;
}

/**
 * A lead whose usage year now exists moves to Bills in, with the cause on the Timeline. Only
 * from Lead: a deal already further on (or on hold, lost) stays where it is.
 */
async function moveToBillsIn(tx: Tx, member: Member, dealId: string, year: UsageYear, cause: string): Promise<void> {
  if (year.source === "none") return;
  await autoMoveStage(tx, {
    companyId: member.companyId,
    dealId,
    from: ["lead"],
    to: "bills_in",
    summary: `Moved to Bills in: ${cause}`,
    actorUserId: member.userId,
    data: { cause: "usage", usageSource: year.source },
  });
}

/**
 * The deal's stored usage year. A deal whose bills predate the stored year gets it built once
 * here (version 1); a deal with nothing stored reads as no usage, version 0.
 */
export async function getDealUsage(scope: DealScope): Promise<DealUsage> {
  const read = () => db().select(usageColumns).from(dealUsage).where(and(eq(dealUsage.companyId, scope.companyId), eq(dealUsage.dealId, scope.dealId))).limit(1);
  const [row] = await read();
  if (row) return toUsage(row);
  const [anyBill] = await db().select({ id: bill.id }).from(bill).where(and(eq(bill.companyId, scope.companyId), eq(bill.dealId, scope.dealId))).limit(1);
  const [anyProfile] = anyBill
    ? [anyBill]
    : await db().select({ id: intervalProfile.id }).from(intervalProfile).where(and(eq(intervalProfile.companyId, scope.companyId), eq(intervalProfile.dealId, scope.dealId))).limit(1);
  if (!anyProfile) return { ...deriveUsageYear([], null), id: null, version: 0 };
  await transaction((tx) => rebuildDealUsage(tx, scope.companyId, scope.dealId));
  const [built] = await read();
  return toUsage(built);
}

/** GET /api/deal-usages/[id]: the stored year by its id; reps only on deals they own. */
export async function getDealUsageOrThrow(member: Member, usageId: string): Promise<DealUsage & { dealId: string }> {
  const rows = await db()
    .select({ ...usageColumns, dealId: dealUsage.dealId })
    .from(dealUsage)
    .where(and(eq(dealUsage.id, usageId), eq(dealUsage.companyId, member.companyId)))
    .limit(1);
  const row = await inDealOrThrow(member, "Usage year", rows);
  return { ...toUsage(row), dealId: row.dealId };
}

// ── Uploads ────────────────────────────────────────────────────────────────────────────────

export type UploadMeta = { id: string; fileName: string; mimeType: string; sizeBytes: number; createdAt: Date };

export type UploadOutcome =
  | { kind: "bill-text"; upload: UploadMeta; reading: BillReading; source: "text" | "ocr"; message: string }
  | { kind: "bill-image"; upload: UploadMeta; message: string }
  | { kind: "interval"; upload: UploadMeta; profileId: string; annualKwh: number; coveragePct: number; message: string };

const MIN_PDF_TEXT_CHARS = 20;


function decodeText(bytes: Uint8Array): string | null {
  try {
    return new TextDecoder("utf-8", { fatal: true }).decode(bytes);
  } catch {
    return null;
  }
}

function readingMessage(r: BillReading, fileName: string): string {
  const found = [r.period && "the period", r.kwh && "the kWh", r.amountDue && "the amount due", r.history && `${r.history.months.length} months of history`].filter(Boolean);
  if (!found.length) return `“${fileName}” was kept, but nothing could be read from its text. Type the numbers from the bill.`;
  return `Read ${found.join(", ").replace(/, ([^,]*)$/, " and $1")} from “${fileName}”. Check them against the bill below, then save.`;
}

/**
 * A photo or a scanned PDF of a bill: read by OCR (src/lib/bill-reader/ocr-pages.ts), then kept
 * with the deal either way. When OCR is too slow, fails, or its text is too poor, the file is kept
 * and the rep is told why and asked to type the numbers.
 */
async function acceptScannedBill(scope: DealScope, file: { name: string; bytes: Uint8Array }, bytes: Uint8Array, kind: "image" | "pdf", detected: { mime: string; ext: string }): Promise<UploadOutcome> {
  return acceptPictures(scope, [{ file, detected }], kind);
}

type Picture = { file: { name: string; bytes: Uint8Array }; detected: { mime: string; ext: string } };

/** One bill's pictures (a scan, a photo, or photos of its pages in order) read by OCR as one document and kept. */
async function acceptPictures(scope: DealScope, pictures: Picture[], kind: "image" | "pdf"): Promise<UploadOutcome> {
  const file = { name: pictures.map((p) => p.file.name).join(" + "), bytes: pictures[0].file.bytes };
  let read: Awaited<ReturnType<typeof readBillByOcr>> | null = null;
  let problem: string | null = null;
  try {
    read = await inOcrQueue(() => readBillByOcr(pictures.map((p) => p.file.bytes), kind));
    const r = read.reading;
    problem = ocrTooPoor(read.ocr, [r.period, r.kwh, r.amountDue, r.history].filter(Boolean).length);
  } catch (err) {
    if (!(err instanceof OcrError)) throw err;
    problem = err.message;
  }
  const text = read && !problem ? pagesText(read.ocr.pages) : null;
  // Each photo is kept; the words read from all of them go with the first.
  const metas = [];
  for (const [i, p] of pictures.entries()) metas.push(await storeUpload(scope, p.file, p.detected.mime, p.detected.ext, "bill", i === 0 ? text : null));
  const meta = metas[0];
  if (!read || problem) {
    return { kind: "bill-image", upload: meta, message: `${kind === "pdf" ? `“${file.name}” is a scanned PDF with no text and` : pictures.length > 1 ? `The photos “${file.name}”` : `The photo “${file.name}”`} could not be read well enough to use: ${problem} It was kept with the deal; type the billing period, kWh and amount from it.` };
  }
  return { kind: "bill-text", upload: meta, reading: read.reading, source: "ocr", message: `${readingMessage(read.reading, file.name)} It was read from a picture: check each figure.` };
}

const PROGRAM_TYPES = new Set(["application/x-msdownload", "application/x-elf", "application/x-mach-binary", "application/x-executable", "application/x-sharedlib", "application/vnd.microsoft.portable-executable", "application/wasm"]);

/**
 * Photos of one bill's pages (page 1, page 2 …, in the order chosen): each checked and re-encoded
 * as a single photo is, then read by OCR as one document, so a history printed on page 2 joins
 * page 1's period and amount. Refused whole, before anything is kept, when one is not a photo.
 */
export async function acceptBillPhotoSet(scope: DealScope, files: { name: string; bytes: Uint8Array }[]): Promise<UploadOutcome> {
  if (files.length > MAX_BILL_PHOTOS) throw new HttpError(422, "too_many_photos", `One bill takes up to ${MAX_BILL_PHOTOS} photos (one a page); ${files.length} were chosen.`);
  const pictures: Picture[] = [];
  for (const file of files) {
    const size = file.bytes.byteLength;
    if (size === 0) throw new HttpError(422, "empty_file", `“${file.name}” is empty.`);
    if (size > MAX_BILL_FILE_BYTES) throw new HttpError(413, "file_too_large", `“${file.name}” is ${(size / 1048576).toFixed(1)} MB; bill files up to ${MAX_BILL_FILE_BYTES / 1048576} MB are accepted.`);
    const detected = await fileTypeFromBuffer(file.bytes);
    if (detected?.mime !== "image/jpeg" && detected?.mime !== "image/png") throw new HttpError(415, "unsupported_file", `“${file.name}” is not a photo (JPEG or PNG): several files make one bill only when each is a photo of one of its pages. Upload a PDF on its own.`);
    pictures.push({ file: { name: file.name, bytes: await reencodeBillImage(file.bytes, detected.mime, file.name) }, detected });
  }
  return acceptPictures(scope, pictures, "image");
}

/**
 * Checks a file by its content, never its name, then keeps it with what it yields. Anything
 * refused is refused before a byte or a row is written.
 */
export async function acceptDealUpload(scope: DealScope, file: { name: string; bytes: Uint8Array }): Promise<UploadOutcome> {
  const { member, dealId, household } = scope;
  const size = file.bytes.byteLength;
  if (size === 0) throw new HttpError(422, "empty_file", `“${file.name}” is empty.`);
  if (size > MAX_INTERVAL_FILE_BYTES) throw new HttpError(413, "file_too_large", `“${file.name}” is ${(size / 1048576).toFixed(1)} MB; files up to ${MAX_INTERVAL_FILE_BYTES / 1048576} MB are accepted.`);
  const detected = await fileTypeFromBuffer(file.bytes);

  if (detected && PROGRAM_TYPES.has(detected.mime)) {
    throw new HttpError(415, "unsupported_file", `“${file.name}” is a program (${detected.ext}), not a bill. Upload a PDF, a photo (JPEG or PNG), a CSV or Green Button XML file.`);
  }
  const refuse = (what: string) =>
    new HttpError(415, "unsupported_file", `“${file.name}” is ${what}. Upload a PDF, a photo (JPEG or PNG), a CSV or Green Button XML file.`);

  if (detected?.mime === "application/pdf" || detected?.mime === "image/jpeg" || detected?.mime === "image/png") {
    if (size > MAX_BILL_FILE_BYTES) throw new HttpError(413, "file_too_large", `“${file.name}” is ${(size / 1048576).toFixed(1)} MB; bill files up to ${MAX_BILL_FILE_BYTES / 1048576} MB are accepted.`);
    if (detected.mime === "application/pdf") {
      let pages;
      try {
        pages = await pdfPages(file.bytes);
      } catch {
        throw new HttpError(422, "unreadable_pdf", `“${file.name}” looks like a PDF but cannot be read (damaged or protected). Nothing was saved; try downloading the bill again.`);
      }
      const text = pagesText(pages);
      if (text.replace(/\s/g, "").length >= MIN_PDF_TEXT_CHARS) {
        const meta = await storeUpload(scope, file, detected.mime, detected.ext, "bill", text);
        const reading = readBill(pages);
        return { kind: "bill-text", upload: meta, reading, source: "text", message: readingMessage(reading, file.name) };
      }
      return acceptScannedBill(scope, file, file.bytes, "pdf", detected);
    }
    // A photographed bill is decoded within the pixel limit and re-encoded (422 when it does not decode).
    const pixels = await reencodeBillImage(file.bytes, detected.mime, file.name);
    return acceptScannedBill(scope, { name: file.name, bytes: pixels }, pixels, "image", detected);
  }

  if (detected && detected.mime !== "application/xml" && detected.mime !== "text/xml") throw refuse(`a ${detected.ext.toUpperCase()} file (${detected.mime})`);
  const text = decodeText(file.bytes);
  if (text === null) throw refuse("neither a document, a photo nor a text file");
  const isXml = text.trimStart().replace(/^\uFEFF/, "").startsWith("<");
  let profile;
  try {
    // The site's own zone, not longitude ÷ 15: stamps without an offset are its clock time.
    const timeZone = siteTimeZone(household.latitude, household.longitude);
    const utcOffsetHours = standardOffsetMinutes(timeZone, new Date().getUTCFullYear()) / 60;
    profile = importIntervalData(text, { format: isXml ? "espi-xml" : "csv", utcOffsetHours, timeZone });
  } catch (err) {
    engineToHttp(err, `“${file.name}” could not be read as ${isXml ? "Green Button XML" : "interval CSV"}`);
  }
  const profileId = crypto.randomUUID();
  const meta = await storeUpload(scope, file, isXml ? "application/xml" : "text/csv", isXml ? "xml" : "csv", "interval_data", null, async (tx, uploadId) => {
    await tx.insert(intervalProfile).values({
      id: profileId,
      companyId: member.companyId,
      dealId,
      uploadId,
      hourlyKwh: profile.hourlyKwh,
      annualKwh: profile.annualKwh,
      coveragePct: profile.coverage * 100,
    });
    const year = await rebuildDealUsage(tx, member.companyId, dealId);
    await moveToBillsIn(tx, member, dealId, year, `usage year saved from ${isXml ? "Green Button data" : "interval data"} in “${file.name.slice(0, 120)}”`);
  });
  return {
    kind: "interval",
    upload: meta,
    profileId,
    annualKwh: profile.annualKwh,
    coveragePct: profile.coverage * 100,
    message: `Hourly usage loaded from “${file.name}”: ${Math.round(profile.annualKwh).toLocaleString("en-US")} kWh a year, ${(profile.coverage * 100).toFixed(0)} % of hours measured.`,
  };
}

/** Writes the bytes, then the rows in one transaction; if the rows fail, the bytes go too. */
async function storeUpload(
  scope: DealScope,
  file: { name: string; bytes: Uint8Array },
  mimeType: string,
  ext: string,
  purpose: "bill" | "interval_data",
  extractedText: string | null,
  extra?: (tx: Tx, uploadId: string) => Promise<void>,
): Promise<UploadMeta> {
  const { member, dealId, companyId } = scope;
  const id = crypto.randomUUID();
  const storageKey = `${companyId}/uploads/${id}.${ext}`;
  const fileName = file.name.slice(0, 255) || `upload.${ext}`;
  const [sizeBytes, sha256] = [file.bytes.byteLength, createHash("sha256").update(file.bytes).digest("hex")];
  await withFilesUndoneOnFailure((put) =>
    transaction(async (tx) => {
      await put(storageKey, file.bytes);
      await tx.insert(upload).values({ id, companyId, dealId, purpose, fileName, mimeType, sizeBytes, sha256, storageKey, extractedText, uploadedByUserId: member.userId });
      if (extra) await extra(tx, id);
      await recordEvent(tx, { companyId, dealId, kind: "upload.added", summary: `${member.name} uploaded “${fileName}”`, actorUserId: member.userId });
    }),
  );
  const [row] = await db().select({ createdAt: upload.createdAt }).from(upload).where(eq(upload.id, id));
  return { id, fileName, mimeType, sizeBytes, createdAt: row.createdAt };
}

export async function listDealUploads(scope: DealScope): Promise<(UploadMeta & { purpose: string })[]> {
  const { member, dealId } = scope;
  return db()
    .select({ id: upload.id, fileName: upload.fileName, mimeType: upload.mimeType, sizeBytes: upload.sizeBytes, createdAt: upload.createdAt, purpose: upload.purpose })
    .from(upload)
    .where(and(eq(upload.companyId, member.companyId), eq(upload.dealId, dealId)))
    .orderBy(desc(upload.createdAt));
}
