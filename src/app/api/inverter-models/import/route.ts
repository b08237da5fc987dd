import { NextResponse } from "next/server";
import { importInvertersCsv, readCsvUpload } from "@/server/catalog";
import { withMember } from "@/server/route";

/**
 * Imports inverters from CSV: multipart form (`file`, `mode`) or a text/csv body with
 * `?mode=`. Answers the report: each bad row by line and column, and what was created or
 * updated (nothing when a row is bad in all_or_nothing mode).
 */
export const POST = withMember(
  "catalog:manage",
  async ({ req, member }) => {
    const { text, mode } = await readCsvUpload(req);
    return NextResponse.json({ data: await importInvertersCsv(member, text, mode) });
  },
  // A text/csv body cannot be sent by another site without a CORS preflight, so it is as safe as JSON here.
  { bodyTypes: ["multipart/form-data", "text/csv"] },
);
