import { NextResponse } from "next/server";
import { jobFieldsSchema } from "@/lib/schemas/jobs";
import { notFound } from "@/server/errors";
import { getJobOrThrow, updateJob } from "@/server/jobs";
import { idSchema, readJson, withMember } from "@/server/route";

type Params = { id: string };

/** One job (another company's, or another crew's for an installer: 404). */
export const GET = withMember<Params>("jobs:read", async ({ member, params }) => {
  if (!idSchema.safeParse(params.id).success) throw notFound("Job");
  return NextResponse.json({ data: await getJobOrThrow(member, params.id) });
});

/** The office sets dates, crew, permit and interconnection records, notes; dates move the deal. */
export const PATCH = withMember<Params>("jobs:manage", async ({ req, member, params }) => {
  if (!idSchema.safeParse(params.id).success) throw notFound("Job");
  const fields = await readJson(req, jobFieldsSchema);
  return NextResponse.json({ data: await updateJob(member, params.id, fields) });
});
