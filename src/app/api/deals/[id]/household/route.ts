import { NextResponse } from "next/server";
import { householdSchema } from "@/lib/schemas/deal";
import { updateHousehold } from "@/server/deals";
import { notFound } from "@/server/errors";
import { idSchema, readJson, withMember } from "@/server/route";

/** The Household tab: the deal's household, contacts and site (the whole household as JSON). */
export const PUT = withMember<{ id: string }>("deals:write", async ({ req, member, params }) => {
  if (!idSchema.safeParse(params.id).success) throw notFound("Deal");
  const input = await readJson(req, householdSchema);
  await updateHousehold(member, params.id, input);
  return NextResponse.json({ data: { dealId: params.id } });
});
