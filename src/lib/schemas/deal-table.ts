// The deals table's query: paging, sorting and filters, shared by the page, the table route
// and the CSV export. Query-string values arrive as strings; empty ones mean "not set".
import { z } from "zod";
import { plainText } from "@/lib/schemas/text";
import { STAGES, type Stage } from "@/lib/enums";
import { stageMoveReason } from "@/lib/stage-rules";

export const DEAL_TABLE_SORT_COLUMNS = [
  "household",
  "city",
  "stage",
  "systemDcWatts",
  "contractCents",
  "stageChangedAt",
  "createdAt",
  "owner",
  "source",
] as const;
export type DealTableSortColumn = (typeof DEAL_TABLE_SORT_COLUMNS)[number];

export const DEAL_TABLE_MAX_PAGE_SIZE = 200;
export const DEAL_TABLE_DEFAULT_PAGE_SIZE = 50;
export const DEAL_TABLE_DEFAULT_SORT = "stageChangedAt:desc";

const blankToUndefined = (v: unknown) => (typeof v === "string" && v.trim() === "" ? undefined : v);
const optional = <S extends z.ZodType>(schema: S) => z.preprocess(blankToUndefined, schema.optional());

const isoDay = z
  .string()
  .regex(/^\d{4}-\d{2}-\d{2}$/, "Use a date like 2026-03-31")
  .refine((v) => !Number.isNaN(Date.parse(`${v}T00:00:00Z`)) && new Date(`${v}T00:00:00Z`).toISOString().startsWith(v), "Not a real date");

export const dealTableFiltersSchema = z
  .object({
    sort: z.preprocess(
      blankToUndefined,
      z
        .string()
        .regex(new RegExp(`^(${DEAL_TABLE_SORT_COLUMNS.join("|")}):(asc|desc)$`), "Sort by one of the table's columns, e.g. contractCents:desc")
        .default(DEAL_TABLE_DEFAULT_SORT),
    ),
    stage: optional(z.enum(STAGES, { message: "Pick a stage from the list" })),
    owner: optional(z.uuid("Pick an owner from the list")),
    source: optional(z.string().trim().max(100, "Keep the source under 100 characters")),
    q: optional(z.string().trim().max(100, "Keep the search under 100 characters")),
    from: optional(isoDay),
    to: optional(isoDay),
  })
  .refine((v) => !v.from || !v.to || v.from <= v.to, { message: "The start date is after the end date", path: ["to"] });

/** GET /api/deals/table's query string: text by nature, so page numbers are coerced here (and only here). */
export const dealTableQuerySchema = z
  .object({
    page: z.preprocess(blankToUndefined, z.coerce.number().int("Page is a whole number").min(1, "Pages start at 1").max(1_000_000).default(1)),
    pageSize: z.preprocess(
      blankToUndefined,
      z.coerce
        .number()
        .int("Page size is a whole number")
        .min(1, "Show at least one row")
        .max(DEAL_TABLE_MAX_PAGE_SIZE, `Show at most ${DEAL_TABLE_MAX_PAGE_SIZE} rows per page`)
        .default(DEAL_TABLE_DEFAULT_PAGE_SIZE),
    ),
  })
  .and(dealTableFiltersSchema);

export type DealTableFilters = z.output<typeof dealTableFiltersSchema>;
export type DealTableQuery = z.output<typeof dealTableQuerySchema>;

/** Splits "contractCents:desc" into its column and direction (the value is already validated). */
export function parseSort(sort: string): { column: DealTableSortColumn; direction: "asc" | "desc" } {
  const [column, direction] = sort.split(":");
  return { column: column as DealTableSortColumn, direction: direction === "asc" ? "asc" : "desc" };
}

/** One row of the table as the route sends it (dates as ISO strings). */
export type DealTableRow = {
  id: string;
  householdName: string;
  city: string;
  stage: Stage;
  systemDcWatts: number | null;
  contractCents: number | null;
  stageChangedAt: string;
  createdAt: string;
  ownerUserId: string | null;
  ownerName: string | null;
  source: string | null;
};

/**
 * Counting stops here: beyond it the table says "more than 10,000" instead of counting every
 * deal on every page (an exact count walks every matching index entry, which at 100,000 deals
 * costs more than the page itself). The CSV export still has every row.
 */
export const DEAL_TABLE_COUNT_LIMIT = 10_000;
/** A search reads every household it cannot rule out, so its count stops sooner: a search is for finding a few. */
export const DEAL_TABLE_SEARCH_COUNT_LIMIT = 1_000;

/**
 * One page. `total` is exact unless `totalCapped`, when more than `total` deals match;
 * `hasNextPage` says whether a page follows (known either way).
 */
export type DealTablePage = { rows: DealTableRow[]; total: number; totalCapped: boolean; hasNextPage: boolean; page: number; pageSize: number };

/** Turns a search-params record (URLSearchParams or Next's searchParams) into a plain object. */
export function searchParamsObject(params: URLSearchParams | Record<string, string | string[] | undefined>): Record<string, string> {
  const out: Record<string, string> = {};
  if (params instanceof URLSearchParams) {
    for (const [k, v] of params) out[k] = v;
  } else {
    for (const [k, v] of Object.entries(params)) if (v !== undefined) out[k] = Array.isArray(v) ? (v[0] ?? "") : v;
  }
  return out;
}

// ── Saved views (one person's named views of the table) ──

/** Columns a person may hide (the household column always shows). */
export const DEAL_TABLE_HIDEABLE_COLUMNS = ["city", "stage", "systemDcWatts", "contractCents", "stageChangedAt", "createdAt", "owner", "source"] as const;
export const SAVED_VIEWS_PER_PERSON = 50;

/** What a saved view keeps: the table's filters and sort, and optionally page size and hidden columns. */
export const savedViewQuerySchema = z
  .object({
    // Saved views arrive as JSON: a number is a number (no coercion, unlike the query string's).
    pageSize: z
      .number({ error: "Page size is a number" })
      .int("Page size is a whole number")
      .min(1, "Show at least one row")
      .max(DEAL_TABLE_MAX_PAGE_SIZE, `Show at most ${DEAL_TABLE_MAX_PAGE_SIZE} rows per page`)
      .optional(),
    hiddenColumns: z.array(z.enum(DEAL_TABLE_HIDEABLE_COLUMNS, "Hide only the table's own columns")).max(DEAL_TABLE_HIDEABLE_COLUMNS.length).optional(),
  })
  .and(dealTableFiltersSchema);
export type SavedViewQuery = z.output<typeof savedViewQuerySchema>;

const viewName = plainText().trim().min(1, "Name the view").max(100, "Keep the name under 100 characters");

/** POST /api/saved-views */
export const savedViewCreateSchema = z.object({ name: viewName, query: savedViewQuerySchema });
/** PUT /api/saved-views/[id]: rename, replace the query, or both. */
export const savedViewUpdateSchema = z
  .object({ name: viewName.optional(), query: savedViewQuerySchema.optional() })
  .refine((v) => v.name !== undefined || v.query !== undefined, { message: "Send a new name or a new query", path: ["name"] });

export type SavedView = { id: string; name: string; query: SavedViewQuery; createdAt: string; updatedAt: string };

// ── Bulk actions on selected deals ──

export const BULK_MAX_DEALS = 200;

/** POST /api/deals/bulk */
export const dealBulkSchema = z.object({
  dealIds: z
    .array(z.uuid("Deal ids are UUIDs"))
    .min(1, "Select at least one deal")
    .max(BULK_MAX_DEALS, `Select at most ${BULK_MAX_DEALS} deals at a time`)
    .transform((ids) => [...new Set(ids)]),
  action: z.discriminatedUnion(
    "kind",
    [
      z.object({
        kind: z.literal("move"),
        to: z.enum(STAGES, "Pick a stage"),
        reason: stageMoveReason,
      }),
      z.object({ kind: z.literal("reassign"), ownerUserId: z.uuid("Pick a rep from the list") }),
    ],
    "Choose move or reassign",
  ),
});
export type DealBulkInput = z.input<typeof dealBulkSchema>;

export type BulkOutcome = "moved" | "reassigned" | "unchanged" | "refused";
export type BulkResult = { dealId: string; householdName: string | null; outcome: BulkOutcome; message: string | null };
export type BulkAnswer = { results: BulkResult[]; done: number; refused: number };
