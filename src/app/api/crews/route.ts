import { NextResponse } from "next/server";
import { createCrewSchema } from "@/lib/schemas/jobs";
import { createCrew, listCrews } from "@/server/crews";
import { readJson, withMember } from "@/server/route";

export const GET = withMember("crews:manage", async ({ member }) => {
  return NextResponse.json({ data: await listCrews(member) });
});

export const POST = withMember("crews:manage", async ({ req, member }) => {
  const input = await readJson(req, createCrewSchema);
  return NextResponse.json({ data: await createCrew(member, input) }, { status: 201 });
});
