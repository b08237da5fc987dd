import "server-only";
import { and, asc, eq } from "drizzle-orm";
import { bosPart } from "@/db/schema";
import { BOS_CSV_COLUMNS, bosCsvRecord, bosInputOfRecord, bosPartSchema, type BosPartValues } from "@/lib/schemas/bos";
import type { CsvImportReport, CsvRowError, ImportMode } from "@/lib/schemas/catalog";
import { importCsv, issuesToErrors, toCsv, upsertByMakerModel } from "@/server/catalog";
import { db } from "@/server/db";
import { HttpError, isDuplicateKey } from "@/server/errors";
import { companyRowOrThrow } from "@/server/records";
import { validationError } from "@/server/route";
import type { Member } from "@/server/session";

// Balance-of-system parts (bos_part): one list of kinds, each with its own fields; the CSV
// import and export reuse the equipment catalog's machinery (src/server/catalog.ts).

export type BosPart = typeof bosPart.$inferSelect;

/** The company's parts by kind, maker and model; `activeOnly` for what a bill of materials may use. */
export async function listBosParts(companyId: string, activeOnly = false): Promise<BosPart[]> {
  return db()
    .select()
    .from(bosPart)
    .where(activeOnly ? and(eq(bosPart.companyId, companyId), eq(bosPart.active, true)) : eq(bosPart.companyId, companyId))
    .orderBy(asc(bosPart.kind), asc(bosPart.manufacturer), asc(bosPart.model));
}

export async function getBosPartOrThrow(companyId: string, id: string): Promise<BosPart> {
  return companyRowOrThrow(bosPart, companyId, id, "Part");
}

const columnsOf = (v: BosPartValues) => ({ kind: v.details.kind, manufacturer: v.manufacturer, model: v.model, details: v.details, priceLineItemId: v.priceLineItemId });

const duplicate = (v: { manufacturer: string; model: string }) =>
  new HttpError(409, "duplicate_model", `The catalog already has the part ${v.manufacturer} ${v.model}.`, { model: [`${v.manufacturer} ${v.model} is already in the catalog`] });

export async function createBosPart(member: Member, input: unknown): Promise<BosPart> {
  const parsed = bosPartSchema.safeParse(input);
  if (!parsed.success) throw validationError(parsed.error);
  const id = crypto.randomUUID();
  try {
    await db().insert(bosPart).values({ id, companyId: member.companyId, ...columnsOf(parsed.data) });
  } catch (err) {
    if (isDuplicateKey(err)) throw duplicate(parsed.data);
    throw err;
  }
  return getBosPartOrThrow(member.companyId, id);
}

/** Parts are never deleted (a bill of materials may name them): deactivating hides them from new bills. */
export async function setBosPartActive(member: Member, id: string, active: boolean): Promise<BosPart> {
  await getBosPartOrThrow(member.companyId, id);
  await db()
    .update(bosPart)
    .set({ active })
    .where(and(eq(bosPart.id, id), eq(bosPart.companyId, member.companyId)));
  return getBosPartOrThrow(member.companyId, id);
}

export async function exportBosCsv(companyId: string): Promise<string> {
  const rows = await listBosParts(companyId);
  return toCsv(BOS_CSV_COLUMNS, rows.map((r) => bosCsvRecord(r)));
}

/** CSV import: one row per part, its kind's columns filled and the others empty. */
export async function importBosCsv(member: Member, text: string, mode: ImportMode): Promise<CsvImportReport> {
  const columnOf = new Map(BOS_CSV_COLUMNS.map((c) => [c.field, c.name]));
  return importCsv<BosPartValues>(member, text, mode, {
    columns: BOS_CSV_COLUMNS,
    validate: (row, flat) => {
      const { input, foreign } = bosInputOfRecord(flat);
      const errors: CsvRowError[] = foreign.map((f) => ({ line: row.line, column: columnOf.get(f) ?? f, message: `Leave ${columnOf.get(f) ?? f} empty for a ${String(flat.kind)} part` }));
      const parsed = bosPartSchema.safeParse(input);
      if (!parsed.success) {
        // Issues under details.<field> name the CSV column of that field.
        const issues = parsed.error.issues.map((i) => ({ ...i, path: i.path[0] === "details" ? i.path.slice(1) : i.path }));
        return { errors: [...errors, ...issuesToErrors(row.line, { issues } as typeof parsed.error, BOS_CSV_COLUMNS)] };
      }
      return { value: parsed.data, errors };
    },
    upsert: (tx, companyId, value, active) => upsertByMakerModel(tx, bosPart, companyId, value, columnsOf(value), active),
  });
}
