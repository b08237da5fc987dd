// The whole database schema in one place (Drizzle, MariaDB). better-auth's four tables come
// first with the field names it expects; Kilowright's own tables follow. Every record that
// belongs to a company carries `company_id`, and every query filters on it.
import { sql } from "drizzle-orm";
import {
  boolean,
  datetime,
  decimal,
  index,
  int,
  mysqlEnum,
  mysqlTable,
  text,
  timestamp,
  uniqueIndex,
  varchar,
} from "drizzle-orm/mysql-core";

const id = (name = "id") => varchar(name, { length: 36 });
const createdAt = () => timestamp("created_at", { fsp: 3 }).notNull().default(sql`CURRENT_TIMESTAMP(3)`);
const updatedAt = () =>
  timestamp("updated_at", { fsp: 3 })
    .notNull()
    .default(sql`CURRENT_TIMESTAMP(3)`)
    .$onUpdate(() => new Date());

// ── better-auth ────────────────────────────────────────────────────────────────────────────

export const user = mysqlTable("user", {
  id: id().primaryKey(),
  name: varchar("name", { length: 200 }).notNull(),
  email: varchar("email", { length: 320 }).notNull().unique(),
  emailVerified: boolean("email_verified").notNull().default(false),
  image: text("image"),
  createdAt: createdAt(),
  updatedAt: updatedAt(),
});

export const session = mysqlTable(
  "session",
  {
    id: id().primaryKey(),
    expiresAt: timestamp("expires_at", { fsp: 3 }).notNull(),
    token: varchar("token", { length: 255 }).notNull().unique(),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
    ipAddress: varchar("ip_address", { length: 64 }),
    userAgent: text("user_agent"),
    userId: id("user_id")
      .notNull()
      .references(() => user.id, { onDelete: "cascade" }),
  },
  (t) => [index("session_user_idx").on(t.userId)],
);

export const account = mysqlTable(
  "account",
  {
    id: id().primaryKey(),
    accountId: varchar("account_id", { length: 255 }).notNull(),
    providerId: varchar("provider_id", { length: 64 }).notNull(),
    userId: id("user_id")
      .notNull()
      .references(() => user.id, { onDelete: "cascade" }),
    accessToken: text("access_token"),
    refreshToken: text("refresh_token"),
    idToken: text("id_token"),
    accessTokenExpiresAt: timestamp("access_token_expires_at", { fsp: 3 }),
    refreshTokenExpiresAt: timestamp("refresh_token_expires_at", { fsp: 3 }),
    scope: text("scope"),
    password: text("password"),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
  },
  (t) => [index("account_user_idx").on(t.userId)],
);

export const verification = mysqlTable(
  "verification",
  {
    id: id().primaryKey(),
    identifier: varchar("identifier", { length: 255 }).notNull(),
    value: text("value").notNull(),
    expiresAt: timestamp("expires_at", { fsp: 3 }).notNull(),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
  },
  (t) => [index("verification_identifier_idx").on(t.identifier)],
);

// ── Companies and people ───────────────────────────────────────────────────────────────────

export const ROLES = ["owner", "admin", "office_manager", "sales_rep", "crew"] as const;
export type Role = (typeof ROLES)[number];

export const company = mysqlTable("company", {
  id: id().primaryKey(),
  name: varchar("name", { length: 200 }).notNull(),
  licenseNumber: varchar("license_number", { length: 100 }),
  createdAt: createdAt(),
  updatedAt: updatedAt(),
});

/** A person's place in a company. One company per person (the unique user_id). */
export const membership = mysqlTable(
  "membership",
  {
    id: id().primaryKey(),
    companyId: id("company_id")
      .notNull()
      .references(() => company.id, { onDelete: "cascade" }),
    userId: id("user_id")
      .notNull()
      .references(() => user.id, { onDelete: "cascade" }),
    role: mysqlEnum("role", ROLES).notNull(),
    status: mysqlEnum("status", ["active", "deactivated"]).notNull().default("active"),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
  },
  (t) => [uniqueIndex("membership_user_uq").on(t.userId), index("membership_company_idx").on(t.companyId)],
);

export const invitation = mysqlTable(
  "invitation",
  {
    id: id().primaryKey(),
    companyId: id("company_id")
      .notNull()
      .references(() => company.id, { onDelete: "cascade" }),
    email: varchar("email", { length: 320 }).notNull(),
    name: varchar("name", { length: 200 }),
    role: mysqlEnum("role", ROLES).notNull(),
    /** SHA-256 of the token in the link; the token itself is never stored. */
    tokenHash: varchar("token_hash", { length: 64 }).notNull(),
    invitedByUserId: id("invited_by_user_id").references(() => user.id, { onDelete: "set null" }),
    expiresAt: timestamp("expires_at", { fsp: 3 }).notNull(),
    acceptedAt: timestamp("accepted_at", { fsp: 3 }),
    revokedAt: timestamp("revoked_at", { fsp: 3 }),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex("invitation_token_uq").on(t.tokenHash), index("invitation_company_idx").on(t.companyId, t.email)],
);

/** Failed sign-in attempts, kept in the database so every app node sees the same limit. */
export const signInFailure = mysqlTable(
  "sign_in_failure",
  {
    id: int("id").autoincrement().primaryKey(),
    email: varchar("email", { length: 320 }).notNull(),
    failedAt: datetime("failed_at", { fsp: 3 }).notNull(),
  },
  (t) => [index("sign_in_failure_email_idx").on(t.email, t.failedAt)],
);

// ── Households and deals ───────────────────────────────────────────────────────────────────

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

export const household = mysqlTable(
  "household",
  {
    id: id().primaryKey(),
    companyId: id("company_id")
      .notNull()
      .references(() => company.id, { onDelete: "cascade" }),
    name: varchar("name", { length: 200 }).notNull(),
    email: varchar("email", { length: 320 }),
    phone: varchar("phone", { length: 40 }),
    street: varchar("street", { length: 200 }).notNull(),
    city: varchar("city", { length: 100 }).notNull(),
    region: varchar("region", { length: 50 }).notNull(),
    postalCode: varchar("postal_code", { length: 20 }).notNull(),
    latitude: decimal("latitude", { precision: 9, scale: 6, mode: "number" }).notNull(),
    longitude: decimal("longitude", { precision: 9, scale: 6, mode: "number" }).notNull(),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
  },
  (t) => [index("household_company_idx").on(t.companyId)],
);

export const deal = mysqlTable(
  "deal",
  {
    id: id().primaryKey(),
    companyId: id("company_id")
      .notNull()
      .references(() => company.id, { onDelete: "cascade" }),
    householdId: id("household_id")
      .notNull()
      .references(() => household.id, { onDelete: "cascade" }),
    ownerUserId: id("owner_user_id").references(() => user.id, { onDelete: "set null" }),
    stage: mysqlEnum("stage", STAGES).notNull().default("lead"),
    stageChangedAt: timestamp("stage_changed_at", { fsp: 3 }).notNull().default(sql`CURRENT_TIMESTAMP(3)`),
    source: varchar("source", { length: 100 }),
    /** Contract value in integer cents, once priced. */
    contractCents: int("contract_cents"),
    systemDcWatts: int("system_dc_watts"),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
  },
  (t) => [index("deal_company_stage_idx").on(t.companyId, t.stage), index("deal_owner_idx").on(t.companyId, t.ownerUserId)],
);

export const schema = { user, session, account, verification, company, membership, invitation, signInFailure, household, deal };
