import { NextResponse } from "next/server";
import { notFound } from "@/server/errors";
import { markJobInstalled } from "@/server/jobs";
import { idSchema, withMember } from "@/server/route";

type Params = { id: string };

/** "Installed": records the time and moves the deal to Installed (idempotent). */
export const POST = withMember<Params>("jobs:work", async ({ member, params }) => {
  if (!idSchema.safeParse(params.id).success) throw notFound("Job");
  return NextResponse.json({ data: await markJobInstalled(member, params.id) });
});
