import { NextResponse } from "next/server";
import { dealUtilitySchema } from "@/lib/schemas/deal-settings";
import { withDeal } from "@/server/deal-route";
import { updateDealUtility } from "@/server/deals";
import { readJson } from "@/server/route";

/** The deal's utility and rate plan ({ utilityName, ratePlanId }; "" for "not known yet"). */
export const PUT = withDeal("deals:write", async ({ req, scope }) => {
  const input = await readJson(req, dealUtilitySchema);
  await updateDealUtility(scope, input);
  return NextResponse.json({ data: { dealId: scope.deal.id } });
});
