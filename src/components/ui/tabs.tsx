"use client";
import Link from "next/link";
import { usePathname } from "next/navigation";
import { useEffect } from "react";
import { ScrollCue, useScrollEdges } from "./scroll-region";

const tabClass = (active: boolean) =>
  `flex min-h-touch items-center whitespace-nowrap border-b-2 px-3 text-sm font-medium ${
    active ? "border-copper text-copper" : "border-transparent text-graphite-soft hover:text-graphite"
  }`;

/**
 * Tabs that are pages: the current one is marked for screen readers (aria-current). When they do
 * not fit (a phone), the row scrolls sideways inside itself with a fade and an arrow on the side
 * that hides tabs, and the current tab is scrolled into view. `exact`: a tab is current only on
 * its own address (a deal's first tab is the deal's address, a prefix of the others).
 */
export function LinkTabs({ label, pages, exact, className }: { label: string; pages: readonly { href: string; label: string }[]; exact?: boolean; className?: string }) {
  const pathname = usePathname();
  const { ref, edges } = useScrollEdges<HTMLUListElement>();
  useEffect(() => {
    const list = ref.current;
    const current = list?.querySelector<HTMLElement>('[aria-current="page"]');
    if (!list || !current) return;
    const { offsetLeft, offsetWidth } = current;
    if (offsetLeft < list.scrollLeft) list.scrollLeft = offsetLeft;
    else if (offsetLeft + offsetWidth > list.scrollLeft + list.clientWidth) list.scrollLeft = offsetLeft + offsetWidth - list.clientWidth;
  }, [pathname, ref]);
  return (
    <nav aria-label={label} className={`relative border-b border-paper-line ${className ?? "mb-5"}`} data-scroll-region={label}>
      <ul ref={ref} className="relative -mb-px flex gap-1 overflow-x-auto">
        {pages.map((p) => {
          const active = pathname === p.href || (!exact && pathname.startsWith(`${p.href}/`));
          return (
            <li key={p.href}>
              <Link href={p.href} aria-current={active ? "page" : undefined} className={tabClass(active)}>
                {p.label}
              </Link>
            </li>
          );
        })}
      </ul>
      <ScrollCue side="start" show={edges.start} />
      <ScrollCue side="end" show={edges.end} />
    </nav>
  );
}
