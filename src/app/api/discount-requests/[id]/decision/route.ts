import { NextResponse } from "next/server";
import { discountDecisionSchema } from "@/lib/schemas/offer";
import { notFound } from "@/server/errors";
import { decideDiscountRequest } from "@/server/offers";
import { idSchema, readJson, withMember } from "@/server/route";

/** An office manager grants or declines a pending discount (body: { decision, note }). */
export const POST = withMember<{ id: string }>("discounts:approve", async ({ req, member, params }) => {
  if (!idSchema.safeParse(params.id).success) throw notFound("Discount request");
  const body = await readJson(req, discountDecisionSchema);
  return NextResponse.json({ data: await decideDiscountRequest(member, params.id, body) });
});
