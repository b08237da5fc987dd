import { getCompanyOrThrow } from "@/server/company-settings";
import { readById } from "@/server/route";

/** One's own company (name, licence number, time zone, stall limits); another company's id is 404. */
export const GET = readById("today:read", "Company", async (member, id) => {
  const c = await getCompanyOrThrow(member, id);
  return { id: c.companyId, name: c.name, licenseNumber: c.licenseNumber, timeZone: c.timeZone, stallDays: c.stallDays };
});
