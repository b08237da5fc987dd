import { NextResponse } from "next/server";
import { dealUtilitySchema } from "@/lib/schemas/deal-settings";
import { updateDealUtility } from "@/server/deals";
import { notFound } from "@/server/errors";
import { idSchema, readJson, withMember } from "@/server/route";

/** The deal's utility and rate plan ({ utilityName, ratePlanId }; "" for "not known yet"). */
export const PUT = withMember<{ id: string }>("deals:write", async ({ req, member, params }) => {
  if (!idSchema.safeParse(params.id).success) throw notFound("Deal");
  const input = await readJson(req, dealUtilitySchema);
  await updateDealUtility(member, params.id, input);
  return NextResponse.json({ data: { dealId: params.id } });
});
