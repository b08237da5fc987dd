import { NextResponse } from "next/server";
import { notFound } from "@/server/errors";
import { idSchema, withMember } from "@/server/route";
import { deleteStation, getStationOrThrow } from "@/server/weather-stations";

type Params = { id: string };

export const GET = withMember<Params>("weather:read", async ({ member, params }) => {
  if (!idSchema.safeParse(params.id).success) throw notFound("Weather station");
  return NextResponse.json({ data: await getStationOrThrow(member.companyId, params.id) });
});

/** Removes a station and its file; 409 while a design uses it. */
export const DELETE = withMember<Params>("weather:manage", async ({ member, params }) => {
  if (!idSchema.safeParse(params.id).success) throw notFound("Weather station");
  return NextResponse.json({ data: await deleteStation(member, params.id) });
});
