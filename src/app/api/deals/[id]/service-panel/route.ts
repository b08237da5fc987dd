import { NextResponse } from "next/server";
import { servicePanelSchema } from "@/lib/schemas/electrical";
import { withDeal } from "@/server/deal-route";
import { updateServicePanel } from "@/server/electrical";
import { readJson } from "@/server/route";

/** The Household tab: the service panel's busbar and main breaker ratings and the service voltage. */
export const PUT = withDeal("deals:write", async ({ req, scope }) => {
  const input = await readJson(req, servicePanelSchema);
  await updateServicePanel(scope, input);
  return NextResponse.json({ data: { dealId: scope.deal.id } });
});
