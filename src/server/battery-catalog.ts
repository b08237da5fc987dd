import "server-only";
import { and, asc, eq } from "drizzle-orm";
import type { z } from "zod";
import { batteryModel } from "@/db/schema";
import { BATTERY_CSV_COLUMNS, batteryModelSchema, type BatteryModelValues, type batteryPatchSchema } from "@/lib/schemas/battery-catalog";
import type { CsvImportReport, CsvRowError, ImportMode } from "@/lib/schemas/catalog";
import { duplicate, importCsv, issuesToErrors, parseWhole, toCsv } from "@/server/catalog";
import { db } from "@/server/db";
import { HttpError, isDuplicateKey } from "@/server/errors";
import { companyRowOrThrow } from "@/server/records";
import type { Member } from "@/server/session";

// Home batteries in the company's catalog: the same reads, writes and CSV machinery as modules
// and inverters (src/server/catalog.ts), every query filtered by the company.

export type BatteryModel = typeof batteryModel.$inferSelect;

export async function listBatteries(companyId: string, opts: { activeOnly?: boolean } = {}): Promise<BatteryModel[]> {
  const where = opts.activeOnly ? and(eq(batteryModel.companyId, companyId), eq(batteryModel.active, true)) : eq(batteryModel.companyId, companyId);
  return db().select().from(batteryModel).where(where).orderBy(asc(batteryModel.manufacturer), asc(batteryModel.model));
}

export async function getBatteryOrThrow(companyId: string, id: string): Promise<BatteryModel> {
  return companyRowOrThrow(batteryModel, companyId, id, "Battery");
}

/** The stored columns of a battery (a row's own id, company and status left out). */
function batteryColumns(v: BatteryModelValues): BatteryModelValues {
  const { manufacturer, model, usableKwh, continuousKw, peakKw, roundTripEfficiencyPct, depthOfDischargePct, warrantyYears, warrantyThroughputMwh, coupling } = v;
  return { manufacturer, model, usableKwh, continuousKw, peakKw, roundTripEfficiencyPct, depthOfDischargePct, warrantyYears, warrantyThroughputMwh, coupling };
}

/** Runs a write, turning a taken (manufacturer, model) into the catalog's 409. */
async function writeUnlessDuplicate(values: BatteryModelValues, write: () => Promise<unknown>): Promise<void> {
  try {
    await write();
  } catch (err) {
    throw isDuplicateKey(err) ? duplicate("battery", values) : err;
  }
}

export async function createBattery(member: Member, input: unknown): Promise<BatteryModel> {
  const values = parseWhole(batteryModelSchema, input);
  const id = crypto.randomUUID();
  await writeUnlessDuplicate(values, () => db().insert(batteryModel).values({ id, companyId: member.companyId, ...batteryColumns(values) }));
  return getBatteryOrThrow(member.companyId, id);
}

/** Changes some fields (the merged record is checked as a whole) and/or `active`. */
export async function patchBattery(member: Member, id: string, patch: z.output<typeof batteryPatchSchema>): Promise<BatteryModel> {
  const existing = await getBatteryOrThrow(member.companyId, id);
  const { active, ...fields } = patch;
  if (Object.keys(fields).length === 0 && active === undefined) throw new HttpError(422, "validation_failed", "Give at least one field to change.");
  const values = parseWhole(batteryModelSchema, { ...batteryColumns(existing), ...fields });
  const set = { ...batteryColumns(values), ...(active === undefined ? {} : { active }) };
  await writeUnlessDuplicate(values, () => db().update(batteryModel).set(set).where(and(eq(batteryModel.id, id), eq(batteryModel.companyId, member.companyId))));
  return getBatteryOrThrow(member.companyId, id);
}

export async function exportBatteriesCsv(companyId: string): Promise<string> {
  return toCsv(BATTERY_CSV_COLUMNS, await listBatteries(companyId));
}

/** A CSV row's input checked by the battery schema; problems named by line and column. */
function checkRow(line: number, input: Record<string, unknown>): { value?: BatteryModelValues; errors: CsvRowError[] } {
  const parsed = batteryModelSchema.safeParse(input);
  if (!parsed.success) return { errors: issuesToErrors(line, parsed.error, BATTERY_CSV_COLUMNS) };
  return { value: parsed.data, errors: [] };
}

export async function importBatteriesCsv(member: Member, text: string, mode: ImportMode): Promise<CsvImportReport> {
  return importCsv<BatteryModelValues>(member, text, mode, {
    columns: BATTERY_CSV_COLUMNS,
    validate: (row, input) => checkRow(row.line, input),
    // One statement on the unique key (company, manufacturer, model): MySQL counts 1 affected row for an insert, 2 (or 0 when nothing changed) for an update.
    upsert: async (tx, companyId, value, active) => {
      const [result] = await tx
        .insert(batteryModel)
        .values({ id: crypto.randomUUID(), companyId, ...batteryColumns(value), active: active ?? true })
        .onDuplicateKeyUpdate({ set: { ...batteryColumns(value), ...(active === undefined ? {} : { active }) } });
      return result.affectedRows === 1 ? "created" : "updated";
    },
  });
}
