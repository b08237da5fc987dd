"use server";
import { revalidatePath } from "next/cache";
import { companySettingsSchema } from "@/lib/schemas/company-settings";
import { memberAction } from "@/server/action";
import { updateCompanySettings } from "@/server/company-settings";

export const updateCompanySettingsAction = memberAction("company:manage", companySettingsSchema, async (input, member) => {
  const saved = await updateCompanySettings(member, input);
  // The name shows in every page's header; stall limits on the Board and Today.
  revalidatePath("/", "layout");
  return { name: saved.name };
});
