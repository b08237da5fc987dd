import "server-only";
import { siteTimeZone } from "@/engine/site-time-zone";
import { standardOffsetMinutes } from "@/engine/year-calendar";
import { createHash } from "node:crypto";
import { and, asc, desc, eq } from "drizzle-orm";
import { fileTypeFromBuffer } from "file-type";
import type { z } from "zod";
import { bill, intervalProfile, upload } from "@/db/schema";
import { usageFromBills } from "@/engine/bills";
import { EngineInputError } from "@/engine/errors";
import { importIntervalData } from "@/engine/green-button";
import { spreadMonthlyToHourly } from "@/engine/load-shape";
import { HOUR_MONTH } from "@/engine/year-calendar";
import { suggestBillsFromText, type BillSuggestion } from "@/lib/bill-text";
import { MAX_BILL_FILE_BYTES, MAX_INTERVAL_FILE_BYTES, type billsTableSchema } from "@/lib/schemas/energy";
import { db, type Tx } from "@/server/db";
import { getDealOrThrow, getDealRoom } from "@/server/deals";
import { engineFields, HttpError, notFound } from "@/server/errors";
import type { Member } from "@/server/session";
import { reencodeBillImage } from "@/server/photos";
import { storage } from "@/server/storage";
import { recordEvent } from "@/server/timeline";

export type BillRow = { id: string; periodStart: string; periodEnd: string; kwh: number; costCents: number | null; uploadId: string | null };

export async function listBills(member: Member, dealId: string): Promise<BillRow[]> {
  await getDealOrThrow(member, dealId);
  return db()
    .select({ id: bill.id, periodStart: bill.periodStart, periodEnd: bill.periodEnd, kwh: bill.kwh, costCents: bill.costCents, uploadId: bill.uploadId })
    .from(bill)
    .where(and(eq(bill.companyId, member.companyId), eq(bill.dealId, dealId)))
    .orderBy(asc(bill.periodStart));
}

export async function getBillOrThrow(member: Member, billId: string) {
  const [row] = await db().select().from(bill).where(and(eq(bill.id, billId), eq(bill.companyId, member.companyId))).limit(1);
  if (!row) throw notFound("Bill");
  await getDealOrThrow(member, row.dealId);
  return row;
}

export async function getIntervalProfileOrThrow(member: Member, profileId: string) {
  const [row] = await db()
    .select({ id: intervalProfile.id, dealId: intervalProfile.dealId, uploadId: intervalProfile.uploadId, annualKwh: intervalProfile.annualKwh, coveragePct: intervalProfile.coveragePct, createdAt: intervalProfile.createdAt })
    .from(intervalProfile)
    .where(and(eq(intervalProfile.id, profileId), eq(intervalProfile.companyId, member.companyId)))
    .limit(1);
  if (!row) throw notFound("Interval profile");
  await getDealOrThrow(member, row.dealId);
  return row;
}

/** Turns the engine's named issues into a 422 naming each bad bill. */
function engineToHttp(err: unknown, what: string): never {
  if (err instanceof EngineInputError) {
    throw new HttpError(422, "invalid_input", `${what}: ${err.issues.map((i) => i.message).slice(0, 3).join("; ")}`, engineFields(err));
  }
  throw err;
}

/**
 * Saves the bills table as a whole (what the rep sees is what is stored). The engine checks
 * the periods first (overlaps, impossible lengths), so a bad table changes nothing.
 */
export async function saveBills(member: Member, dealId: string, input: z.output<typeof billsTableSchema>): Promise<BillRow[]> {
  await getDealOrThrow(member, dealId);
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
  await db().transaction(async (tx) => {
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
        })),
      );
    }
    await recordEvent(tx, {
      companyId: member.companyId,
      dealId,
      kind: "bills.saved",
      summary: `${member.name} saved ${input.bills.length} bill${input.bills.length === 1 ? "" : "s"}`,
      actorUserId: member.userId,
    });
  });
  return listBills(member, dealId);
}

export type DealUsage = {
  monthlyKwh: number[];
  hourlyKwh: number[] | null;
  annualKwh: number;
  source: "bills" | "interval" | "none";
  estimatedMonths: boolean[];
  warnings: string[];
  averageCentsPerKwh: number | null;
  fillMethod: string;
};

/** The household's usage year: interval data when there is some, else the bills, filled by the engine. */
export async function getDealUsage(member: Member, dealId: string): Promise<DealUsage> {
  await getDealOrThrow(member, dealId);
  const [profile] = await db()
    .select({ hourlyKwh: intervalProfile.hourlyKwh, coveragePct: intervalProfile.coveragePct })
    .from(intervalProfile)
    .where(and(eq(intervalProfile.companyId, member.companyId), eq(intervalProfile.dealId, dealId)))
    .orderBy(desc(intervalProfile.createdAt))
    .limit(1);
  if (profile) {
    const monthly = new Array<number>(12).fill(0);
    profile.hourlyKwh.forEach((kwh, h) => (monthly[HOUR_MONTH[h]] += kwh));
    return {
      monthlyKwh: monthly,
      hourlyKwh: profile.hourlyKwh,
      annualKwh: monthly.reduce((a, b) => a + b, 0),
      source: "interval",
      estimatedMonths: monthly.map(() => false),
      warnings: profile.coveragePct < 90 ? [`Interval data covers ${profile.coveragePct.toFixed(0)} % of the year; the gaps were filled.`] : [],
      averageCentsPerKwh: null,
      fillMethod: "interval",
    };
  }
  const bills = await listBills(member, dealId);
  if (bills.length === 0) {
    return { monthlyKwh: new Array(12).fill(0), hourlyKwh: null, annualKwh: 0, source: "none", estimatedMonths: new Array(12).fill(true), warnings: [], averageCentsPerKwh: null, fillMethod: "none" };
  }
  const usage = usageFromBills({
    bills: bills.map((b) => ({ id: b.id, startDate: b.periodStart, endDate: b.periodEnd, kwh: b.kwh, costCents: b.costCents ?? undefined })),
    fill: "seasonal",
  });
  return {
    monthlyKwh: usage.monthlyKwh,
    hourlyKwh: spreadMonthlyToHourly(usage.monthlyKwh).hourlyKwh,
    annualKwh: usage.annualKwh,
    source: "bills",
    estimatedMonths: usage.months.map((m) => m.status === "estimated"),
    warnings: usage.warnings,
    averageCentsPerKwh: usage.averageCentsPerKwh,
    fillMethod: usage.fillMethod,
  };
}

// ── Uploads ────────────────────────────────────────────────────────────────────────────────

export type UploadMeta = { id: string; fileName: string; mimeType: string; sizeBytes: number; createdAt: Date };

export type UploadOutcome =
  | { kind: "bill-text"; upload: UploadMeta; suggestions: BillSuggestion[]; message: string }
  | { kind: "bill-image"; upload: UploadMeta; message: string }
  | { kind: "interval"; upload: UploadMeta; profileId: string; annualKwh: number; coveragePct: number; message: string };

const MIN_PDF_TEXT_CHARS = 20;

async function pdfText(bytes: Uint8Array): Promise<string> {
  const { extractText, getDocumentProxy } = await import("unpdf");
  // unpdf empties the buffer it is given, so it gets a copy.
  const pdf = await getDocumentProxy(new Uint8Array(bytes));
  const { text } = await extractText(pdf, { mergePages: true });
  return text;
}

function decodeText(bytes: Uint8Array): string | null {
  try {
    return new TextDecoder("utf-8", { fatal: true }).decode(bytes);
  } catch {
    return null;
  }
}

const PROGRAM_TYPES = new Set(["application/x-msdownload", "application/x-elf", "application/x-mach-binary", "application/x-executable", "application/x-sharedlib", "application/vnd.microsoft.portable-executable", "application/wasm"]);

/**
 * Checks a file by its content, never its name, then keeps it with what it yields. Anything
 * refused is refused before a byte or a row is written.
 */
export async function acceptDealUpload(member: Member, dealId: string, file: { name: string; bytes: Uint8Array }): Promise<UploadOutcome> {
  const { household } = await getDealRoom(member, dealId);
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
      let text: string;
      try {
        text = await pdfText(file.bytes);
      } catch {
        throw new HttpError(422, "unreadable_pdf", `“${file.name}” looks like a PDF but cannot be read (damaged or protected). Nothing was saved; try downloading the bill again.`);
      }
      if (text.replace(/\s/g, "").length >= MIN_PDF_TEXT_CHARS) {
        const meta = await storeUpload(member, dealId, file, detected.mime, detected.ext, "bill", text);
        const suggestions = suggestBillsFromText(text);
        return {
          kind: "bill-text",
          upload: meta,
          suggestions,
          message: suggestions.length > 0 ? `Found ${suggestions.length} billing period${suggestions.length === 1 ? "" : "s"} in “${file.name}”. Check them against the bill, then add them.` : `“${file.name}” was kept, but no billing period could be read from its text. Type the numbers from the bill.`,
        };
      }
      const meta = await storeUpload(member, dealId, file, detected.mime, detected.ext, "bill", null);
      return { kind: "bill-image", upload: meta, message: `“${file.name}” is a scanned PDF with no text. It was kept with the deal; type the billing period, kWh and amount from it.` };
    }
    // A photographed bill is decoded within the pixel limit and re-encoded (422 when it does not decode).
    const pixels = await reencodeBillImage(file.bytes, detected.mime, file.name);
    const meta = await storeUpload(member, dealId, { name: file.name, bytes: pixels }, detected.mime, detected.ext, "bill", null);
    return { kind: "bill-image", upload: meta, message: `The photo “${file.name}” was kept with the deal; type the billing period, kWh and amount from it.` };
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
  const meta = await storeUpload(member, dealId, file, isXml ? "application/xml" : "text/csv", isXml ? "xml" : "csv", "interval_data", null, async (tx, uploadId) => {
    await tx.insert(intervalProfile).values({
      id: profileId,
      companyId: member.companyId,
      dealId,
      uploadId,
      hourlyKwh: profile.hourlyKwh,
      annualKwh: profile.annualKwh,
      coveragePct: profile.coverage * 100,
    });
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
  member: Member,
  dealId: string,
  file: { name: string; bytes: Uint8Array },
  mimeType: string,
  ext: string,
  purpose: "bill" | "interval_data",
  extractedText: string | null,
  extra?: (tx: Tx, uploadId: string) => Promise<void>,
): Promise<UploadMeta> {
  const id = crypto.randomUUID();
  const key = `${member.companyId}/uploads/${id}.${ext}`;
  await storage().put(key, file.bytes);
  const fileName = file.name.slice(0, 255) || `upload.${ext}`;
  try {
    await db().transaction(async (tx) => {
      await tx.insert(upload).values({
        id,
        companyId: member.companyId,
        dealId,
        purpose,
        fileName,
        mimeType,
        sizeBytes: file.bytes.byteLength,
        sha256: createHash("sha256").update(file.bytes).digest("hex"),
        storageKey: key,
        extractedText,
        uploadedByUserId: member.userId,
      });
      if (extra) await extra(tx, id);
      await recordEvent(tx, { companyId: member.companyId, dealId, kind: "upload.added", summary: `${member.name} uploaded “${fileName}”`, actorUserId: member.userId });
    });
  } catch (err) {
    await storage().delete(key);
    throw err;
  }
  const [row] = await db().select({ createdAt: upload.createdAt }).from(upload).where(eq(upload.id, id));
  return { id, fileName, mimeType, sizeBytes: file.bytes.byteLength, createdAt: row.createdAt };
}

export async function listDealUploads(member: Member, dealId: string): Promise<(UploadMeta & { purpose: string })[]> {
  await getDealOrThrow(member, dealId);
  return db()
    .select({ id: upload.id, fileName: upload.fileName, mimeType: upload.mimeType, sizeBytes: upload.sizeBytes, createdAt: upload.createdAt, purpose: upload.purpose })
    .from(upload)
    .where(and(eq(upload.companyId, member.companyId), eq(upload.dealId, dealId)))
    .orderBy(desc(upload.createdAt));
}
