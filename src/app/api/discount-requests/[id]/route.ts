import { NextResponse } from "next/server";
import { notFound } from "@/server/errors";
import { getDiscountRequestOrThrow } from "@/server/offers";
import { idSchema, withMember } from "@/server/route";

export const GET = withMember<{ id: string }>("deals:read-own", async ({ member, params }) => {
  if (!idSchema.safeParse(params.id).success) throw notFound("Discount request");
  return NextResponse.json({ data: await getDiscountRequestOrThrow(member, params.id) });
});
