import { NextResponse } from "next/server";
import { updatePersonSchema } from "@/lib/schemas/people";
import { notFound } from "@/server/errors";
import { getPersonOrThrow, updatePerson } from "@/server/people";
import { idSchema, readJson, withMember } from "@/server/route";

type Params = { id: string };

export const GET = withMember<Params>("people:read", async ({ member, params }) => {
  if (!idSchema.safeParse(params.id).success) throw notFound("Person");
  return NextResponse.json({ data: await getPersonOrThrow(member.companyId, params.id) });
});

/** Changes a person's role or status (deactivate / reactivate). */
export const PATCH = withMember<Params>("people:manage", async ({ req, member, params }) => {
  if (!idSchema.safeParse(params.id).success) throw notFound("Person");
  const change = await readJson(req, updatePersonSchema);
  return NextResponse.json({ data: await updatePerson(member, params.id, change) });
});
