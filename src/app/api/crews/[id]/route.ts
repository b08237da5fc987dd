import { NextResponse } from "next/server";
import { updateCrewSchema } from "@/lib/schemas/jobs";
import { getCrewOrThrow, updateCrew } from "@/server/crews";
import { notFound } from "@/server/errors";
import { idSchema, readJson, withMember } from "@/server/route";

type Params = { id: string };

export const GET = withMember<Params>("crews:manage", async ({ member, params }) => {
  if (!idSchema.safeParse(params.id).success) throw notFound("Crew");
  return NextResponse.json({ data: await getCrewOrThrow(member, params.id) });
});

/** Rename, and/or set exactly which installers are in the crew. */
export const PATCH = withMember<Params>("crews:manage", async ({ req, member, params }) => {
  if (!idSchema.safeParse(params.id).success) throw notFound("Crew");
  const input = await readJson(req, updateCrewSchema);
  return NextResponse.json({ data: await updateCrew(member, params.id, input) });
});
