import { NextResponse } from "next/server";
import { createOfferSchema } from "@/lib/schemas/offer";
import { openDeal } from "@/server/deal-scope";
import { notFound } from "@/server/errors";
import { createOffer, listOffers } from "@/server/offers";
import { idSchema, readJson, withMember } from "@/server/route";

/** The deal's offers (?dealId=). */
export const GET = withMember("deals:read-own", async ({ req, member }) => {
  const dealId = req.nextUrl.searchParams.get("dealId") ?? "";
  if (!idSchema.safeParse(dealId).success) throw notFound("Deal");
  return NextResponse.json({ data: await listOffers(await openDeal(member, dealId)) });
});

/** A new offer (body: { dealId, inputs }); every figure is computed here, never taken from the browser. */
export const POST = withMember("deals:write", async ({ req, member }) => {
  const body = await readJson(req, createOfferSchema);
  return NextResponse.json({ data: await createOffer(member, body) }, { status: 201 });
});
