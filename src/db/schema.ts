// The whole database schema in one place (Drizzle, MariaDB). better-auth's four tables come
// first with the field names it expects; Kilowright's own tables follow. Every record that
// belongs to a company carries `company_id`, and every query filters on it.
import { sql } from "drizzle-orm";
import {
  type AnyMySqlColumn,
  bigint,
  boolean,
  date,
  datetime,
  double,
  decimal,
  mediumtext,
  index,
  int,
  mysqlEnum,
  mysqlTable,
  text,
  timestamp,
  uniqueIndex,
  varchar,
} from "drizzle-orm/mysql-core";
import { LOCALES } from "../lib/i18n/locales";
import { BILL_SOURCES, CELL_TECHNOLOGIES, PAYMENT_STATUSES, PROPOSAL_STATUSES, ROLES, STAGES, VOC_COEFF_UNIT_KEYS } from "../lib/enums";
import { ratePlanSchema } from "../engine/rates";
import { storedCompanySettingsSchema } from "../lib/schemas/company-settings";
import { designDocumentSchema } from "../lib/schemas/design";
import { storedJobChecklistSchema, storedTemplateItemsSchema } from "../lib/schemas/jobs";
import { offerBasisSchema } from "../lib/offer-basis";
import { offerInputsSchema } from "../lib/schemas/offer";
import { priceBookSchema } from "../lib/schemas/price-book";
import { BOS_KINDS, bosDetailsSchema } from "../lib/schemas/bos";
import { roofSurveyFacesSchema } from "../lib/schemas/roof-survey";
import { jsonColumn } from "./json-column";
import * as shapes from "./json-shapes";

// The enum value lists live in src/lib/enums.ts (browser code needs them without drizzle); re-exported for server code.
export { CELL_TECHNOLOGIES, PAYMENT_STATUSES, PROPOSAL_STATUSES, ROLES, STAGES };
export type { PaymentStatus, ProposalStatus, Role, Stage } from "../lib/enums";

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

export const company = mysqlTable("company", {
  id: id().primaryKey(),
  name: varchar("name", { length: 200 }).notNull(),
  licenseNumber: varchar("license_number", { length: 100 }),
  /** Company settings the office tunes (stall limits per stage…): src/lib/schemas/company-settings.ts. */
  settings: jsonColumn("company", "settings", storedCompanySettingsSchema),
  /** Grows whenever the savings assumptions (settings.finance) change; offers record the one they used. */
  financeVersion: int("finance_version").notNull().default(1),
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
    /** The install crew an installer belongs to (role crew only). */
    crewId: id("crew_id"),
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

/**
 * The counters of the one limiter (src/server/limits.ts, rate-limiter-flexible's MySQL store):
 * one row per limit and key, with the points used and when the window ends (ms since epoch).
 * Column names, order and types are the store's own (it inserts `VALUES (key, points, expire)`).
 * No company_id: the keys are addresses, e-mails and links, counted before anyone is known.
 */
export const rateLimit = mysqlTable("rate_limit", {
  key: varchar("key", { length: 255 }).primaryKey(),
  points: int("points").notNull().default(0),
  expire: bigint("expire", { mode: "number", unsigned: true }),
});

// ── Households and deals ───────────────────────────────────────────────────────────────────

export const household = mysqlTable(
  "household",
  {
    id: id().primaryKey(),
    companyId: id("company_id")
      .notNull()
      .references(() => company.id, { onDelete: "cascade" }),
    name: varchar("name", { length: 200 }).notNull(),
    /** The person the rep deals with; a second adult can be added as the co-signer. */
    contactName: varchar("contact_name", { length: 200 }),
    email: varchar("email", { length: 320 }),
    phone: varchar("phone", { length: 40 }),
    secondContactName: varchar("second_contact_name", { length: 200 }),
    secondContactEmail: varchar("second_contact_email", { length: 320 }),
    secondContactPhone: varchar("second_contact_phone", { length: 40 }),
    street: varchar("street", { length: 200 }).notNull(),
    city: varchar("city", { length: 100 }).notNull(),
    region: varchar("region", { length: 50 }).notNull(),
    postalCode: varchar("postal_code", { length: 20 }).notNull(),
    latitude: decimal("latitude", { precision: 9, scale: 6, mode: "number" }).notNull(),
    longitude: decimal("longitude", { precision: 9, scale: 6, mode: "number" }).notNull(),
    /** The language the homeowner reads (their page, PDF, e-mails), chosen by the rep. */
    language: mysqlEnum("language", LOCALES).notNull().default("en"),
    /** Service panel (electrical design, NEC 705.12): busbar and main breaker ratings, A, and the service voltage, V; null until surveyed. */
    serviceBusbarA: int("service_busbar_a"),
    serviceMainBreakerA: int("service_main_breaker_a"),
    serviceVoltageV: int("service_voltage_v"),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
  },
  (t) => [
    index("household_company_idx").on(t.companyId),
    // The deals table sorts by household name and city (scripts/bench/table-load.ts).
    index("household_company_name_idx").on(t.companyId, t.name),
    index("household_company_city_idx").on(t.companyId, t.city),
  ],
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
    /** The customer's utility (src/server/utilities.ts); null until known. */
    utilityId: id("utility_id").references((): AnyMySqlColumn => utility.id, { onDelete: "set null" }),
    ratePlanId: id("rate_plan_id"),
    /** Contract value in integer cents, once priced. */
    contractCents: int("contract_cents"),
    systemDcWatts: int("system_dc_watts"),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
  },
  (t) => [
    index("deal_company_stage_idx").on(t.companyId, t.stage),
    index("deal_owner_idx").on(t.companyId, t.ownerUserId),
    index("deal_company_changed_idx").on(t.companyId, t.stageChangedAt),
    index("deal_company_created_idx").on(t.companyId, t.createdAt),
    // Sorts and filters of the deals table; without them 100,000 deals time out (docs/benchmarks.md).
    index("deal_company_contract_idx").on(t.companyId, t.contractCents),
    index("deal_company_system_idx").on(t.companyId, t.systemDcWatts),
    index("deal_company_source_idx").on(t.companyId, t.source),
  ],
);

/**
 * A counter per company that grows with every change a deals list could show: database
 * triggers (drizzle/0004_deals-revision.sql) bump it when a deal is added, changed or removed,
 * when a household's name, contact, street or city changes and when a deal owner's name
 * changes, in the writer's own transaction. Readers key cached pages of the deals table by it
 * (src/server/deal-table.ts), so no write path can forget to invalidate them.
 */
export const dealsRevision = mysqlTable("deals_revision", {
  companyId: id("company_id")
    .primaryKey()
    .references(() => company.id, { onDelete: "cascade" }),
  revision: bigint("revision", { mode: "number", unsigned: true }).notNull().default(0),
  /** Bumped only when a household is added or removed or its searchable text changes (the search's own key). */
  households: bigint("households", { mode: "number", unsigned: true }).notNull().default(0),
});

// ── The rep's workspace: energy, catalog, price book, rate plans, weather, design, offers ──

/** A file a person uploaded (bill PDF or photo, interval data, weather file). Bytes live in storage. */
export const upload = mysqlTable(
  "upload",
  {
    id: id().primaryKey(),
    companyId: id("company_id")
      .notNull()
      .references(() => company.id, { onDelete: "cascade" }),
    dealId: id("deal_id").references(() => deal.id, { onDelete: "cascade" }),
    purpose: mysqlEnum("purpose", ["bill", "interval_data", "weather", "site_photo"]).notNull(),
    fileName: varchar("file_name", { length: 255 }).notNull(),
    /** Detected from the content (file-type), never from the name. */
    mimeType: varchar("mime_type", { length: 100 }).notNull(),
    sizeBytes: int("size_bytes").notNull(),
    sha256: varchar("sha256", { length: 64 }).notNull(),
    storageKey: varchar("storage_key", { length: 255 }).notNull(),
    /** Text found in a PDF, or null for a scan or a photo. */
    extractedText: text("extracted_text"),
    uploadedByUserId: id("uploaded_by_user_id").references(() => user.id, { onDelete: "set null" }),
    createdAt: createdAt(),
  },
  (t) => [index("upload_deal_idx").on(t.companyId, t.dealId)],
);

/** One utility bill: its billing period, kWh and amount, typed or confirmed from an upload. */
export const bill = mysqlTable(
  "bill",
  {
    id: id().primaryKey(),
    companyId: id("company_id")
      .notNull()
      .references(() => company.id, { onDelete: "cascade" }),
    dealId: id("deal_id")
      .notNull()
      .references(() => deal.id, { onDelete: "cascade" }),
    periodStart: date("period_start", { mode: "string" }).notNull(),
    periodEnd: date("period_end", { mode: "string" }).notNull(),
    kwh: double("kwh").notNull(),
    costCents: int("cost_cents"),
    uploadId: id("upload_id").references(() => upload.id, { onDelete: "set null" }),
    /** typed by the rep; read from a bill's current period; a month of a bill's printed usage history. */
    source: mysqlEnum("source", BILL_SOURCES).notNull().default("typed"),
    /** The period's dates were estimated (a history that prints only months), not printed. */
    periodEstimated: boolean("period_estimated").notNull().default(false),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
  },
  (t) => [index("bill_deal_idx").on(t.companyId, t.dealId, t.periodStart)],
);

/** Hourly consumption from Green Button or CSV interval data, on the 8760-hour grid. */
export const intervalProfile = mysqlTable(
  "interval_profile",
  {
    id: id().primaryKey(),
    companyId: id("company_id")
      .notNull()
      .references(() => company.id, { onDelete: "cascade" }),
    dealId: id("deal_id")
      .notNull()
      .references(() => deal.id, { onDelete: "cascade" }),
    uploadId: id("upload_id").references(() => upload.id, { onDelete: "set null" }),
    hourlyKwh: jsonColumn("interval_profile", "hourly_kwh", shapes.hourlyKwh).notNull(),
    annualKwh: double("annual_kwh").notNull(),
    coveragePct: double("coverage_pct").notNull(),
    createdAt: createdAt(),
  },
  (t) => [index("interval_profile_deal_idx").on(t.companyId, t.dealId)],
);

/**
 * The deal's usage year (12 months and 8760 hours) derived from its interval data, else its
 * bills: rebuilt in the transaction that changes them, so readers never derive it again. The
 * version grows with every rebuild; an offer records the version it was computed from.
 */
export const dealUsage = mysqlTable(
  "deal_usage",
  {
    id: id().primaryKey(),
    companyId: id("company_id")
      .notNull()
      .references(() => company.id, { onDelete: "cascade" }),
    dealId: id("deal_id")
      .notNull()
      .references(() => deal.id, { onDelete: "cascade" }),
    version: int("version").notNull().default(1),
    source: mysqlEnum("source", ["bills", "interval", "none"]).notNull(),
    monthlyKwh: jsonColumn("deal_usage", "monthly_kwh", shapes.monthlyKwh).notNull(),
    /** Measured hours (interval data) or the months spread by the reference load shape; null with no usage. */
    hourlyKwh: jsonColumn("deal_usage", "hourly_kwh", shapes.hourlyKwh),
    annualKwh: double("annual_kwh").notNull(),
    estimatedMonths: jsonColumn("deal_usage", "estimated_months", shapes.monthFlags).notNull(),
    warnings: jsonColumn("deal_usage", "warnings", shapes.notes).notNull(),
    averageCentsPerKwh: double("average_cents_per_kwh"),
    fillMethod: varchar("fill_method", { length: 40 }).notNull(),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
  },
  (t) => [uniqueIndex("deal_usage_deal_uq").on(t.companyId, t.dealId)],
);

/** A typical-year weather file for a place (EPW, TMY3 or generic CSV), uploaded by an admin. */
export const weatherStation = mysqlTable(
  "weather_station",
  {
    id: id().primaryKey(),
    companyId: id("company_id")
      .notNull()
      .references(() => company.id, { onDelete: "cascade" }),
    name: varchar("name", { length: 200 }).notNull(),
    format: mysqlEnum("format", ["epw", "tmy3", "csv"]).notNull(),
    latitude: double("latitude").notNull(),
    longitude: double("longitude").notNull(),
    elevationM: double("elevation_m").notNull(),
    utcOffsetHours: double("utc_offset_hours").notNull(),
    /** Where the data comes from, shown beside every estimate that uses it. */
    attribution: text("attribution").notNull(),
    annualGhiKwhPerM2: double("annual_ghi_kwh_per_m2").notNull(),
    uploadId: id("upload_id")
      .notNull()
      .references(() => upload.id),
    createdAt: createdAt(),
  },
  (t) => [index("weather_station_company_idx").on(t.companyId)],
);

/** A PV module in the company's catalog (datasheet values at STC). */
export const moduleModel = mysqlTable(
  "module_model",
  {
    id: id().primaryKey(),
    companyId: id("company_id")
      .notNull()
      .references(() => company.id, { onDelete: "cascade" }),
    manufacturer: varchar("manufacturer", { length: 100 }).notNull(),
    model: varchar("model", { length: 100 }).notNull(),
    stcWatts: double("stc_watts").notNull(),
    vocV: double("voc_v").notNull(),
    iscA: double("isc_a").notNull(),
    vmpV: double("vmp_v").notNull(),
    impA: double("imp_a").notNull(),
    gammaPmaxPctPerC: double("gamma_pmax_pct_per_c").notNull(),
    /** The Voc coefficient in %/°C, as the engine uses it (converted from the unit typed). */
    betaVocPctPerC: double("beta_voc_pct_per_c").notNull(),
    /** The Voc coefficient as typed from the datasheet, in voc_coeff_unit; null for rows saved before the unit was kept (their figure is beta_voc_pct_per_c, in %/°C). */
    vocCoeffValue: double("voc_coeff_value"),
    vocCoeffUnit: mysqlEnum("voc_coeff_unit", VOC_COEFF_UNIT_KEYS).notNull().default("pct_per_c"),
    /** The datasheet's maximum series fuse rating, A (NEC 690.9(A)); null when not entered. */
    maxSeriesFuseA: double("max_series_fuse_a"),
    lengthMm: int("length_mm").notNull(),
    widthMm: int("width_mm").notNull(),
    cellTechnology: mysqlEnum("cell_technology", CELL_TECHNOLOGIES).notNull(),
    construction: mysqlEnum("construction", ["glass_glass", "glass_backsheet"]).notNull(),
    encapsulant: varchar("encapsulant", { length: 50 }),
    active: boolean("active").notNull().default(true),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
  },
  (t) => [uniqueIndex("module_model_uq").on(t.companyId, t.manufacturer, t.model)],
);

/** A string inverter or a microinverter in the company's catalog. */
export const inverterModel = mysqlTable(
  "inverter_model",
  {
    id: id().primaryKey(),
    companyId: id("company_id")
      .notNull()
      .references(() => company.id, { onDelete: "cascade" }),
    manufacturer: varchar("manufacturer", { length: 100 }).notNull(),
    model: varchar("model", { length: 100 }).notNull(),
    kind: mysqlEnum("kind", ["string", "micro"]).notNull(),
    acWatts: double("ac_watts").notNull(),
    efficiencyPct: double("efficiency_pct").notNull(),
    /** String inverters: max DC input voltage, MPPT window, max input current per MPPT. */
    maxDcVoltageV: double("max_dc_voltage_v"),
    mpptMinV: double("mppt_min_v"),
    mpptMaxV: double("mppt_max_v"),
    maxInputCurrentA: double("max_input_current_a"),
    mpptCount: int("mppt_count"),
    /** Microinverters: the DC input range and how many modules one unit takes. */
    dcInputMinV: double("dc_input_min_v"),
    dcInputMaxV: double("dc_input_max_v"),
    modulesPerUnit: int("modules_per_unit"),
    active: boolean("active").notNull().default(true),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
  },
  (t) => [uniqueIndex("inverter_model_uq").on(t.companyId, t.manufacturer, t.model)],
);

/**
 * The company's price book and selling policies as one validated document (bands, adders,
 * line items, discount limits per role, incentive rules, deposit policy). Schema:
 * src/lib/schemas/price-book.ts. One row per company.
 */
export const priceBook = mysqlTable(
  "price_book",
  {
    id: id().primaryKey(),
    companyId: id("company_id")
      .notNull()
      .references(() => company.id, { onDelete: "cascade" }),
    document: jsonColumn("price_book", "document", priceBookSchema).notNull(),
    /** Grows with every save; `incentivesVersion` only when the incentive rules change. Offers record both. */
    version: int("version").notNull().default(1),
    incentivesVersion: int("incentives_version").notNull().default(1),
    updatedByUserId: id("updated_by_user_id").references(() => user.id, { onDelete: "set null" }),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
  },
  (t) => [uniqueIndex("price_book_company_uq").on(t.companyId)],
);

/**
 * A utility the company's customers buy power from: its rate plans and utility incentives
 * belong to it, and a deal names its customer's one. `time_zone` is the utility's billing clock.
 */
export const utility = mysqlTable(
  "utility",
  {
    id: id().primaryKey(),
    companyId: id("company_id")
      .notNull()
      .references(() => company.id, { onDelete: "cascade" }),
    name: varchar("name", { length: 200 }).notNull(),
    timeZone: varchar("time_zone", { length: 64 }).notNull(),
    territoryNotes: text("territory_notes"),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
  },
  (t) => [uniqueIndex("utility_company_name_uq").on(t.companyId, t.name)],
);

/** A utility rate plan; `plan` is the engine's rate plan input (src/engine/rates.ts). */
export const ratePlan = mysqlTable(
  "rate_plan",
  {
    id: id().primaryKey(),
    companyId: id("company_id")
      .notNull()
      .references(() => company.id, { onDelete: "cascade" }),
    name: varchar("name", { length: 200 }).notNull(),
    // Cascade only so a removed company takes its rows; a utility itself is never deleted.
    utilityId: id("utility_id")
      .notNull()
      .references(() => utility.id, { onDelete: "cascade" }),
    plan: jsonColumn("rate_plan", "plan", ratePlanSchema).notNull(),
    active: boolean("active").notNull().default(true),
    /** Grows with every change of the plan; offers record the version they were priced with. */
    version: int("version").notNull().default(1),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
  },
  (t) => [index("rate_plan_company_idx").on(t.companyId)],
);

/** The deal's working design: equipment, roof faces and module counts (schema: src/lib/schemas/design.ts). */
export const design = mysqlTable(
  "design",
  {
    id: id().primaryKey(),
    companyId: id("company_id")
      .notNull()
      .references(() => company.id, { onDelete: "cascade" }),
    dealId: id("deal_id")
      .notNull()
      .references(() => deal.id, { onDelete: "cascade" }),
    document: jsonColumn("design", "document", designDocumentSchema).notNull(),
    /** The station chosen by the rep; null means the nearest one. */
    weatherStationId: id("weather_station_id").references(() => weatherStation.id, { onDelete: "set null" }),
    /** Grows with every save; offers record the revision they were computed from. */
    revision: int("revision").notNull().default(1),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
  },
  (t) => [uniqueIndex("design_deal_uq").on(t.companyId, t.dealId)],
);

/** One of 1–3 priced offers of a deal: its own system, adders, discount and payment. */
export const offer = mysqlTable(
  "offer",
  {
    id: id().primaryKey(),
    companyId: id("company_id")
      .notNull()
      .references(() => company.id, { onDelete: "cascade" }),
    dealId: id("deal_id")
      .notNull()
      .references(() => deal.id, { onDelete: "cascade" }),
    position: int("position").notNull(),
    name: varchar("name", { length: 100 }).notNull(),
    /** Inputs (system, adders, discount, payment) as the rep set them: src/lib/schemas/offer.ts. */
    inputs: jsonColumn("offer", "inputs", offerInputsSchema).notNull(),
    /** The engine's figures for those inputs, recomputed on every save. */
    results: jsonColumn("offer", "results", shapes.offerFiguresEnvelope).notNull(),
    /**
     * What the figures were computed from (src/lib/offer-basis.ts): the versions of the usage,
     * design, rate plan, price book, incentive rules and savings assumptions, and the usage and
     * design figures themselves, which a proposal copies. Null for offers saved before it existed.
     */
    basis: jsonColumn("offer", "basis", offerBasisSchema),
    discountCents: int("discount_cents").notNull().default(0),
    discountStatus: mysqlEnum("discount_status", ["none", "within_limit", "pending", "approved", "declined"]).notNull().default("none"),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
  },
  (t) => [uniqueIndex("offer_position_uq").on(t.companyId, t.dealId, t.position)],
);

/** A discount beyond the rep's limit, waiting for the office manager. */
export const discountRequest = mysqlTable(
  "discount_request",
  {
    id: id().primaryKey(),
    companyId: id("company_id")
      .notNull()
      .references(() => company.id, { onDelete: "cascade" }),
    dealId: id("deal_id")
      .notNull()
      .references(() => deal.id, { onDelete: "cascade" }),
    offerId: id("offer_id")
      .notNull()
      .references(() => offer.id, { onDelete: "cascade" }),
    amountCents: int("amount_cents").notNull(),
    reason: text("reason").notNull(),
    status: mysqlEnum("status", ["pending", "approved", "declined"]).notNull().default("pending"),
    requestedByUserId: id("requested_by_user_id").references(() => user.id, { onDelete: "set null" }),
    decidedByUserId: id("decided_by_user_id").references(() => user.id, { onDelete: "set null" }),
    decidedAt: timestamp("decided_at", { fsp: 3 }),
    decisionNote: text("decision_note"),
    createdAt: createdAt(),
  },
  (t) => [index("discount_request_company_idx").on(t.companyId, t.status)],
);

/** What happened to a deal, newest last: stage moves, uploads, offers, approvals. */
export const timelineEvent = mysqlTable(
  "timeline_event",
  {
    id: id().primaryKey(),
    companyId: id("company_id")
      .notNull()
      .references(() => company.id, { onDelete: "cascade" }),
    dealId: id("deal_id")
      .notNull()
      .references(() => deal.id, { onDelete: "cascade" }),
    kind: varchar("kind", { length: 50 }).notNull(),
    summary: varchar("summary", { length: 500 }).notNull(),
    data: jsonColumn("timeline_event", "data", shapes.timelineData),
    actorUserId: id("actor_user_id").references(() => user.id, { onDelete: "set null" }),
    createdAt: createdAt(),
  },
  (t) => [index("timeline_event_deal_idx").on(t.companyId, t.dealId, t.createdAt)],
);

// ── Proposals and signing ─────────────────────────────────────────────────────────────────

/**
 * A frozen, numbered, versioned snapshot of 1–3 offers of a deal, sent to the customer.
 * `snapshot` copies every input and figure (src/lib/schemas/proposal.ts), so later edits to
 * offers, catalog or price book never change it. Editing makes a new version; the old one
 * becomes `replaced`. The link token is stored only as its SHA-256.
 */
export const proposal = mysqlTable(
  "proposal",
  {
    id: id().primaryKey(),
    companyId: id("company_id")
      .notNull()
      .references(() => company.id, { onDelete: "cascade" }),
    dealId: id("deal_id")
      .notNull()
      .references(() => deal.id, { onDelete: "cascade" }),
    /** Company-wide proposal number, shared by all versions of one deal's proposal. */
    number: int("number").notNull(),
    version: int("version").notNull(),
    status: mysqlEnum("status", PROPOSAL_STATUSES).notNull().default("sent"),
    snapshot: jsonColumn("proposal", "snapshot", shapes.proposalSnapshotEnvelope).notNull(),
    /** The unsigned PDF as sent, and its SHA-256 (hex). */
    pdfStorageKey: varchar("pdf_storage_key", { length: 255 }).notNull(),
    pdfSha256: varchar("pdf_sha256", { length: 64 }).notNull(),
    tokenHash: varchar("token_hash", { length: 64 }).notNull(),
    expiresAt: timestamp("expires_at", { fsp: 3 }).notNull(),
    revokedAt: timestamp("revoked_at", { fsp: 3 }),
    replacedByProposalId: id("replaced_by_proposal_id"),
    sentToEmail: varchar("sent_to_email", { length: 320 }).notNull(),
    sentByUserId: id("sent_by_user_id").references(() => user.id, { onDelete: "set null" }),
    /** A sale made in the customer's home carries the 3-business-day right to cancel (16 CFR 429). */
    inHomeSale: boolean("in_home_sale").notNull().default(true),
    /**
     * The homeowner's language for this proposal's page and e-mails: the household's when sent,
     * then whatever the homeowner switches to on the page. The PDF keeps the language it was
     * sent in (snapshot.household.language).
     */
    locale: mysqlEnum("locale", LOCALES).notNull().default("en"),
    firstOpenedAt: timestamp("first_opened_at", { fsp: 3 }),
    lastViewedAt: timestamp("last_viewed_at", { fsp: 3 }),
    /** The offer the customer chose (snapshot offer position). */
    chosenPosition: int("chosen_position"),
    /** One-time code for signing: hash, expiry, wrong attempts; a new code resets them. */
    codeHash: varchar("code_hash", { length: 64 }),
    codeExpiresAt: timestamp("code_expires_at", { fsp: 3 }),
    codeAttempts: int("code_attempts").notNull().default(0),
    codeVerifiedAt: timestamp("code_verified_at", { fsp: 3 }),
    consentedAt: timestamp("consented_at", { fsp: 3 }),
    signedAt: timestamp("signed_at", { fsp: 3 }),
    signerName: varchar("signer_name", { length: 200 }),
    signerEmail: varchar("signer_email", { length: 320 }),
    signerIp: varchar("signer_ip", { length: 64 }),
    signerUserAgent: varchar("signer_user_agent", { length: 500 }),
    signedStorageKey: varchar("signed_storage_key", { length: 255 }),
    signedSha256: varchar("signed_sha256", { length: 64 }),
    /** Last day (inclusive, local date) the buyer may cancel. */
    cancelDeadline: date("cancel_deadline", { mode: "string" }),
    cancelledAt: timestamp("cancelled_at", { fsp: 3 }),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
  },
  (t) => [
    uniqueIndex("proposal_token_uq").on(t.tokenHash),
    uniqueIndex("proposal_version_uq").on(t.companyId, t.number, t.version),
    uniqueIndex("proposal_signed_sha_uq").on(t.signedSha256),
    index("proposal_deal_idx").on(t.companyId, t.dealId),
  ],
);

/**
 * What happened on a proposal, for its certificate and the office: sent, opened, viewed,
 * code sent, code wrong, code verified, consent, signed, question, cancelled, revoked.
 */
export const proposalEvent = mysqlTable(
  "proposal_event",
  {
    id: id().primaryKey(),
    companyId: id("company_id")
      .notNull()
      .references(() => company.id, { onDelete: "cascade" }),
    proposalId: id("proposal_id")
      .notNull()
      .references(() => proposal.id, { onDelete: "cascade" }),
    kind: varchar("kind", { length: 40 }).notNull(),
    /** A customer's question, or a short note. */
    body: text("body"),
    ip: varchar("ip", { length: 64 }),
    userAgent: varchar("user_agent", { length: 500 }),
    actorUserId: id("actor_user_id").references(() => user.id, { onDelete: "set null" }),
    createdAt: createdAt(),
  },
  (t) => [index("proposal_event_proposal_idx").on(t.companyId, t.proposalId, t.createdAt)],
);

// ── Deposits: payments, refunds, webhook events ──────────────────────────────────────────

/** A deposit asked through a Stripe Checkout Session; the ledger row for it. Amounts in cents. */
export const payment = mysqlTable(
  "payment",
  {
    id: id().primaryKey(),
    companyId: id("company_id")
      .notNull()
      .references(() => company.id, { onDelete: "cascade" }),
    dealId: id("deal_id")
      .notNull()
      .references(() => deal.id, { onDelete: "cascade" }),
    proposalId: id("proposal_id")
      .notNull()
      .references(() => proposal.id, { onDelete: "cascade" }),
    checkoutSessionId: varchar("checkout_session_id", { length: 255 }).notNull(),
    paymentIntentId: varchar("payment_intent_id", { length: 255 }),
    chargeId: varchar("charge_id", { length: 255 }),
    /** What was asked. */
    amountCents: int("amount_cents").notNull(),
    currency: varchar("currency", { length: 3 }).notNull().default("usd"),
    /** What the provider reported as paid (may differ: then status is flagged). */
    paidCents: int("paid_cents"),
    refundedCents: int("refunded_cents").notNull().default(0),
    status: mysqlEnum("status", PAYMENT_STATUSES).notNull().default("open"),
    flagReason: varchar("flag_reason", { length: 500 }),
    failureMessage: varchar("failure_message", { length: 500 }),
    paidAt: timestamp("paid_at", { fsp: 3 }),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
  },
  (t) => [uniqueIndex("payment_session_uq").on(t.checkoutSessionId), index("payment_deal_idx").on(t.companyId, t.dealId)],
);

/** A refund of (part of) a payment, through the Stripe SDK or reported by a webhook. */
export const refund = mysqlTable(
  "refund",
  {
    id: id().primaryKey(),
    companyId: id("company_id")
      .notNull()
      .references(() => company.id, { onDelete: "cascade" }),
    paymentId: id("payment_id")
      .notNull()
      .references(() => payment.id, { onDelete: "cascade" }),
    dealId: id("deal_id")
      .notNull()
      .references(() => deal.id, { onDelete: "cascade" }),
    stripeRefundId: varchar("stripe_refund_id", { length: 255 }).notNull(),
    amountCents: int("amount_cents").notNull(),
    status: varchar("status", { length: 40 }).notNull(),
    reason: varchar("reason", { length: 500 }).notNull(),
    requestedByUserId: id("requested_by_user_id").references(() => user.id, { onDelete: "set null" }),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex("refund_stripe_uq").on(t.stripeRefundId), index("refund_payment_idx").on(t.companyId, t.paymentId)],
);

/**
 * Every Stripe event id processed, once (unique primary key: a replay changes nothing). No
 * company column: events reach the app before it knows whose they are; the payment row is
 * company-scoped.
 */
export const webhookEvent = mysqlTable("webhook_event", {
  id: varchar("id", { length: 255 }).primaryKey(),
  type: varchar("type", { length: 100 }).notNull(),
  /** What the handler did: booked, ignored, flagged, deferred. */
  outcome: varchar("outcome", { length: 40 }).notNull(),
  note: varchar("note", { length: 500 }),
  receivedAt: createdAt(),
});

/**
 * Money the provider reports that the ledger cannot place, for the office to look into: today a
 * refund of a payment the ledger does not know. Shown on Money → Reconciliation. Written with
 * the webhook_event row of its cause, when the event's metadata names one of our companies.
 */
export const paymentAlert = mysqlTable(
  "payment_alert",
  {
    id: id().primaryKey(),
    companyId: id("company_id")
      .notNull()
      .references(() => company.id, { onDelete: "cascade" }),
    kind: mysqlEnum("kind", ["unknown_refund"]).notNull(),
    webhookEventId: varchar("webhook_event_id", { length: 255 }).notNull(),
    chargeId: varchar("charge_id", { length: 255 }),
    paymentIntentId: varchar("payment_intent_id", { length: 255 }),
    amountCents: int("amount_cents"),
    detail: varchar("detail", { length: 500 }).notNull(),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex("payment_alert_event_uq").on(t.webhookEventId), index("payment_alert_company_idx").on(t.companyId, t.createdAt)],
);

/**
 * E-mail that follows a committed change (signed copies, receipts, refund notices, …): written in
 * the same transaction as the change, sent by the mail worker (src/server/outbound-mail.ts) until
 * the mail service accepts it. The body is rendered when queued and cleared once sent.
 */
export const outboundMail = mysqlTable(
  "outbound_mail",
  {
    id: id().primaryKey(),
    companyId: id("company_id")
      .notNull()
      .references(() => company.id, { onDelete: "cascade" }),
    /** Which message this is (the template and audience), e.g. "signed-copy-customer". */
    kind: varchar("kind", { length: 60 }).notNull(),
    toAddresses: jsonColumn("outbound_mail", "to_addresses", shapes.emailAddresses).notNull(),
    replyTo: varchar("reply_to", { length: 320 }),
    subject: varchar("subject", { length: 500 }).notNull(),
    html: mediumtext("html"),
    text: mediumtext("text"),
    /** Sent as the service's Idempotency-Key: a retry of an accepted message is not sent again. */
    idempotencyKey: varchar("idempotency_key", { length: 256 }).notNull().unique(),
    status: mysqlEnum("status", ["pending", "sent", "failed"]).notNull().default("pending"),
    attempts: int("attempts").notNull().default(0),
    /** When a worker may try it next; a claim moves it ahead by the lease, so a crashed send is retried. */
    nextAttemptAt: timestamp("next_attempt_at", { fsp: 3 }).notNull().default(sql`CURRENT_TIMESTAMP(3)`),
    sentAt: timestamp("sent_at", { fsp: 3 }),
    providerId: varchar("provider_id", { length: 100 }),
    lastError: varchar("last_error", { length: 500 }),
    createdAt: createdAt(),
  },
  (t) => [index("outbound_mail_due_idx").on(t.status, t.nextAttemptAt), index("outbound_mail_company_idx").on(t.companyId, t.createdAt)],
);

// ── Jobs for the crews ───────────────────────────────────────────────────────────────────

/** An install crew; its calendar feed sits behind a secret, rotatable URL token. */
export const crew = mysqlTable(
  "crew",
  {
    id: id().primaryKey(),
    companyId: id("company_id")
      .notNull()
      .references(() => company.id, { onDelete: "cascade" }),
    name: varchar("name", { length: 100 }).notNull(),
    /** The calendar feed's URL token (shown to the crew, so kept readable; rotate to revoke). */
    feedToken: varchar("feed_token", { length: 64 }).notNull(),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
  },
  (t) => [uniqueIndex("crew_feed_uq").on(t.feedToken), index("crew_company_idx").on(t.companyId)],
);

/** The company's install checklist templates (admins); a job copies one when scheduled. */
export const checklistTemplate = mysqlTable(
  "checklist_template",
  {
    id: id().primaryKey(),
    companyId: id("company_id")
      .notNull()
      .references(() => company.id, { onDelete: "cascade" }),
    name: varchar("name", { length: 100 }).notNull(),
    /** [{ id, label }] */
    items: jsonColumn("checklist_template", "items", storedTemplateItemsSchema).notNull(),
    active: boolean("active").notNull().default(true),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
  },
  (t) => [index("checklist_template_company_idx").on(t.companyId)],
);

/** The buildable job of a deal, created when its deposit is paid. */
export const job = mysqlTable(
  "job",
  {
    id: id().primaryKey(),
    companyId: id("company_id")
      .notNull()
      .references(() => company.id, { onDelete: "cascade" }),
    dealId: id("deal_id")
      .notNull()
      .references(() => deal.id, { onDelete: "cascade" }),
    /** The signed proposal the job builds (its chosen offer's equipment). */
    proposalId: id("proposal_id").references(() => proposal.id, { onDelete: "set null" }),
    crewId: id("crew_id").references(() => crew.id, { onDelete: "set null" }),
    /** Planned dates (survey_date, install_date, inspection_on) are plans and never move the deal. */
    surveyDate: date("survey_date", { mode: "string" }),
    /** When the survey was done (a record, never after the company's today): moves the deal to Survey. */
    surveyDoneOn: date("survey_done_on", { mode: "string" }),
    installDate: date("install_date", { mode: "string" }),
    permitNumber: varchar("permit_number", { length: 100 }),
    permitSubmittedOn: date("permit_submitted_on", { mode: "string" }),
    permitApprovedOn: date("permit_approved_on", { mode: "string" }),
    interconnectionNumber: varchar("interconnection_number", { length: 100 }),
    interconnectionSubmittedOn: date("interconnection_submitted_on", { mode: "string" }),
    interconnectionApprovedOn: date("interconnection_approved_on", { mode: "string" }),
    inspectionOn: date("inspection_on", { mode: "string" }),
    /** When the inspection passed (a record, after the install): moves the deal to Inspected. */
    inspectionPassedOn: date("inspection_passed_on", { mode: "string" }),
    ptoOn: date("pto_on", { mode: "string" }),
    notes: text("notes"),
    /** The checklist copied from a template: [{ id, label, doneAt, doneByUserId }]. */
    checklist: jsonColumn("job", "checklist", storedJobChecklistSchema),
    installedAt: timestamp("installed_at", { fsp: 3 }),
    /**
     * When the deal was cancelled (the buyer's right to cancel): the job is frozen as it was
     * (dates, crew, checklist kept for the record, never changed again) and leaves the crew's
     * feed, Today and the Jobs list. `cancelReason` says why and by whom.
     */
    cancelledAt: timestamp("cancelled_at", { fsp: 3 }),
    cancelReason: varchar("cancel_reason", { length: 300 }),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
  },
  (t) => [uniqueIndex("job_deal_uq").on(t.companyId, t.dealId), index("job_crew_idx").on(t.companyId, t.crewId, t.installDate)],
);

/** A photo a crew took on site (content-checked, resized, stored). */
export const jobPhoto = mysqlTable(
  "job_photo",
  {
    id: id().primaryKey(),
    companyId: id("company_id")
      .notNull()
      .references(() => company.id, { onDelete: "cascade" }),
    jobId: id("job_id")
      .notNull()
      .references(() => job.id, { onDelete: "cascade" }),
    storageKey: varchar("storage_key", { length: 255 }).notNull(),
    mimeType: varchar("mime_type", { length: 100 }).notNull(),
    widthPx: int("width_px").notNull(),
    heightPx: int("height_px").notNull(),
    sizeBytes: int("size_bytes").notNull(),
    caption: varchar("caption", { length: 200 }),
    uploadedByUserId: id("uploaded_by_user_id").references(() => user.id, { onDelete: "set null" }),
    createdAt: createdAt(),
  },
  (t) => [index("job_photo_job_idx").on(t.companyId, t.jobId)],
);

/** A home battery in the company's catalog (datasheet figures; src/engine/battery.ts models it). */
export const batteryModel = mysqlTable(
  "battery_model",
  {
    id: id().primaryKey(),
    companyId: id("company_id")
      .notNull()
      .references(() => company.id, { onDelete: "cascade" }),
    manufacturer: varchar("manufacturer", { length: 100 }).notNull(),
    model: varchar("model", { length: 100 }).notNull(),
    usableKwh: double("usable_kwh").notNull(),
    continuousKw: double("continuous_kw").notNull(),
    peakKw: double("peak_kw").notNull(),
    roundTripEfficiencyPct: double("round_trip_efficiency_pct").notNull(),
    depthOfDischargePct: double("depth_of_discharge_pct").notNull(),
    warrantyYears: int("warranty_years").notNull(),
    /** Energy the warranty covers (whichever comes first with the years), MWh; null when none is stated. */
    warrantyThroughputMwh: double("warranty_throughput_mwh"),
    coupling: mysqlEnum("coupling", ["ac", "dc"]).notNull(),
    active: boolean("active").notNull().default(true),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
  },
  (t) => [uniqueIndex("battery_model_uq").on(t.companyId, t.manufacturer, t.model)],
);

/** A person's saved view of the deals table (filters, sort, columns). */
export const savedView = mysqlTable(
  "saved_view",
  {
    id: id().primaryKey(),
    companyId: id("company_id")
      .notNull()
      .references(() => company.id, { onDelete: "cascade" }),
    userId: id("user_id")
      .notNull()
      .references(() => user.id, { onDelete: "cascade" }),
    name: varchar("name", { length: 100 }).notNull(),
    /** src/lib/schemas/deal-table.ts query (filters, sort, columns). */
    query: jsonColumn("saved_view", "query", shapes.storedSavedViewQuery).notNull(),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
  },
  (t) => [uniqueIndex("saved_view_name_uq").on(t.companyId, t.userId, t.name)],
);

// ── Balance of system and the roof survey (job packet: bill of materials, roof layout) ────

/** A balance-of-system part in the company's catalog; its kind's own fields in `details` (src/lib/schemas/bos.ts). */
export const bosPart = mysqlTable(
  "bos_part",
  {
    id: id().primaryKey(),
    companyId: id("company_id")
      .notNull()
      .references(() => company.id, { onDelete: "cascade" }),
    kind: mysqlEnum("kind", BOS_KINDS).notNull(),
    manufacturer: varchar("manufacturer", { length: 100 }).notNull(),
    model: varchar("model", { length: 100 }).notNull(),
    details: jsonColumn("bos_part", "details", bosDetailsSchema).notNull(),
    /** The price book line item that prices one unit (a line item id inside price_book.document). */
    priceLineItemId: varchar("price_line_item_id", { length: 40 }),
    active: boolean("active").notNull().default(true),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
  },
  (t) => [uniqueIndex("bos_part_uq").on(t.companyId, t.manufacturer, t.model), index("bos_part_kind_idx").on(t.companyId, t.kind)],
);

/**
 * What the site survey measured for racking and layout, per deal: design wind speed and ground
 * snow load (the racking's span table row; the engineer of record decides), the home-run length,
 * the roof's plan-view area (the fire code's ridge setback depends on the array's share of it),
 * and each design face's outline (src/lib/schemas/roof-survey.ts).
 */
export const roofSurvey = mysqlTable(
  "roof_survey",
  {
    id: id().primaryKey(),
    companyId: id("company_id")
      .notNull()
      .references(() => company.id, { onDelete: "cascade" }),
    dealId: id("deal_id")
      .notNull()
      .references(() => deal.id, { onDelete: "cascade" }),
    designWindMph: int("design_wind_mph"),
    groundSnowPsf: int("ground_snow_psf"),
    homeRunM: double("home_run_m"),
    roofPlanAreaM2: double("roof_plan_area_m2"),
    faces: jsonColumn("roof_survey", "faces", roofSurveyFacesSchema).notNull(),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
  },
  (t) => [uniqueIndex("roof_survey_deal_uq").on(t.companyId, t.dealId)],
);

export const schema = {
  user,
  session,
  account,
  verification,
  company,
  membership,
  invitation,
  rateLimit,
  household,
  deal,
  dealsRevision,
  upload,
  bill,
  intervalProfile,
  weatherStation,
  moduleModel,
  inverterModel,
  priceBook,
  ratePlan,
  design,
  offer,
  discountRequest,
  timelineEvent,
  proposal,
  proposalEvent,
  payment,
  refund,
  webhookEvent,
  paymentAlert,
  outboundMail,
  crew,
  checklistTemplate,
  job,
  jobPhoto,
  batteryModel,
  savedView,
  bosPart,
  roofSurvey,
};
