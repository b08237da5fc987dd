// The value lists behind the schema's enum columns, shared by server and browser. They live here,
// not in src/db/schema.ts, so a client component that needs a stage or a role never pulls drizzle
// (and the database schema) into the browser bundle; scripts/lib/client-bundles.ts checks that.

export const ROLES = ["owner", "admin", "office_manager", "sales_rep", "crew"] as const;
export type Role = (typeof ROLES)[number];

export const STAGES = [
  "lead",
  "bills_in",
  "designing",
  "proposal_out",
  "signed",
  "deposit_paid",
  "survey",
  "permitting",
  "install_booked",
  "installed",
  "inspected",
  "live",
  "on_hold",
  "lost",
  "cancelled",
] as const;
export type Stage = (typeof STAGES)[number];

export const CELL_TECHNOLOGIES = ["mono_perc", "topcon", "heterojunction", "back_contact", "polycrystalline", "thin_film_cdte", "thin_film_cigs"] as const;
/** How a module's Voc coefficient unit is stored: %/°C, mV/°C, V/°C (src/engine/module-coefficients.ts). */
export const VOC_COEFF_UNIT_KEYS = ["pct_per_c", "mv_per_c", "v_per_c"] as const;

export const PROPOSAL_STATUSES = ["sent", "replaced", "revoked", "signed", "cancelled"] as const;
export type ProposalStatus = (typeof PROPOSAL_STATUSES)[number];

export const PAYMENT_STATUSES = ["open", "paid", "failed", "expired", "flagged", "refunded", "partially_refunded"] as const;
export type PaymentStatus = (typeof PAYMENT_STATUSES)[number];

/** Where a bill row came from: typed, a bill's current period as read, or a month of a bill's printed history. */
export const BILL_SOURCES = ["typed", "bill", "history"] as const;
export type BillSource = (typeof BILL_SOURCES)[number];
