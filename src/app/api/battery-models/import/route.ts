import { NextResponse } from "next/server";
import { importBatteriesCsv } from "@/server/battery-catalog";
import { readCsvUpload } from "@/server/catalog";
import { withMember } from "@/server/route";

/** POST: CSV as a multipart form (`file`, `mode`) or a text/csv body with `?mode=`; answers the import report. */
export const POST = withMember(
  "catalog:manage",
  async ({ req, member }) => {
    const { text, mode } = await readCsvUpload(req);
    return NextResponse.json({ data: await importBatteriesCsv(member, text, mode) });
  },
  // A text/csv body cannot be sent by another site without a CORS preflight, so it is as safe as JSON here.
  { bodyTypes: ["multipart/form-data", "text/csv"] },
);
