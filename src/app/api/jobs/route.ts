import { NextResponse } from "next/server";
import { listJobs } from "@/server/jobs";
import { withMember } from "@/server/route";

/** The jobs the person may see: the office every job, an installer only their crew's. */
export const GET = withMember("jobs:read", async ({ member }) => {
  return NextResponse.json({ data: await listJobs(member) });
});
