import { redirect } from "next/navigation";
import type { ReactNode } from "react";
import { Wordmark } from "@/components/wordmark";
import { devToolsEnabled } from "@/env";
import { ROLE_LABELS } from "@/lib/permissions";
import { sectionsFor } from "@/lib/sections";
import { getMember } from "@/server/session";
import { NavLinks } from "./nav-links";
import { SignOutButton } from "./sign-out-button";

export default async function OfficeLayout({ children }: { children: ReactNode }) {
  const member = await getMember();
  if (!member) redirect("/sign-in");
  const sections = sectionsFor(member.role, devToolsEnabled()).map(({ href, label }) => ({ href, label }));
  return (
    <div className="min-h-dvh md:grid md:grid-cols-[220px_1fr]">
      <header className="border-b border-paper-line bg-paper-deep md:min-h-dvh md:border-r md:border-b-0">
        <div className="flex items-center justify-between gap-4 px-4 py-3 md:block md:px-5 md:py-6">
          <Wordmark className="text-lg" />
          <p className="text-xs text-graphite-soft md:mt-1" data-testid="company-name">
            {member.companyName}
          </p>
        </div>
        <nav aria-label="Sections" className="overflow-x-auto px-2 pb-2 md:px-3">
          <NavLinks sections={sections} />
        </nav>
        <div className="hidden px-5 pt-6 md:block">
          <p className="text-sm font-medium">{member.name}</p>
          <p className="text-xs text-graphite-soft" data-testid="role-label">
            {ROLE_LABELS[member.role]}
          </p>
          <SignOutButton />
        </div>
      </header>
      <div className="min-w-0">
        <div role="region" aria-label="Your account" className="flex items-center justify-end gap-3 border-b border-paper-line px-4 py-2 md:hidden">
          <span className="text-sm">
            {member.name} · {ROLE_LABELS[member.role]}
          </span>
          <SignOutButton />
        </div>
        <main className="mx-auto max-w-6xl px-4 py-6 md:px-8">
          {children}
        </main>
      </div>
    </div>
  );
}
