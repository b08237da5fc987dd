import { NextResponse } from "next/server";
import { getDesignOrThrow } from "@/server/designs";
import { notFound } from "@/server/errors";
import { idSchema, withMember } from "@/server/route";

export const GET = withMember<{ id: string }>("deals:read-own", async ({ member, params }) => {
  if (!idSchema.safeParse(params.id).success) throw notFound("Design");
  return NextResponse.json({ data: await getDesignOrThrow(member, params.id) });
});
