import { redirect } from "next/navigation";
import type { ReactNode } from "react";
import { Wordmark } from "@/components/wordmark";
import { devToolsEnabled } from "@/env";
import { ROLE_LABELS } from "@/lib/permissions";
import { sectionsFor } from "@/lib/sections";
import { getMember } from "@/server/session";
import { NavDrawer, NavLinks } from "./nav-links";
import { SignOutButton } from "./sign-out-button";

/**
 * The office shell. From 1024 px (Tailwind's `lg`, a tablet held sideways or a laptop) the
 * sections sit in a 220 px side column; below it (a tablet upright, 820 px, or a phone) they
 * fold into a drawer behind a Menu button, so the page gets the whole width. Our choice: at
 * 820 px a side column would leave the deal room about 530 px.
 */
export default async function OfficeLayout({ children }: { children: ReactNode }) {
  const member = await getMember();
  if (!member) redirect("/sign-in");
  const sections = sectionsFor(member.role, devToolsEnabled()).map(({ href, label }) => ({ href, label }));
  const person = { name: member.name, role: ROLE_LABELS[member.role], companyName: member.companyName };
  return (
    <div className="min-h-dvh lg:grid lg:grid-cols-[220px_1fr]">
      <header className="hidden min-h-dvh border-r border-paper-line bg-paper-deep lg:block">
        <div className="px-5 py-6">
          <Wordmark className="text-lg" />
          <p className="mt-1 text-xs text-graphite-soft" data-testid="company-name">
            {member.companyName}
          </p>
        </div>
        <nav aria-label="Sections" className="px-3">
          <NavLinks sections={sections} />
        </nav>
        <div className="px-5 pt-6">
          <p className="text-sm font-medium">{member.name}</p>
          <p className="text-xs text-graphite-soft" data-testid="role-label">
            {person.role}
          </p>
          <SignOutButton />
        </div>
      </header>
      <div className="min-w-0">
        <div role="region" aria-label="Menu and account" className="flex items-center justify-between gap-3 border-b border-paper-line bg-paper-deep px-4 py-1 lg:hidden">
          <div className="min-w-0">
            <Wordmark />
            <p className="truncate text-xs text-graphite-soft">{member.companyName}</p>
          </div>
          <NavDrawer sections={sections} person={person}>
            <SignOutButton />
          </NavDrawer>
        </div>
        <main className="mx-auto max-w-6xl px-4 py-6 md:px-8">{children}</main>
      </div>
    </div>
  );
}
