import { NextResponse } from "next/server";
import { saveDesignSchema } from "@/lib/schemas/design";
import { saveDesign } from "@/server/designs";
import { readJson, withMember } from "@/server/route";

/** Saves a deal's design (body: { dealId, document }); one design per deal, saving replaces it. */
export const PUT = withMember("deals:write", async ({ req, member }) => {
  const body = await readJson(req, saveDesignSchema);
  return NextResponse.json({ data: await saveDesign(member, body) });
});
