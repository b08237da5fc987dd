import { NextResponse } from "next/server";
import { updateOfferSchema } from "@/lib/schemas/offer";
import { notFound } from "@/server/errors";
import { deleteOffer, getOfferOrThrow, updateOffer } from "@/server/offers";
import { idSchema, readJson, withMember } from "@/server/route";

type Params = { id: string };

export const GET = withMember<Params>("deals:read-own", async ({ member, params }) => {
  if (!idSchema.safeParse(params.id).success) throw notFound("Offer");
  return NextResponse.json({ data: await getOfferOrThrow(member, params.id) });
});

/** Replaces the offer's inputs (body: { inputs }) and recomputes its figures. */
export const PUT = withMember<Params>("deals:write", async ({ req, member, params }) => {
  if (!idSchema.safeParse(params.id).success) throw notFound("Offer");
  const body = await readJson(req, updateOfferSchema);
  return NextResponse.json({ data: await updateOffer(member, params.id, body) });
});

export const DELETE = withMember<Params>("deals:write", async ({ member, params }) => {
  if (!idSchema.safeParse(params.id).success) throw notFound("Offer");
  return NextResponse.json({ data: await deleteOffer(member, params.id) });
});
