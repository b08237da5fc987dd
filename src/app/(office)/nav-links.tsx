"use client";
import Link from "next/link";
import { usePathname } from "next/navigation";

export function NavLinks({ sections }: { sections: { href: string; label: string }[] }) {
  const pathname = usePathname();
  return (
    <ul className="flex gap-1 md:flex-col">
      {sections.map((s) => {
        const active = pathname === s.href || pathname.startsWith(`${s.href.split("/").slice(0, 2).join("/")}/`);
        return (
          <li key={s.href}>
            <Link
              href={s.href}
              aria-current={active ? "page" : undefined}
              className={`flex min-h-touch items-center whitespace-nowrap rounded-md px-3 text-sm font-medium ${
                active ? "bg-white text-copper shadow-card" : "text-graphite hover:bg-white/70"
              }`}
            >
              {s.label}
            </Link>
          </li>
        );
      })}
    </ul>
  );
}
