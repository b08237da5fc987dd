"use client";
import Link from "next/link";
import { usePathname } from "next/navigation";

const tabClass = (active: boolean) =>
  `flex min-h-touch items-center whitespace-nowrap border-b-2 px-3 text-sm font-medium ${
    active ? "border-copper text-copper" : "border-transparent text-graphite-soft hover:text-graphite"
  }`;

/** Tabs that are pages: the current one is marked for screen readers (aria-current). */
export function LinkTabs({ label, pages }: { label: string; pages: readonly { href: string; label: string }[] }) {
  const pathname = usePathname();
  return (
    <nav aria-label={label} className="mb-5 border-b border-paper-line">
      <ul className="-mb-px flex gap-1 overflow-x-auto">
        {pages.map((p) => {
          const active = pathname === p.href || pathname.startsWith(`${p.href}/`);
          return (
            <li key={p.href}>
              <Link href={p.href} aria-current={active ? "page" : undefined} className={tabClass(active)}>
                {p.label}
              </Link>
            </li>
          );
        })}
      </ul>
    </nav>
  );
}
