import type { Metadata } from "next";
import { NoAccess } from "@/components/no-access";
import { can } from "@/lib/permissions";
import { listUtilityChoices, recentSites } from "@/server/deals";
import { getMember } from "@/server/session";
import { NewLeadForm } from "./new-lead-form";

export const metadata: Metadata = { title: "New lead" };

export default async function NewLeadPage() {
  const member = await getMember();
  if (!member) return null;
  if (!can(member.role, "deals:write")) return <NoAccess section="new leads" />;
  const [choices, sites] = await Promise.all([listUtilityChoices(member), recentSites(member)]);
  return (
    <>
      <h1 className="text-2xl font-semibold">New lead</h1>
      <p className="mt-1 text-graphite-soft">The household, how to reach them, and where the roof is.</p>
      <NewLeadForm choices={choices} sites={sites} />
    </>
  );
}
