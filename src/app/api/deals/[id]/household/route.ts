import { NextResponse } from "next/server";
import { householdSchema } from "@/lib/schemas/deal";
import { withDeal } from "@/server/deal-route";
import { updateHousehold } from "@/server/deals";
import { readJson } from "@/server/route";

/** The Household tab: the deal's household, contacts and site (the whole household as JSON). */
export const PUT = withDeal("deals:write", async ({ req, scope }) => {
  const input = await readJson(req, householdSchema);
  await updateHousehold(scope, input);
  return NextResponse.json({ data: { dealId: scope.deal.id } });
});
