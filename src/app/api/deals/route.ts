import { NextResponse } from "next/server";
import { dealSearchSchema, leadSchema } from "@/lib/schemas/deal";
import { createLead, listDeals } from "@/server/deals";
import { readJson, validationError, withMember } from "@/server/route";

/** The caller's visible deals (all of the company's for office roles, their own for reps), with ?q= search. */
export const GET = withMember("deals:read-own", async ({ req, member }) => {
  const parsed = dealSearchSchema.safeParse(Object.fromEntries(req.nextUrl.searchParams));
  if (!parsed.success) throw validationError(parsed.error);
  return NextResponse.json({ data: await listDeals(member, parsed.data.q) });
});

/** A new lead: household and deal. */
export const POST = withMember("deals:write", async ({ req, member }) => {
  const input = await readJson(req, leadSchema);
  return NextResponse.json({ data: await createLead(member, input) }, { status: 201 });
});
