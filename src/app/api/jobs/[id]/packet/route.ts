import { NextResponse } from "next/server";
import { notFound } from "@/server/errors";
import { getJobPacket } from "@/server/jobs";
import { idSchema, withMember } from "@/server/route";

type Params = { id: string };

/** The job packet as data: customer, site, faces, equipment, string check, checklist, photos. */
export const GET = withMember<Params>("jobs:read", async ({ member, params }) => {
  if (!idSchema.safeParse(params.id).success) throw notFound("Job");
  return NextResponse.json({ data: await getJobPacket(member, params.id) });
});
