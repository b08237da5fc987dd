import type { Metadata } from "next";
import { NoAccess } from "@/components/no-access";
import { can } from "@/lib/permissions";
import { getMember } from "@/server/session";
import { getCompanySettings } from "@/server/company-settings";
import { listUtilities } from "@/server/utilities";
import { UtilitiesClient } from "./utilities-client";

export const metadata: Metadata = { title: "Utilities" };

export default async function UtilitiesPage() {
  const member = await getMember();
  if (!member) return null;
  if (!can(member.role, "rates:read")) return <NoAccess section="Utilities" />;
  const canEdit = can(member.role, "rates:manage");
  const [utilities, settings] = await Promise.all([listUtilities(member.companyId), getCompanySettings(member.companyId)]);
  return (
    <>
      <h1 className="text-2xl font-semibold">Utilities</h1>
      <p className="mt-1 text-graphite-soft">The utilities your customers buy power from. Each rate plan and each utility rebate belongs to one; a household picks its utility from this list.</p>
      <UtilitiesClient
        canEdit={canEdit}
        companyTimeZone={settings.timeZone}
        utilities={utilities.map((u) => ({ id: u.id, name: u.name, timeZone: u.timeZone, territoryNotes: u.territoryNotes ?? "", planCount: u.planCount, dealCount: u.dealCount }))}
      />
    </>
  );
}
