import { NextResponse } from "next/server";
import { newUtilitySchema } from "@/lib/schemas/utility";
import { readJson, withMember } from "@/server/route";
import { createUtility, listUtilities } from "@/server/utilities";

export const GET = withMember("rates:read", async ({ member }) => NextResponse.json({ data: await listUtilities(member.companyId) }));

/** A new utility: { name, timeZone?, territoryNotes } (the time zone defaults to the company's). */
export const POST = withMember("rates:manage", async ({ req, member }) => {
  const input = await readJson(req, newUtilitySchema);
  return NextResponse.json({ data: await createUtility(member, input) }, { status: 201 });
});
