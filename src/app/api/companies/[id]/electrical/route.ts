import { electricalSettingsSchema } from "@/lib/schemas/electrical";
import { getCompanyOrThrow } from "@/server/company-settings";
import { saveElectricalSettings } from "@/server/electrical";
import { writeById } from "@/server/route";

/** Settings → Company → Electrical design: the NEC edition of the checks and the designer on the packet. */
export const PATCH = writeById("company:manage", "Company", electricalSettingsSchema, async (member, id, input) => {
  await getCompanyOrThrow(member, id); // another company's id is 404
  await saveElectricalSettings(member, input);
  return (await getCompanyOrThrow(member, id)).electrical;
});
