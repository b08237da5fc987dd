import "server-only";
import { and, asc, eq } from "drizzle-orm";
import type { MySqlColumn, MySqlTable } from "drizzle-orm/mysql-core";
import { fileTypeFromBuffer } from "file-type";
import Papa from "papaparse";
import { isBlankRecord, readCsvRecords } from "@/engine/csv";
import { parseTemperatureCoefficient, type CoefficientUnit } from "@/engine/module-coefficients";
import type { z } from "zod";
import { inverterModel, moduleModel } from "@/db/schema";
import {
  CSV_MAX_BYTES,
  CSV_MAX_ROWS,
  importModeSchema,
  INVERTER_CSV_COLUMNS,
  inverterModelSchema,
  MICRO_ONLY_FIELDS,
  MODULE_CSV_COLUMNS,
  moduleModelSchema,
  STRING_ONLY_FIELDS,
  type CsvColumn,
  type CsvImportReport,
  type CsvRowError,
  type ImportMode,
  type InverterModelValues,
  type inverterPatchSchema,
  type ModuleModelInput,
  type ModuleModelValues,
  VOC_COEFF_UNIT_KEY,
  VOC_COEFF_UNIT_OF_KEY,
  type modulePatchSchema,
} from "@/lib/schemas/catalog";
import { BODY_CAPS, readCappedBody, readCappedForm } from "@/server/body-limit";
import { companyRowOrThrow } from "@/server/records";
import { db, transaction, type Tx } from "@/server/db";
import { HttpError, isDuplicateKey } from "@/server/errors";
import { validationError } from "@/server/route";
import type { Member } from "@/server/session";

/** A catalog module with its Voc coefficient as typed ({ value, unit }). */
export type ModuleModel = typeof moduleModel.$inferSelect & { vocCoeff: { value: number; unit: CoefficientUnit } };

/** Rows saved before the unit was kept have only the %/°C figure. */
function withVocCoeff(row: typeof moduleModel.$inferSelect): ModuleModel {
  return { ...row, vocCoeff: { value: row.vocCoeffValue ?? row.betaVocPctPerC, unit: VOC_COEFF_UNIT_OF_KEY[row.vocCoeffUnit] } };
}
export type InverterModel = typeof inverterModel.$inferSelect;

// ── Reads (every one filtered by company in the query) ───────────────────────────────

/** The whole module list of a company, active and deactivated (the admin's view). */
export async function listModules(companyId: string): Promise<ModuleModel[]> {
  const rows = await db().select().from(moduleModel).where(eq(moduleModel.companyId, companyId)).orderBy(asc(moduleModel.manufacturer), asc(moduleModel.model));
  return rows.map(withVocCoeff);
}

/** Modules a new design may use. */
export async function listActiveModules(companyId: string): Promise<ModuleModel[]> {
  const rows = await db()
    .select()
    .from(moduleModel)
    .where(and(eq(moduleModel.companyId, companyId), eq(moduleModel.active, true)))
    .orderBy(asc(moduleModel.manufacturer), asc(moduleModel.model));
  return rows.map(withVocCoeff);
}

/** A module of the company, active or not (an existing design may use a deactivated one). */
export async function getModuleOrThrow(companyId: string, id: string): Promise<ModuleModel> {
  return withVocCoeff(await companyRowOrThrow(moduleModel, companyId, id, "Module"));
}

export async function listInverters(companyId: string): Promise<InverterModel[]> {
  return db()
    .select()
    .from(inverterModel)
    .where(eq(inverterModel.companyId, companyId))
    .orderBy(asc(inverterModel.manufacturer), asc(inverterModel.model));
}

/** Inverters a new design may use. */
export async function listActiveInverters(companyId: string): Promise<InverterModel[]> {
  return db()
    .select()
    .from(inverterModel)
    .where(and(eq(inverterModel.companyId, companyId), eq(inverterModel.active, true)))
    .orderBy(asc(inverterModel.manufacturer), asc(inverterModel.model));
}

export async function getInverterOrThrow(companyId: string, id: string): Promise<InverterModel> {
  return companyRowOrThrow(inverterModel, companyId, id, "Inverter");
}

// ── Writes ───────────────────────────────────────────────────────────────────────────

export const duplicate = (what: string, v: { manufacturer: string; model: string }) =>
  new HttpError(409, "duplicate_model", `The catalog already has the ${what} ${v.manufacturer} ${v.model}.`, {
    model: [`${v.manufacturer} ${v.model} is already in the catalog`],
  });

function moduleColumns(v: ModuleModelValues) {
  return {
    manufacturer: v.manufacturer,
    model: v.model,
    stcWatts: v.stcWatts,
    vocV: v.vocV,
    iscA: v.iscA,
    vmpV: v.vmpV,
    impA: v.impA,
    gammaPmaxPctPerC: v.gammaPmaxPctPerC,
    betaVocPctPerC: v.betaVocPctPerC,
    vocCoeffValue: v.vocCoeff.value,
    vocCoeffUnit: VOC_COEFF_UNIT_KEY[v.vocCoeff.unit],
    maxSeriesFuseA: v.maxSeriesFuseA,
    lengthMm: v.lengthMm,
    widthMm: v.widthMm,
    cellTechnology: v.cellTechnology,
    construction: v.construction,
    encapsulant: v.encapsulant,
  };
}

/** A stored module as the schema's input (for merging a partial change). */
function moduleInput(row: ModuleModel): ModuleModelInput {
  const { vocCoeffValue: _value, vocCoeffUnit: _unit, betaVocPctPerC: _pct, ...columns } = moduleColumns({ ...row, vocCoeff: row.vocCoeff });
  return columns;
}

/** The inverter's columns; the other kind's fields are stored empty. */
function inverterColumns(v: InverterModelValues) {
  const common = { manufacturer: v.manufacturer, model: v.model, kind: v.kind, acWatts: v.acWatts, efficiencyPct: v.efficiencyPct };
  const none = { maxDcVoltageV: null, mpptMinV: null, mpptMaxV: null, maxInputCurrentA: null, mpptCount: null, dcInputMinV: null, dcInputMaxV: null, modulesPerUnit: null };
  if (v.kind === "string") {
    return { ...common, ...none, maxDcVoltageV: v.maxDcVoltageV, mpptMinV: v.mpptMinV, mpptMaxV: v.mpptMaxV, maxInputCurrentA: v.maxInputCurrentA, mpptCount: v.mpptCount };
  }
  return { ...common, ...none, dcInputMinV: v.dcInputMinV, dcInputMaxV: v.dcInputMaxV, modulesPerUnit: v.modulesPerUnit };
}

export function parseWhole<S extends z.ZodType>(schema: S, input: unknown): z.output<S> {
  const parsed = schema.safeParse(input);
  if (!parsed.success) throw validationError(parsed.error);
  return parsed.data;
}

export async function createModule(member: Member, input: ModuleModelInput): Promise<ModuleModel> {
  const values = parseWhole(moduleModelSchema, input);
  const id = crypto.randomUUID();
  try {
    await db().insert(moduleModel).values({ id, companyId: member.companyId, ...moduleColumns(values) });
  } catch (err) {
    if (isDuplicateKey(err)) throw duplicate("module", values);
    throw err;
  }
  return getModuleOrThrow(member.companyId, id);
}

/** Replaces a module's datasheet values (checked whole) and optionally its active flag. */
export async function updateModule(member: Member, id: string, input: ModuleModelInput, active?: boolean): Promise<ModuleModel> {
  await getModuleOrThrow(member.companyId, id);
  const values = parseWhole(moduleModelSchema, input);
  try {
    await db()
      .update(moduleModel)
      .set({ ...moduleColumns(values), ...(active === undefined ? {} : { active }) })
      .where(and(eq(moduleModel.id, id), eq(moduleModel.companyId, member.companyId)));
  } catch (err) {
    if (isDuplicateKey(err)) throw duplicate("module", values);
    throw err;
  }
  return getModuleOrThrow(member.companyId, id);
}

/** A partial change (PATCH): merged onto the stored module, then checked as a whole. */
export async function patchModule(member: Member, id: string, patch: z.output<typeof modulePatchSchema>): Promise<ModuleModel> {
  const existing = await getModuleOrThrow(member.companyId, id);
  const { active, ...fields } = patch;
  if (Object.keys(fields).length === 0) {
    if (active === undefined) throw new HttpError(422, "validation_failed", "Give at least one field to change.");
    return setModuleActive(member, id, active);
  }
  // A %/°C figure sent alone replaces the stored coefficient, whatever unit that was typed in.
  const keep = fields.betaVocPctPerC !== undefined && fields.vocCoeff === undefined ? { betaVocPctPerC: fields.betaVocPctPerC } : { vocCoeff: existing.vocCoeff };
  const merged = { ...moduleInput(existing), ...keep, ...fields };
  return updateModule(member, id, parseWhole(moduleModelSchema, merged), active);
}

/**
 * Deactivating hides a module from new designs; designs that use it keep it. Equipment is
 * never deleted, so no design loses its datasheet.
 */
export async function setModuleActive(member: Member, id: string, active: boolean): Promise<ModuleModel> {
  await getModuleOrThrow(member.companyId, id);
  await db()
    .update(moduleModel)
    .set({ active })
    .where(and(eq(moduleModel.id, id), eq(moduleModel.companyId, member.companyId)));
  return getModuleOrThrow(member.companyId, id);
}

export async function createInverter(member: Member, input: InverterModelValues): Promise<InverterModel> {
  const values = parseWhole(inverterModelSchema, input);
  const id = crypto.randomUUID();
  try {
    await db().insert(inverterModel).values({ id, companyId: member.companyId, ...inverterColumns(values) });
  } catch (err) {
    if (isDuplicateKey(err)) throw duplicate("inverter", values);
    throw err;
  }
  return getInverterOrThrow(member.companyId, id);
}

export async function updateInverter(member: Member, id: string, input: InverterModelValues, active?: boolean): Promise<InverterModel> {
  await getInverterOrThrow(member.companyId, id);
  const values = parseWhole(inverterModelSchema, input);
  try {
    await db()
      .update(inverterModel)
      .set({ ...inverterColumns(values), ...(active === undefined ? {} : { active }) })
      .where(and(eq(inverterModel.id, id), eq(inverterModel.companyId, member.companyId)));
  } catch (err) {
    if (isDuplicateKey(err)) throw duplicate("inverter", values);
    throw err;
  }
  return getInverterOrThrow(member.companyId, id);
}

/** The stored inverter as form/schema input (nulls of the other kind dropped). */
export function inverterInput(row: InverterModel): Record<string, unknown> {
  const out: Record<string, unknown> = { kind: row.kind, manufacturer: row.manufacturer, model: row.model, acWatts: row.acWatts, efficiencyPct: row.efficiencyPct };
  const own = row.kind === "string" ? STRING_ONLY_FIELDS : MICRO_ONLY_FIELDS;
  for (const f of own) out[f] = row[f];
  return out;
}

export async function patchInverter(member: Member, id: string, patch: z.output<typeof inverterPatchSchema>): Promise<InverterModel> {
  const existing = await getInverterOrThrow(member.companyId, id);
  const { active, ...fields } = patch;
  if (Object.keys(fields).length === 0) {
    if (active === undefined) throw new HttpError(422, "validation_failed", "Give at least one field to change.");
    return setInverterActive(member, id, active);
  }
  const merged = { ...inverterInput(existing), ...fields };
  return updateInverter(member, id, parseWhole(inverterModelSchema, merged), active);
}

export async function setInverterActive(member: Member, id: string, active: boolean): Promise<InverterModel> {
  await getInverterOrThrow(member.companyId, id);
  await db()
    .update(inverterModel)
    .set({ active })
    .where(and(eq(inverterModel.id, id), eq(inverterModel.companyId, member.companyId)));
  return getInverterOrThrow(member.companyId, id);
}

// ── CSV export ───────────────────────────────────────────────────────────────────────

export function toCsv(columns: readonly CsvColumn[], rows: Record<string, unknown>[]): string {
  return Papa.unparse(
    {
      fields: columns.map((c) => c.name),
      data: rows.map((r) =>
        columns.map((c) => {
          const v = r[c.field];
          if (v === null || v === undefined) return "";
          if (c.type === "coefficient" && typeof v === "object") return `${(v as { value: number }).value} ${(v as { unit: string }).unit}`;
          return String(v);
        }),
      ),
    },
    { newline: "\r\n" },
  );
}

export async function exportModulesCsv(companyId: string): Promise<string> {
  return toCsv(MODULE_CSV_COLUMNS, await listModules(companyId));
}

export async function exportInvertersCsv(companyId: string): Promise<string> {
  return toCsv(INVERTER_CSV_COLUMNS, await listInverters(companyId));
}

// ── CSV import ───────────────────────────────────────────────────────────────────────

/**
 * The text of an uploaded CSV file, or a refusal: size limit, no binary file (checked by
 * content with file-type, e.g. a spreadsheet saved as .xlsx), UTF-8 text only.
 */
export async function csvTextFromUpload(bytes: Uint8Array): Promise<string> {
  if (bytes.byteLength === 0) throw new HttpError(422, "empty_file", "The file is empty.");
  if (bytes.byteLength > CSV_MAX_BYTES) {
    throw new HttpError(413, "file_too_large", `The file is larger than ${CSV_MAX_BYTES / 1_000_000} MB. Split it into smaller files.`);
  }
  const detected = await fileTypeFromBuffer(bytes);
  if (detected) {
    throw new HttpError(415, "not_csv", `This is a ${detected.ext.toUpperCase()} file, not CSV. Save the sheet as CSV (comma-separated, UTF-8) and upload that.`);
  }
  let text: string;
  try {
    text = new TextDecoder("utf-8", { fatal: true }).decode(bytes);
  } catch {
    throw new HttpError(415, "not_csv", "The file is not UTF-8 text. Save it as CSV UTF-8 and upload it again.");
  }
  if (text.includes("\u0000")) throw new HttpError(415, "not_csv", "The file contains binary data, not CSV text.");
  return text;
}

/** The CSV text and import mode of an import request: a multipart form (file, mode) or a text/csv body (?mode=). */
export async function readCsvUpload(req: Request): Promise<{ text: string; mode: ImportMode }> {
  const contentType = req.headers.get("content-type") ?? "";
  let bytes: Uint8Array;
  let modeValue: unknown;
  if (contentType.startsWith("multipart/form-data")) {
    // Capped before parsing (413 past BODY_CAPS.csvImport); the file's own size is checked below.
    const form = await readCappedForm(req, BODY_CAPS.csvImport, "the CSV file");
    const file = form.get("file");
    if (!(file instanceof File)) throw new HttpError(422, "validation_failed", "Choose a CSV file to import.", { file: ["Choose a CSV file"] });
    bytes = new Uint8Array(await file.arrayBuffer());
    modeValue = form.get("mode") ?? "all_or_nothing";
  } else {
    bytes = await readCappedBody(req, BODY_CAPS.csvImport);
    modeValue = new URL(req.url).searchParams.get("mode") ?? "all_or_nothing";
  }
  const mode = importModeSchema.safeParse(modeValue);
  if (!mode.success) throw validationError(mode.error);
  return { text: await csvTextFromUpload(bytes), mode: mode.data };
}

export type CsvRow = { line: number; cells: Record<string, string> };

/** Parses the CSV with Papa Parse (src/engine/csv.ts), keeping each row's line number in the file. */
function readCsv(text: string, columns: readonly CsvColumn[]): { rows: CsvRow[]; errors: CsvRowError[] } {
  const meaningful = readCsvRecords(text).filter((r) => !isBlankRecord(r));
  const errors: CsvRowError[] = [];
  const header = meaningful.shift();
  if (!header) return { rows: [], errors: [{ line: 1, column: "file", message: "The file has no header row and no data." }] };

  const names = header.cells.map((c) => c.trim().toLowerCase());
  const known = new Map(columns.map((c) => [c.name, c]));
  const seen = new Set<string>();
  for (const name of names) {
    if (!known.has(name)) {
      errors.push({ line: header.line, column: name || "(empty)", message: `Unknown column "${name}". Columns: ${columns.map((c) => c.name).join(",")}` });
    } else if (seen.has(name)) {
      errors.push({ line: header.line, column: name, message: `The column "${name}" appears twice` });
    }
    seen.add(name);
  }
  for (const c of columns) {
    if (c.required && !seen.has(c.name)) errors.push({ line: header.line, column: c.name, message: `Missing column "${c.name}"` });
  }
  if (errors.length > 0) return { rows: [], errors };
  if (meaningful.length > CSV_MAX_ROWS) {
    return { rows: [], errors: [{ line: meaningful[CSV_MAX_ROWS].line, column: "file", message: `More than ${CSV_MAX_ROWS} rows; split the file.` }] };
  }

  const rows: CsvRow[] = [];
  for (const r of meaningful) {
    if (r.problem) {
      errors.push({ line: r.line, column: "row", message: `This row cannot be read: ${r.problem}` });
      continue;
    }
    if (r.cells.length !== names.length) {
      errors.push({ line: r.line, column: "row", message: `This row has ${r.cells.length} values; the header has ${names.length} columns` });
      continue;
    }
    const cells: Record<string, string> = {};
    names.forEach((n, i) => (cells[n] = r.cells[i].trim()));
    rows.push({ line: r.line, cells });
  }
  return { rows, errors };
}

const BOOLEAN_WORDS: Record<string, boolean> = { true: true, false: false, yes: true, no: false, "1": true, "0": false };

/** One CSV row as schema input (cells typed per column); problems the schema cannot see are returned. */
function rowToInput(row: CsvRow, columns: readonly CsvColumn[]): { input: Record<string, unknown>; active?: boolean; errors: CsvRowError[] } {
  const input: Record<string, unknown> = {};
  const errors: CsvRowError[] = [];
  let active: boolean | undefined;
  for (const c of columns) {
    const cell = row.cells[c.name];
    if (cell === undefined) continue;
    if (c.type === "boolean") {
      if (cell === "") continue;
      const b = BOOLEAN_WORDS[cell.toLowerCase()];
      if (b === undefined) errors.push({ line: row.line, column: c.name, message: `${c.name} must be true or false` });
      else active = b;
    } else if (c.type === "number" || c.type === "integer") {
      // Empty stays undefined (the schema asks for a number); text becomes NaN (the schema says so).
      input[c.field] = cell === "" ? undefined : Number(cell);
    } else if (c.type === "coefficient") {
      const coeff = cell === "" ? undefined : parseTemperatureCoefficient(cell);
      if (coeff === null) errors.push({ line: row.line, column: c.name, message: `${c.name} must be a number with its unit, %/°C, mV/°C or V/°C (e.g. -0.26 %/°C or -104 mV/°C)` });
      else input[c.field] = coeff;
    } else if (c.type === "enum") {
      input[c.field] = cell === "" ? undefined : cell.toLowerCase();
    } else {
      input[c.field] = cell === "" && !c.required ? null : cell;
    }
  }
  return { input, active, errors };
}

export function issuesToErrors(line: number, error: z.ZodError, columns: readonly CsvColumn[]): CsvRowError[] {
  const byField = new Map(columns.map((c) => [c.field, c.name]));
  return error.issues.map((i) => ({ line, column: byField.get(String(i.path[0])) ?? "row", message: i.message }));
}

export type ImportSpec<V extends { manufacturer: string; model: string }> = {
  columns: readonly CsvColumn[];
  validate: (row: CsvRow, input: Record<string, unknown>) => { value?: V; errors: CsvRowError[] };
  upsert: (tx: Tx, companyId: string, value: V, active: boolean | undefined) => Promise<"created" | "updated">;
};

export async function importCsv<V extends { manufacturer: string; model: string }>(
  member: Member,
  text: string,
  mode: ImportMode,
  spec: ImportSpec<V>,
): Promise<CsvImportReport> {
  const { rows, errors } = readCsv(text, spec.columns);
  const report: CsvImportReport = { mode, applied: false, rowsRead: rows.length, created: [], updated: [], errors };
  const good: { line: number; value: V; active?: boolean }[] = [];
  const firstLineOf = new Map<string, number>();
  for (const row of rows) {
    const typed = rowToInput(row, spec.columns);
    const checked = spec.validate(row, typed.input);
    const rowErrors = [...typed.errors, ...checked.errors];
    if (checked.value && rowErrors.length === 0) {
      const key = `${checked.value.manufacturer.toLowerCase()}\u0000${checked.value.model.toLowerCase()}`;
      const first = firstLineOf.get(key);
      if (first !== undefined) {
        rowErrors.push({ line: row.line, column: "model", message: `${checked.value.manufacturer} ${checked.value.model} is already on line ${first}` });
      } else {
        firstLineOf.set(key, row.line);
        good.push({ line: row.line, value: checked.value, active: typed.active });
      }
    }
    report.errors.push(...rowErrors);
  }
  report.errors.sort((a, b) => a.line - b.line);
  const fileLevel = report.errors.some((e) => e.column === "file") || (rows.length === 0 && report.errors.length > 0);
  if (fileLevel || (mode === "all_or_nothing" && report.errors.length > 0) || good.length === 0) return report;

  // One transaction: either every good row is written or, on any failure, none.
  await transaction(async (tx) => {
    for (const g of good) {
      const outcome = await spec.upsert(tx, member.companyId, g.value, g.active);
      report[outcome].push({ line: g.line, manufacturer: g.value.manufacturer, model: g.value.model });
    }
  });
  report.applied = true;
  return report;
}

/** A catalog table keyed by company, manufacturer and model (modules, inverters, BOS parts). */
type MakerModelTable = MySqlTable & { id: MySqlColumn; companyId: MySqlColumn; manufacturer: MySqlColumn; model: MySqlColumn };

/**
 * A CSV row's write: the company's row with this manufacturer and model is updated (its active
 * flag only when the row says), else a new active row is added. `columns` come from the table's
 * own column function, so their names are the table's.
 */
export async function upsertByMakerModel(
  tx: Tx,
  table: MakerModelTable,
  companyId: string,
  key: { manufacturer: string; model: string },
  columns: Record<string, unknown>,
  active: boolean | undefined,
): Promise<"created" | "updated"> {
  const [existing] = await tx
    .select({ id: table.id })
    .from(table)
    .where(and(eq(table.companyId, companyId), eq(table.manufacturer, key.manufacturer), eq(table.model, key.model)))
    .limit(1);
  if (existing) {
    await tx
      .update(table)
      .set({ ...columns, ...(active === undefined ? {} : { active }) } as never)
      .where(and(eq(table.id, existing.id), eq(table.companyId, companyId)));
    return "updated";
  }
  await tx.insert(table).values({ id: crypto.randomUUID(), companyId, ...columns, active: active ?? true } as never);
  return "created";
}

export async function importModulesCsv(member: Member, text: string, mode: ImportMode): Promise<CsvImportReport> {
  return importCsv<ModuleModelValues>(member, text, mode, {
    columns: MODULE_CSV_COLUMNS,
    validate: (row, input) => {
      const parsed = moduleModelSchema.safeParse(input);
      return parsed.success ? { value: parsed.data, errors: [] } : { errors: issuesToErrors(row.line, parsed.error, MODULE_CSV_COLUMNS) };
    },
    upsert: (tx, companyId, value, active) => upsertByMakerModel(tx, moduleModel, companyId, value, moduleColumns(value), active),
  });
}

export async function importInvertersCsv(member: Member, text: string, mode: ImportMode): Promise<CsvImportReport> {
  const columnOf = new Map(INVERTER_CSV_COLUMNS.map((c) => [c.field, c.name]));
  return importCsv<InverterModelValues>(member, text, mode, {
    columns: INVERTER_CSV_COLUMNS,
    validate: (row, input) => {
      const errors: CsvRowError[] = [];
      // A value in the other kind's columns is most likely a row typed under the wrong kind.
      const foreign = input.kind === "string" ? MICRO_ONLY_FIELDS : input.kind === "micro" ? STRING_ONLY_FIELDS : [];
      for (const f of foreign) {
        if (input[f] !== undefined) {
          errors.push({ line: row.line, column: columnOf.get(f) ?? f, message: `Leave ${columnOf.get(f)} empty for a ${input.kind} inverter` });
        }
      }
      const parsed = inverterModelSchema.safeParse(input);
      if (!parsed.success) return { errors: [...errors, ...issuesToErrors(row.line, parsed.error, INVERTER_CSV_COLUMNS)] };
      return { value: parsed.data, errors };
    },
    upsert: (tx, companyId, value, active) => upsertByMakerModel(tx, inverterModel, companyId, value, inverterColumns(value), active),
  });
}
