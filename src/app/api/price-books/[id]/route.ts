import { NextResponse } from "next/server";
import { notFound } from "@/server/errors";
import { getPriceBookOrThrow } from "@/server/price-book";
import { idSchema, withMember } from "@/server/route";

type Params = { id: string };

export const GET = withMember<Params>("pricebook:read", async ({ member, params }) => {
  if (!idSchema.safeParse(params.id).success) throw notFound("Price book");
  return NextResponse.json({ data: await getPriceBookOrThrow(member.companyId, params.id) });
});
