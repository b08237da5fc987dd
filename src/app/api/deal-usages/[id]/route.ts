import { NextResponse } from "next/server";
import { getDealUsageOrThrow } from "@/server/energy";
import { notFound } from "@/server/errors";
import { idSchema, withMember } from "@/server/route";

/** A deal's stored usage year by its id (reps: of their own deals only). */
export const GET = withMember<{ id: string }>("deals:read-own", async ({ member, params }) => {
  if (!idSchema.safeParse(params.id).success) throw notFound("Usage year");
  return NextResponse.json({ data: await getDealUsageOrThrow(member, params.id) });
});
