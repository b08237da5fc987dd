import { companySettingsSchema } from "@/lib/schemas/company-settings";
import { getCompanyOrThrow, updateCompanySettings } from "@/server/company-settings";
import { readById, writeById } from "@/server/route";

/** One's own company (name, licence number, time zone, stall limits); another company's id is 404. */
export const GET = readById("today:read", "Company", async (member, id) => {
  const c = await getCompanyOrThrow(member, id);
  return { id: c.companyId, name: c.name, licenseNumber: c.licenseNumber, timeZone: c.timeZone, stallDays: c.stallDays };
});

/** Settings → Company: name, licence, time zone, stall limits and savings assumptions (422 names each bad field). */
export const PATCH = writeById("company:manage", "Company", companySettingsSchema, async (member, id, input) => {
  await getCompanyOrThrow(member, id); // another company's id is 404
  const c = await updateCompanySettings(member, input);
  return { id: c.companyId, name: c.name, licenseNumber: c.licenseNumber, timeZone: c.timeZone, stallDays: c.stallDays, finance: c.finance };
});
