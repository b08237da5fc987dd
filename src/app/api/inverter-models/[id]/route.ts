import { NextResponse } from "next/server";
import { inverterPatchSchema } from "@/lib/schemas/catalog";
import { getInverterOrThrow, patchInverter, setInverterActive } from "@/server/catalog";
import { notFound } from "@/server/errors";
import { idSchema, readJson, withMember } from "@/server/route";

type Params = { id: string };

export const GET = withMember<Params>("catalog:read", async ({ member, params }) => {
  if (!idSchema.safeParse(params.id).success) throw notFound("Inverter");
  return NextResponse.json({ data: await getInverterOrThrow(member.companyId, params.id) });
});

/** Changes some fields (the result is checked as a whole) and/or `active`. */
export const PATCH = withMember<Params>("catalog:manage", async ({ req, member, params }) => {
  if (!idSchema.safeParse(params.id).success) throw notFound("Inverter");
  const patch = await readJson(req, inverterPatchSchema);
  return NextResponse.json({ data: await patchInverter(member, params.id, patch) });
});

/** Equipment is never deleted (designs keep their datasheets): DELETE deactivates. */
export const DELETE = withMember<Params>("catalog:manage", async ({ member, params }) => {
  if (!idSchema.safeParse(params.id).success) throw notFound("Inverter");
  return NextResponse.json({ data: await setInverterActive(member, params.id, false) });
});
