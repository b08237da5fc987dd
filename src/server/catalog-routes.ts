import "server-only";
import { NextResponse } from "next/server";
import { inverterModelSchema, moduleModelSchema } from "@/lib/schemas/catalog";
import {
  createInverter,
  createModule,
  exportInvertersCsv,
  exportModulesCsv,
  importInvertersCsv,
  importModulesCsv,
  listActiveInverters,
  listActiveModules,
  listInverters,
  listModules,
  readCsvUpload,
} from "@/server/catalog";
import { exportBosCsv, importBosCsv, listBosParts } from "@/server/bos-catalog";
import { csvDownload, readJson, withMember } from "@/server/route";

// The catalog's two kinds of equipment answer the same routes: /api/module-models and
// /api/inverter-models (list, add, CSV import and export).
const KINDS = {
  modules: { list: listModules, listActive: listActiveModules, importCsv: importModulesCsv, exportCsv: exportModulesCsv },
  inverters: { list: listInverters, listActive: listActiveInverters, importCsv: importInvertersCsv, exportCsv: exportInvertersCsv },
  // Balance-of-system parts (/api/bos-parts): added one at a time by their own POST (src/server/bos-catalog.ts).
  "bos-parts": { list: (companyId: string) => listBosParts(companyId), listActive: (companyId: string) => listBosParts(companyId, true), importCsv: importBosCsv, exportCsv: exportBosCsv },
};

/** GET: the company's equipment of this kind; `?active=1` lists only what a new design may use. */
export function listEquipment(kind: keyof typeof KINDS) {
  const k = KINDS[kind];
  return withMember("catalog:read", async ({ req, member }) => {
    const activeOnly = req.nextUrl.searchParams.get("active") === "1";
    return NextResponse.json({ data: activeOnly ? await k.listActive(member.companyId) : await k.list(member.companyId) });
  });
}

/** POST: adds one (409 when the manufacturer and model are already in the catalog). */
export function addEquipment(kind: "modules" | "inverters") {
  return withMember("catalog:manage", async ({ req, member }) =>
    kind === "modules"
      ? NextResponse.json({ data: await createModule(member, await readJson(req, moduleModelSchema)) }, { status: 201 })
      : NextResponse.json({ data: await createInverter(member, await readJson(req, inverterModelSchema)) }, { status: 201 }),
  );
}

/**
 * POST …/import: CSV as a multipart form (`file`, `mode`) or a text/csv body with `?mode=`.
 * Answers the report: each bad row by line and column, and what was created or updated
 * (nothing when a row is bad in all_or_nothing mode).
 */
export function importEquipment(kind: keyof typeof KINDS) {
  return withMember(
    "catalog:manage",
    async ({ req, member }) => {
      const { text, mode } = await readCsvUpload(req);
      return NextResponse.json({ data: await KINDS[kind].importCsv(member, text, mode) });
    },
    // A text/csv body cannot be sent by another site without a CORS preflight, so it is as safe as JSON here.
    { bodyTypes: ["multipart/form-data", "text/csv"] },
  );
}

/** GET …/export: the equipment as CSV (columns documented on the Catalog page). */
export function exportEquipment(kind: keyof typeof KINDS) {
  return withMember("catalog:read", async ({ member }) => csvDownload(`${kind}.csv`, await KINDS[kind].exportCsv(member.companyId)));
}
