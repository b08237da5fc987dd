import type { ReactNode } from "react";
import { can, type Permission } from "@/lib/permissions";
import { getMember } from "@/server/session";
import { LinkTabs } from "@/components/ui/tabs";

/** Settings pages, each behind its own permission; the sub-nav lists those the person may open. */
const SETTINGS_PAGES: readonly { href: string; label: string; permission: Permission }[] = [
  { href: "/settings/people", label: "People", permission: "people:read" },
  { href: "/settings/company", label: "Company", permission: "company:manage" },
  { href: "/settings/checklists", label: "Checklists", permission: "checklists:manage" },
];

export default async function SettingsLayout({ children }: { children: ReactNode }) {
  const member = await getMember();
  const pages = member ? SETTINGS_PAGES.filter((p) => can(member.role, p.permission)).map(({ href, label }) => ({ href, label })) : [];
  return (
    <>
      {pages.length > 1 ? <LinkTabs label="Settings" pages={pages} /> : null}
      {children}
    </>
  );
}
