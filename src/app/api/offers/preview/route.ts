import { NextResponse } from "next/server";
import { createOfferSchema } from "@/lib/schemas/offer";
import { previewOffer } from "@/server/offers";
import { readJson, withMember } from "@/server/route";

/**
 * The figures of offer inputs not yet saved (body: { dealId, inputs }), for the form's live
 * preview. Computed like a save; nothing is written.
 */
export const POST = withMember("deals:write", async ({ req, member }) => {
  const body = await readJson(req, createOfferSchema);
  return NextResponse.json({ data: await previewOffer(member, body) });
});
