import { NextResponse } from "next/server";
import { updateOfferSchema } from "@/lib/schemas/offer";
import { notFound } from "@/server/errors";
import { deleteOffer, getOfferOrThrow, updateOffer } from "@/server/offers";
import { idSchema, readJson, withMember } from "@/server/route";

type Params = { id: string };

/** The offer's id from the path; a malformed one is simply not found. */
function offerId(params: Params): string {
  if (!idSchema.safeParse(params.id).success) throw notFound("Offer");
  return params.id;
}

export const GET = withMember<Params>("deals:read-own", async ({ member, params }) => NextResponse.json({ data: await getOfferOrThrow(member, offerId(params)) }));

/** Replaces the offer's inputs (body: { inputs }) and recomputes its figures from the deal's current inputs. */
export const PUT = withMember<Params>("deals:write", async ({ req, member, params }) => {
  const id = offerId(params);
  return NextResponse.json({ data: await updateOffer(member, id, await readJson(req, updateOfferSchema)) });
});

export const DELETE = withMember<Params>("deals:write", async ({ member, params }) => NextResponse.json({ data: await deleteOffer(member, offerId(params)) }));
