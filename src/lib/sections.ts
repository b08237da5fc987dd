// The app's sections as named in the navigation, each behind a permission. Only sections that
// work are listed.
import type { Role } from "@/lib/enums";
import { can, type Permission } from "@/lib/permissions";

export type Section = { href: string; label: string; permission: Permission; devOnly?: boolean };

export const SECTIONS: readonly Section[] = [
  { href: "/today", label: "Today", permission: "today:read" },
  { href: "/deals", label: "Deals", permission: "deals:read-own" },
  { href: "/board", label: "Board", permission: "deals:read-own" },
  { href: "/jobs", label: "Jobs", permission: "jobs:read" },
  { href: "/catalog", label: "Catalog", permission: "catalog:read" },
  { href: "/price-book", label: "Price book", permission: "pricebook:read" },
  { href: "/utilities", label: "Utilities", permission: "rates:read" },
  { href: "/rate-plans", label: "Rate plans", permission: "rates:read" },
  { href: "/weather", label: "Weather", permission: "weather:read" },
  { href: "/settings/people", label: "Settings", permission: "people:read" },
  { href: "/dev/outbox", label: "Dev outbox", permission: "outbox:read", devOnly: true },
];

export function sectionsFor(role: Role, devTools: boolean): Section[] {
  return SECTIONS.filter((s) => can(role, s.permission) && (!s.devOnly || devTools));
}
