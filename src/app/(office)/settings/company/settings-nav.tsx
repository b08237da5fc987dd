"use client";
import Link from "next/link";
import { usePathname } from "next/navigation";

/** The Settings sub-nav (People, Company, Checklists), the current page marked for screen readers. */
export function SettingsNav({ pages }: { pages: { href: string; label: string }[] }) {
  const pathname = usePathname();
  return (
    <nav aria-label="Settings" className="mb-5 border-b border-paper-line">
      <ul className="-mb-px flex gap-1 overflow-x-auto">
        {pages.map((p) => {
          const active = pathname === p.href || pathname.startsWith(`${p.href}/`);
          return (
            <li key={p.href}>
              <Link
                href={p.href}
                aria-current={active ? "page" : undefined}
                className={`flex min-h-touch items-center whitespace-nowrap border-b-2 px-3 text-sm font-medium ${
                  active ? "border-copper text-copper" : "border-transparent text-graphite-soft hover:text-graphite"
                }`}
              >
                {p.label}
              </Link>
            </li>
          );
        })}
      </ul>
    </nav>
  );
}
