"use client";
import Link from "next/link";
import { usePathname } from "next/navigation";

export function DealTabs({ dealId, tabs }: { dealId: string; tabs: { segment: string; label: string }[] }) {
  const pathname = usePathname();
  const base = `/deals/${dealId}`;
  return (
    <nav aria-label="Deal" className="mt-4 overflow-x-auto border-b border-paper-line">
      <ul className="flex gap-1">
        {tabs.map((t) => {
          const href = t.segment ? `${base}/${t.segment}` : base;
          const active = pathname === href;
          return (
            <li key={t.label}>
              <Link
                href={href}
                aria-current={active ? "page" : undefined}
                className={`flex min-h-touch items-center border-b-2 px-4 text-sm font-medium ${
                  active ? "border-copper text-copper" : "border-transparent text-graphite-soft hover:text-graphite"
                }`}
              >
                {t.label}
              </Link>
            </li>
          );
        })}
      </ul>
    </nav>
  );
}
