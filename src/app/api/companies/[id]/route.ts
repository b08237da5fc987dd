import { NextResponse } from "next/server";
import { getCompanyOrThrow } from "@/server/company-settings";
import { notFound } from "@/server/errors";
import { idSchema, withMember } from "@/server/route";

/** One's own company (name, licence number, time zone, stall limits); another company's id is 404. */
export const GET = withMember<{ id: string }>("today:read", async ({ member, params }) => {
  if (!idSchema.safeParse(params.id).success) throw notFound("Company");
  const c = await getCompanyOrThrow(member, params.id);
  return NextResponse.json({
    data: { id: c.companyId, name: c.name, licenseNumber: c.licenseNumber, timeZone: c.timeZone, stallDays: c.stallDays },
  });
});
