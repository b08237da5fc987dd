import type { Metadata } from "next";
import { NoAccess } from "@/components/no-access";
import { can } from "@/lib/permissions";
import { listChecklistTemplates } from "@/server/checklists";
import { getMember } from "@/server/session";
import { ChecklistsClient } from "./checklists-client";

export const metadata: Metadata = { title: "Checklists" };

export default async function ChecklistsPage() {
  const member = await getMember();
  if (!member) return null;
  if (!can(member.role, "checklists:manage")) return <NoAccess section="Settings → Checklists" />;
  const templates = await listChecklistTemplates(member);
  return (
    <>
      <p className="text-sm text-graphite-soft">Settings</p>
      <h1 className="text-2xl font-semibold">Install checklists</h1>
      <p className="mt-1 max-w-3xl text-graphite-soft">
        The active checklist is copied into each new job when its deposit is paid; the crew ticks it on their phone. Editing a
        checklist changes only jobs created afterwards.
      </p>
      <ChecklistsClient templates={templates.map((t) => ({ id: t.id, name: t.name, items: t.items, active: t.active }))} />
    </>
  );
}
