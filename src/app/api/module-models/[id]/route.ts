import { NextResponse } from "next/server";
import { modulePatchSchema } from "@/lib/schemas/catalog";
import { getModuleOrThrow, patchModule, setModuleActive } from "@/server/catalog";
import { notFound } from "@/server/errors";
import { idSchema, readJson, withMember } from "@/server/route";

type Params = { id: string };

export const GET = withMember<Params>("catalog:read", async ({ member, params }) => {
  if (!idSchema.safeParse(params.id).success) throw notFound("Module");
  return NextResponse.json({ data: await getModuleOrThrow(member.companyId, params.id) });
});

/** Changes some fields (the result is checked as a whole) and/or `active`. */
export const PATCH = withMember<Params>("catalog:manage", async ({ req, member, params }) => {
  if (!idSchema.safeParse(params.id).success) throw notFound("Module");
  const patch = await readJson(req, modulePatchSchema);
  return NextResponse.json({ data: await patchModule(member, params.id, patch) });
});

/** Equipment is never deleted (designs keep their datasheets): DELETE deactivates. */
export const DELETE = withMember<Params>("catalog:manage", async ({ member, params }) => {
  if (!idSchema.safeParse(params.id).success) throw notFound("Module");
  return NextResponse.json({ data: await setModuleActive(member, params.id, false) });
});
