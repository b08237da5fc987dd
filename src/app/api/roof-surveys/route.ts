import { NextResponse } from "next/server";
import { saveRoofSurveySchema } from "@/lib/schemas/roof-survey";
import { openDeal } from "@/server/deal-scope";
import { readJson, withMember } from "@/server/route";
import { saveRoofSurvey } from "@/server/roof-survey";

/** Saves a deal's roof survey (body: { dealId, …survey }); one per deal, saving replaces it. */
export const PUT = withMember("deals:write", async ({ req, member }) => {
  const { dealId, ...values } = await readJson(req, saveRoofSurveySchema);
  return NextResponse.json({ data: await saveRoofSurvey(await openDeal(member, dealId), values) });
});
