import type { Metadata } from "next";
import { NoAccess } from "@/components/no-access";
import { can } from "@/lib/permissions";
import { getCompanySettings } from "@/server/company-settings";
import { getPacketSettings } from "@/server/roof-survey";
import { getMember } from "@/server/session";
import { CompanySettingsClient } from "./company-settings-client";
import { PacketSettingsForm } from "./packet-settings-form";
import { ElectricalSettingsForm } from "./electrical-settings-form";

export const metadata: Metadata = { title: "Company settings" };

export default async function CompanySettingsPage() {
  const member = await getMember();
  if (!member) return null;
  if (!can(member.role, "company:manage")) return <NoAccess section="Settings → Company" />;
  const settings = await getCompanySettings(member.companyId);
  return (
    <>
      <p className="text-sm text-graphite-soft">Settings</p>
      <h1 className="text-2xl font-semibold">Company</h1>
      <p className="mt-1 text-graphite-soft">How {settings.name} appears on proposals, its working day, when the Board flags a deal as stalled, and the savings assumptions of its offers.</p>
      <CompanySettingsClient
        companyId={member.companyId}
        initial={{ name: settings.name, licenseNumber: settings.licenseNumber ?? "", timeZone: settings.timeZone, stallDays: settings.stallDays, finance: settings.finance }}
      />
      <PacketSettingsForm initial={await getPacketSettings(member.companyId)} />
      <ElectricalSettingsForm companyId={member.companyId} initial={settings.electrical} />
    </>
  );
}
