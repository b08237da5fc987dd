// Demo energy: twelve invented monthly bills for every household past the first visit, and
// one household with Green Button interval data (the invented fixture of tests/fixtures), and
// each deal's stored usage year derived from them as the app derives it (version 1).
import { createHash } from "node:crypto";
import { readFile } from "node:fs/promises";
import path from "node:path";
import { fileURLToPath } from "node:url";
import { bill, dealUsage, intervalProfile, upload } from "../../../src/db/schema";
import { importIntervalData } from "../../../src/engine/green-button";
import { referenceMonthlyShape } from "../../../src/engine/load-shape";
import { deriveUsageYear, type StoredBill, type StoredInterval } from "../../../src/lib/usage-year";
import { seedStore } from "../seed-files";
import type { SeedContext } from "../seed-demo";

export const order = 15;

const here = path.dirname(fileURLToPath(import.meta.url));
const GREEN_BUTTON_FIXTURE = path.resolve(here, "../../../tests/fixtures/green-button/espi-two-days-invented.xml");
const INTERVAL_UPLOAD_ID = "7a11a55e-0000-4000-8000-000000006001";
const INTERVAL_PROFILE_ID = "7a11a55e-0000-4000-8000-000000006002";
/** Invented: about 13.5 ¢/kWh of energy plus a $14 monthly customer charge. */
const CENTS_PER_KWH = 13.5;
const FIXED_CENTS = 1_400;

export async function seed(ctx: SeedContext): Promise<void> {
  const shape = referenceMonthlyShape();
  const shapeTotal = shape.reduce((a, b) => a + b, 0);
  // Households 1…11 (Bills in onward; not the lead, not the lost deal) have a year of bills.
  for (let i = 1; i < ctx.dealIds.length - 1; i++) {
    const annualKwh = 9_000 + 700 * i;
    const bills: StoredBill[] = [];
    for (let m = 0; m < 12; m++) {
      const kwh = Math.round((annualKwh * shape[m]) / shapeTotal);
      const row = {
        id: `7a11a55e-0000-4000-8000-${String(7000 + i * 100 + m).padStart(12, "0")}`,
        periodStart: new Date(Date.UTC(2025, m, 1)).toISOString().slice(0, 10),
        periodEnd: new Date(Date.UTC(2025, m + 1, 1)).toISOString().slice(0, 10),
        kwh,
        costCents: Math.round(kwh * CENTS_PER_KWH + FIXED_CENTS),
      };
      bills.push(row);
      await ctx.tx.insert(bill).values({ ...row, companyId: ctx.companyId, dealId: ctx.dealIds[i] });
    }
    await storeUsage(ctx, ctx.dealIds[i], usageId(i), bills, null);
  }

  // The household whose deal was lost had sent its utility's Green Button download.
  const bytes = new Uint8Array(await readFile(GREEN_BUTTON_FIXTURE));
  const profile = importIntervalData(new TextDecoder().decode(bytes), { format: "espi-xml", utcOffsetHours: -5 });
  const storageKey = `${ctx.companyId}/uploads/${INTERVAL_UPLOAD_ID}.xml`;
  await seedStore("demo interval data").put(storageKey, bytes);
  const dealId = ctx.dealIds[ctx.dealIds.length - 1];
  await ctx.tx.insert(upload).values({
    id: INTERVAL_UPLOAD_ID,
    companyId: ctx.companyId,
    dealId,
    purpose: "interval_data",
    fileName: "green-button-download.xml",
    mimeType: "application/xml",
    sizeBytes: bytes.byteLength,
    sha256: createHash("sha256").update(bytes).digest("hex"),
    storageKey,
    uploadedByUserId: ctx.people.find((p) => p.role === "sales_rep")?.id ?? null,
  });
  await ctx.tx.insert(intervalProfile).values({
    id: INTERVAL_PROFILE_ID,
    companyId: ctx.companyId,
    dealId,
    uploadId: INTERVAL_UPLOAD_ID,
    hourlyKwh: profile.hourlyKwh,
    annualKwh: profile.annualKwh,
    coveragePct: profile.coverage * 100,
  });
  await storeUsage(ctx, dealId, usageId(ctx.dealIds.length - 1), [], { hourlyKwh: profile.hourlyKwh, coveragePct: profile.coverage * 100 });
}

const usageId = (dealIndex: number) => `7a11a55e-0000-4000-8000-${String(6100 + dealIndex).padStart(12, "0")}`;

async function storeUsage(ctx: SeedContext, dealId: string, id: string, bills: StoredBill[], interval: StoredInterval | null): Promise<void> {
  await ctx.tx.insert(dealUsage).values({ id, companyId: ctx.companyId, dealId, version: 1, ...deriveUsageYear(bills, interval) });
}
