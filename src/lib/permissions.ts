// The one permission table: what each role (owner, admin, office manager, sales rep, crew) may do.
// Every server action and route handler names one of these; pages use the same table to
// decide which sections to show. Shared by server and browser, so no server imports here.
import type { Role } from "@/lib/enums";

export const ROLE_LABELS: Record<Role, string> = {
  owner: "Owner",
  admin: "Admin",
  office_manager: "Office manager",
  sales_rep: "Sales rep",
  crew: "Installer crew",
};

const STAFF_ADMINS: readonly Role[] = ["owner", "admin"];
const OFFICE: readonly Role[] = ["owner", "admin", "office_manager"];
const SELLERS: readonly Role[] = ["owner", "admin", "office_manager", "sales_rep"];
const OFFICE_AND_CREW: readonly Role[] = ["owner", "admin", "office_manager", "crew"];

export const PERMISSIONS = {
  /** See every deal of the company. */
  "deals:read-all": OFFICE,
  /** See the deals one owns (reps); office roles see all through deals:read-all. */
  "deals:read-own": SELLERS,
  "deals:write": SELLERS,
  "households:read": SELLERS,
  /** Settings → People: list, invite, change roles, deactivate. */
  "people:read": STAFF_ADMINS,
  "people:manage": STAFF_ADMINS,
  "company:manage": STAFF_ADMINS,
  /** The dev outbox page (demo and test instances only). */
  "outbox:read": STAFF_ADMINS,
  /** Equipment catalog: reps pick from it, admins keep it. */
  "catalog:read": SELLERS,
  "catalog:manage": STAFF_ADMINS,
  /** Price book and selling policies (bands, adders, discount limits, incentives, deposit). */
  "pricebook:read": SELLERS,
  "pricebook:manage": STAFF_ADMINS,
  "rates:read": SELLERS,
  "rates:manage": STAFF_ADMINS,
  "weather:read": SELLERS,
  "weather:manage": STAFF_ADMINS,
  /** Grant or decline a discount beyond a rep's limit. */
  "discounts:approve": OFFICE,
  /** Freeze offers into a proposal, send, re-send and revoke its link (reps: own deals). */
  "proposals:send": SELLERS,
  /** The deal's Money tab: payments and refunds (reps: own deals). */
  "payments:read": SELLERS,
  /** Refund a deposit fully or partly, and compare the ledger with the provider's. */
  "payments:refund": OFFICE,
  "payments:reconcile": OFFICE,
  /** Jobs: the office sees all, a crew member only the jobs of their crew. */
  "jobs:read": OFFICE_AND_CREW,
  /** Schedule, assign a crew, record permits, interconnection, inspection and PTO. */
  "jobs:manage": OFFICE,
  /** Tick the checklist, upload photos, mark installed (crews on their own jobs; office too). */
  "jobs:work": OFFICE_AND_CREW,
  /** Crews and their calendar feeds. */
  "crews:manage": OFFICE,
  /** Install checklist templates. */
  "checklists:manage": STAFF_ADMINS,
  /** A person's saved views of the deals table. */
  "views:own": SELLERS,
  /** Everyone signed in can see their own Today. */
  "today:read": ["owner", "admin", "office_manager", "sales_rep", "crew"],
} as const satisfies Record<string, readonly Role[]>;

export type Permission = keyof typeof PERMISSIONS;

export function can(role: Role, permission: Permission): boolean {
  return (PERMISSIONS[permission] as readonly Role[]).includes(role);
}

/** Roles an inviter may hand out: only an owner makes another owner. */
export function assignableRoles(inviter: Role): Role[] {
  const all: Role[] = ["owner", "admin", "office_manager", "sales_rep", "crew"];
  return inviter === "owner" ? all : all.filter((r) => r !== "owner");
}
