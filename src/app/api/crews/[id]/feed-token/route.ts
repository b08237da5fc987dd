import { NextResponse } from "next/server";
import { rotateCrewFeed } from "@/server/crews";
import { notFound } from "@/server/errors";
import { idSchema, withMember } from "@/server/route";

type Params = { id: string };

/** A new calendar feed secret; the old URL answers 404 from now on. */
export const POST = withMember<Params>("crews:manage", async ({ member, params }) => {
  if (!idSchema.safeParse(params.id).success) throw notFound("Crew");
  return NextResponse.json({ data: await rotateCrewFeed(member, params.id) });
});
