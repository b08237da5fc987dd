import { NextResponse } from "next/server";
import { companySettingsSchema } from "@/lib/schemas/company-settings";
import { getCompanyOrThrow, updateCompanySettings } from "@/server/company-settings";
import { notFound } from "@/server/errors";
import { idSchema, readJson, withMember } from "@/server/route";
import type { Member } from "@/server/session";

const view = (c: Awaited<ReturnType<typeof getCompanyOrThrow>>) => ({
  id: c.companyId,
  name: c.name,
  licenseNumber: c.licenseNumber,
  timeZone: c.timeZone,
  stallDays: c.stallDays,
  finance: c.finance,
});

async function ownCompany(member: Member, id: string) {
  if (!idSchema.safeParse(id).success) throw notFound("Company");
  return getCompanyOrThrow(member, id);
}

/** One's own company (name, licence number, time zone, stall limits); another company's id is 404. */
export const GET = withMember<{ id: string }>("today:read", async ({ member, params }) => {
  const c = await ownCompany(member, params.id);
  return NextResponse.json({ data: { id: c.companyId, name: c.name, licenseNumber: c.licenseNumber, timeZone: c.timeZone, stallDays: c.stallDays } });
});

/** Settings → Company: name, licence, time zone, stall limits and savings assumptions (422 names each bad field). */
export const PATCH = withMember<{ id: string }>("company:manage", async ({ req, member, params }) => {
  await ownCompany(member, params.id);
  const input = await readJson(req, companySettingsSchema);
  return NextResponse.json({ data: view(await updateCompanySettings(member, input)) });
});
