// What a role change gives and takes, in one line for the confirmation (from the one
// permission table, so it never drifts from what the server enforces).
import type { Role } from "@/lib/enums";
import { PERMISSIONS, ROLE_LABELS, type Permission } from "@/lib/permissions";

/** Each permission as the person would name it; several may share words (they are listed once). */
const PERMISSION_WORDS: Record<Permission, string> = {
  "deals:read-all": "every deal",
  "deals:read-own": "their own deals",
  "deals:write": "editing deals",
  "households:read": "households",
  "people:read": "Settings → People",
  "people:manage": "inviting and managing people",
  "company:manage": "company settings",
  "outbox:read": "the dev outbox",
  "catalog:read": "the catalog",
  "catalog:manage": "keeping the catalog",
  "pricebook:read": "the price book",
  "pricebook:manage": "keeping the price book",
  "rates:read": "rate plans",
  "rates:manage": "keeping rate plans",
  "weather:read": "weather stations",
  "weather:manage": "keeping weather stations",
  "discounts:approve": "approving discounts",
  "proposals:send": "sending proposals",
  "payments:read": "the Money tab",
  "payments:refund": "refunds",
  "payments:reconcile": "reconciliation",
  "jobs:read": "jobs",
  "jobs:manage": "scheduling jobs",
  "jobs:work": "job checklists and photos",
  "crews:manage": "crews",
  "checklists:manage": "checklist templates",
  "views:own": "saved views",
  "today:read": "Today",
};

/** At most this many are named before "and N more" (our choice: one line in a dialog). */
const NAMED = 4;

function listed(items: string[]): string {
  if (items.length === 0) return "nothing";
  const shown = items.slice(0, NAMED);
  const more = items.length - shown.length;
  return more > 0 ? `${shown.join(", ")} and ${more} more` : shown.length === 1 ? shown[0] : `${shown.slice(0, -1).join(", ")} and ${shown[shown.length - 1]}`;
}

function wordsOf(role: Role): Set<string> {
  const permissions = Object.keys(PERMISSIONS) as Permission[];
  return new Set(permissions.filter((p) => (PERMISSIONS[p] as readonly Role[]).includes(role)).map((p) => PERMISSION_WORDS[p]));
}

/** "Gains every deal, refunds …; loses nothing." */
export function roleChangeSummary(from: Role, to: Role): string {
  const before = wordsOf(from);
  const after = wordsOf(to);
  const gains = [...after].filter((w) => !before.has(w));
  const loses = [...before].filter((w) => !after.has(w));
  return `Gains ${listed(gains)}; loses ${listed(loses)}.`;
}

/** The question before a role change: from → to, and what changes. */
export function roleChangeQuestion(name: string, from: Role, to: Role): string {
  return `Change ${name} from ${ROLE_LABELS[from]} to ${ROLE_LABELS[to]}?`;
}
