import { NextResponse } from "next/server";
import { getBillOrThrow } from "@/server/energy";
import { notFound } from "@/server/errors";
import { idSchema, withMember } from "@/server/route";

export const GET = withMember<{ id: string }>("deals:read-own", async ({ member, params }) => {
  if (!idSchema.safeParse(params.id).success) throw notFound("Bill");
  return NextResponse.json({ data: await getBillOrThrow(member, params.id) });
});
