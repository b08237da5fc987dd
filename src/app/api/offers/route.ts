import { NextResponse } from "next/server";
import { createOfferSchema } from "@/lib/schemas/offer";
import { withDeal } from "@/server/deal-route";
import { createOffer, listOffers } from "@/server/offers";
import { readJson, withMember } from "@/server/route";

/** The deal's offers (?dealId=). */
export const GET = withDeal("deals:read-own", async ({ scope }) => NextResponse.json({ data: await listOffers(scope) }), { from: "query" });

/** A new offer (body: { dealId, inputs }); every figure is computed here, never taken from the browser. */
export const POST = withMember("deals:write", async ({ req, member }) => {
  const body = await readJson(req, createOfferSchema);
  return NextResponse.json({ data: await createOffer(member, body) }, { status: 201 });
});
