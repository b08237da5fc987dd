import "server-only";
import { and, asc, count, desc, eq, gte, inArray, isNull, like, lt, or, sql, type SQL } from "drizzle-orm";
import type { AnyMySqlColumn } from "drizzle-orm/mysql-core";
import { LRUCache } from "lru-cache";
import Papa from "papaparse";
import type { z } from "zod";
import { deal, dealsRevision, household, membership, user } from "@/db/schema";
import { can } from "@/lib/permissions";
import {
  DEAL_TABLE_COUNT_LIMIT,
  DEAL_TABLE_SEARCH_COUNT_LIMIT,
  parseSort,
  type BulkAnswer,
  type BulkResult,
  type dealBulkSchema,
  type DealTableFilters,
  type DealTablePage,
  type DealTableQuery,
  type DealTableRow,
  type DealTableSortColumn,
} from "@/lib/schemas/deal-table";
import { STAGE_LABELS } from "@/lib/stages";
import { dateInZone } from "@/lib/zoned-time";
import { zoneForDays, withinDays } from "@/server/day-filters";
import { db, transaction } from "@/server/db";
import { dealAudience, visibleTo } from "@/server/deals";
import { HttpError } from "@/server/errors";
import type { Member } from "@/server/session";
import { activeDealOwners, moveDealStage } from "@/server/stages";
import { recordEvent } from "@/server/timeline";

const SORT_COLUMNS: Record<DealTableSortColumn, AnyMySqlColumn> = {
  household: household.name,
  city: household.city,
  stage: deal.stage,
  systemDcWatts: deal.systemDcWatts,
  contractCents: deal.contractCents,
  stageChangedAt: deal.stageChangedAt,
  createdAt: deal.createdAt,
  owner: user.name,
  source: deal.source,
};

const rowColumns = {
  id: deal.id,
  householdName: household.name,
  city: household.city,
  stage: deal.stage,
  systemDcWatts: deal.systemDcWatts,
  contractCents: deal.contractCents,
  stageChangedAt: deal.stageChangedAt,
  createdAt: deal.createdAt,
  ownerUserId: deal.ownerUserId,
  ownerName: user.name,
  source: deal.source,
};

const escapeLike = (s: string) => s.replace(/[\\%_]/g, (c) => `\\${c}`);

/**
 * The filters once a search is resolved: a search matching few households becomes the list of
 * their ids (householdIds, read by the deal's household index); one matching many stays a
 * LIKE over the joined households (q), where matches are dense and found quickly.
 */
type Scope = DealTableFilters & { householdIds?: string[]; timeZone?: string | null };

/** Past this many matching households a search stays a LIKE on the joined households. */
const SEARCH_HOUSEHOLD_IDS = 1_000;

const searchCondition = (q: string) => {
  const pattern = `%${escapeLike(q)}%`;
  return or(like(household.name, pattern), like(household.contactName, pattern), like(household.street, pattern), like(household.city, pattern)) as SQL;
};

/**
 * Reads the company's households alone for a search (one pass over the household table, which
 * is far cheaper than looking each deal's household up): their ids when they are few, null
 * when the search should stay a LIKE on the joined households.
 */
async function searchHouseholdIds(companyId: string, q: string): Promise<string[] | null> {
  const rows = await db()
    .select({ id: household.id })
    .from(household)
    .where(and(eq(household.companyId, companyId), searchCondition(q)))
    .limit(SEARCH_HOUSEHOLD_IDS + 1);
  return rows.length > SEARCH_HOUSEHOLD_IDS ? null : rows.map((r) => r.id);
}

const withHouseholds = (f: DealTableFilters, ids: string[] | null): Scope => (ids ? { ...f, q: undefined, householdIds: ids } : f);

async function resolveSearch(member: Member, f: DealTableFilters): Promise<Scope> {
  return f.q ? withHouseholds(f, await searchHouseholdIds(member.companyId, f.q)) : f;
}

/**
 * Searches already resolved to households, keyed by the company's households counter: a stage
 * move or a new price leaves which households a search matches unchanged, so after such a
 * change a search costs the deals' page and count only, not another pass over every household.
 */
const searchCache = new LRUCache<string, { ids: string[] | null }, { companyId: string; q: string }>({
  max: 2_000,
  fetchMethod: async (_key, _stale, { context }) => ({ ids: await searchHouseholdIds(context.companyId, context.q) }),
});

async function resolveSearchKept(member: Member, f: DealTableFilters, revision: Revision): Promise<Scope> {
  if (!f.q) return f;
  const key = JSON.stringify([member.companyId, revision.households, f.q]);
  const found = await searchCache.fetch(key, { context: { companyId: member.companyId, q: f.q } });
  return withHouseholds(f, found?.ids ?? null);
}

/** The WHERE of the table: company and visibility first, then the person's filters. */
function whereFor(member: Member, f: Scope): SQL {
  const parts: SQL[] = [visibleTo(member)];
  if (f.householdIds) parts.push(f.householdIds.length > 0 ? inArray(deal.householdId, f.householdIds) : sql`false`);
  if (f.stage) parts.push(eq(deal.stage, f.stage));
  if (f.owner) parts.push(eq(deal.ownerUserId, f.owner));
  if (f.source) parts.push(eq(deal.source, f.source));
  parts.push(...withinDays(deal.createdAt, f, f.timeZone ?? null));
  if (f.q) parts.push(searchCondition(f.q));
  return and(...parts) as SQL;
}

function orderFor(sort: string): SQL[] {
  const { column, direction } = parseSort(sort);
  const col = SORT_COLUMNS[column];
  const dir = direction === "asc" ? asc : desc;
  // A household's columns are tied by the household's id, which is as good as the deal's: a
  // household has one deal (createLead writes both). It lets the database walk the household's
  // (company, name or city) index in order instead of sorting every deal.
  if (column === "household" || column === "city") return [dir(col), dir(household.id)];
  // The id breaks ties so that pages never overlap or skip rows.
  return [dir(col), dir(deal.id)];
}

function baseSelect() {
  return db()
    .select(rowColumns)
    .from(deal)
    .innerJoin(household, and(eq(household.id, deal.householdId), eq(household.companyId, deal.companyId)))
    .leftJoin(user, eq(user.id, deal.ownerUserId));
}

type RawRow = Omit<DealTableRow, "stageChangedAt" | "createdAt"> & { stageChangedAt: Date; createdAt: Date };
const serialize = (r: RawRow): DealTableRow => ({ ...r, stageChangedAt: r.stageChangedAt.toISOString(), createdAt: r.createdAt.toISOString() });

/** Only the search and the household's columns need the household; only the owner sort needs the user. */
function joinsFor(f: DealTableFilters): { household: boolean; user: boolean } {
  const { column } = parseSort(f.sort);
  return { household: Boolean(f.q) || column === "household" || column === "city", user: column === "owner" };
}

/**
 * The ids of one page, in order. Sorting and skipping happen on the deal table alone (joined
 * only where the filter or sort needs it), so the database walks an index and skips over
 * narrow rows; the households and owners are then read for these ids only ("deferred join").
 */
async function pageIds(member: Member, f: Scope, limit: number, offset: number): Promise<string[]> {
  if (parseSort(f.sort).column === "owner") return ownerSortedIds(member, f, limit, offset);
  const joins = joinsFor(f);
  let q = db().select({ id: deal.id }).from(deal).$dynamic();
  if (joins.household) q = q.innerJoin(household, and(eq(household.id, deal.householdId), eq(household.companyId, deal.companyId)));
  if (joins.user) q = q.leftJoin(user, eq(user.id, deal.ownerUserId));
  const rows = await q
    .where(whereFor(member, f))
    .orderBy(...orderFor(f.sort))
    .limit(limit)
    .offset(offset);
  return rows.map((r) => r.id);
}

/**
 * The owner sort, without sorting every deal by its owner's name: a company has few owners,
 * so each owner's deals are read in id order from the (company, owner) index, at most
 * offset + limit of them, and the groups are laid end to end in the owners' name order (no
 * owner first when ascending, as SQL sorts NULL). Owners sharing a name follow each other by
 * user id.
 */
async function ownerSortedIds(member: Member, f: Scope, limit: number, offset: number): Promise<string[]> {
  const ascending = parseSort(f.sort).direction === "asc";
  const present = await db()
    .selectDistinct({ ownerUserId: deal.ownerUserId })
    .from(deal)
    .where(whereFor(member, { sort: f.sort, owner: f.owner }));
  const ids = present.map((p) => p.ownerUserId).filter((id): id is string => id !== null);
  // Named in the database's collation, as ORDER BY would; the user id keeps namesakes apart.
  const named = ids.length
    ? (await db().select({ id: user.id }).from(user).where(inArray(user.id, ids)).orderBy(asc(user.name), asc(user.id))).map((u) => u.id)
    : [];
  // No owner (NULL) sorts first, as in SQL; an id without a user (not possible with the foreign key) with it.
  const unnamed = ids.filter((id) => !named.includes(id));
  const groups: (string | null)[] = [...(present.some((p) => p.ownerUserId === null) ? [null] : []), ...unnamed, ...named];
  if (!ascending) groups.reverse();
  if (groups.length === 0) return [];

  const where = whereFor(member, f);
  const take = sql.raw(String(offset + limit));
  const dir = ascending ? sql.raw("ASC") : sql.raw("DESC");
  const from = f.q
    ? sql`${deal} INNER JOIN ${household} ON ${household.id} = ${deal.householdId} AND ${household.companyId} = ${deal.companyId}`
    : sql`${deal}`;
  const parts = groups.map(
    (owner, k) =>
      sql`(SELECT ${deal.id} AS id, ${sql.raw(String(k))} AS k FROM ${from} WHERE ${where} AND ${owner === null ? isNull(deal.ownerUserId) : eq(deal.ownerUserId, owner)} ORDER BY ${deal.id} ${dir} LIMIT ${take})`,
  );
  const [rows] = (await db().execute(
    sql`SELECT t.id FROM (${sql.join(parts, sql` UNION ALL `)}) AS t ORDER BY t.k ASC, t.id ${dir} LIMIT ${sql.raw(String(limit))} OFFSET ${sql.raw(String(offset))}`,
  )) as unknown as [{ id: string }[]];
  return rows.map((r) => r.id);
}

/** The rows of these ids (the person's company only), in the ids' order. */
async function rowsOf(member: Member, ids: string[]): Promise<DealTableRow[]> {
  if (ids.length === 0) return [];
  const rows = await baseSelect().where(and(eq(deal.companyId, member.companyId), inArray(deal.id, ids)));
  const byId = new Map(rows.map((r) => [r.id, r]));
  return ids.flatMap((id) => {
    const r = byId.get(id);
    return r ? [serialize(r)] : [];
  });
}

/**
 * How many deals match, counted up to `limit` + 1 (DEAL_TABLE_COUNT_LIMIT): past it the answer
 * is "more than limit", so the cost stays bounded however many deals a company has. The
 * household is joined only for a search: every deal's household belongs to the deal's
 * company (createLead writes both in one transaction), so without a search the join adds
 * nothing but a lookup per deal.
 */
async function countMatching(member: Member, f: Scope, limit: number): Promise<{ total: number; capped: boolean }> {
  let q = db().select({ one: sql<number>`1` }).from(deal).$dynamic();
  if (f.q) q = q.innerJoin(household, and(eq(household.id, deal.householdId), eq(household.companyId, deal.companyId)));
  const matching = q
    .where(whereFor(member, f))
    .limit(limit + 1)
    .as("matching");
  const [{ n }] = await db().select({ n: count() }).from(matching);
  const total = Number(n);
  return total > limit ? { total: limit, capped: true } : { total, capped: false };
}

/** One page read from the database: the ids in SQL order, their rows, and the total. */
async function readPage(member: Member, query: DealTableQuery, countLimit: number, revision: Revision, timeZone: string | null): Promise<DealTablePage> {
  const offset = (query.page - 1) * query.pageSize;
  const scope = { ...(await resolveSearchKept(member, query, revision)), timeZone };
  // One id more than the page tells whether another page follows, even when the count stops.
  const limit = query.q ? Math.min(countLimit, DEAL_TABLE_SEARCH_COUNT_LIMIT) : countLimit;
  const [ids, counted] = await Promise.all([pageIds(member, scope, query.pageSize + 1, offset), countMatching(member, scope, limit)]);
  const hasNextPage = ids.length > query.pageSize;
  return {
    rows: await rowsOf(member, ids.slice(0, query.pageSize)),
    total: counted.total,
    totalCapped: counted.capped,
    hasNextPage,
    page: query.page,
    pageSize: query.pageSize,
  };
}

// ── Pages kept in memory, keyed by the company's deals revision ──

/**
 * The company's deals revision (the deals_revision table, bumped by triggers in every writer's
 * transaction: drizzle/0004_deals-revision.sql). Read before the page, so a page stored under
 * revision r holds data at least as new as r; any later change makes r + 1 and a new key.
 */
async function revisionOf(companyId: string): Promise<Revision> {
  revisionQuery ??= prepareRevisionQuery();
  const [row] = await revisionQuery.execute({ companyId });
  return row ?? { deals: 0, households: 0 };
}
function prepareRevisionQuery() {
  return db()
    .select({ deals: dealsRevision.revision, households: dealsRevision.households })
    .from(dealsRevision)
    .where(eq(dealsRevision.companyId, sql.placeholder("companyId")))
    .limit(1)
    .prepare();
}
let revisionQuery: ReturnType<typeof prepareRevisionQuery> | undefined;

/** The company's two counters: any change a deals list shows, and changes to households' searchable text. */
type Revision = { deals: number; households: number };
type PageRequest = { member: Member; query: DealTableQuery; countLimit: number; revision: Revision; timeZone: string | null };

/**
 * Recently read pages. Offices open the same views again and again (the default sort, a saved
 * view, page 2 and back), and counting up to DEAL_TABLE_COUNT_LIMIT rows costs more than the
 * page itself; a page is served from here until the company's next change. fetch() runs one
 * read for concurrent requests of the same key. Bounded by the rows held (≈ 300 bytes each).
 */
const pageCache = new LRUCache<string, DealTablePage, PageRequest>({
  maxSize: 100_000,
  sizeCalculation: (page) => page.rows.length + 1,
  // Frozen: one page object answers many requests (and its JSON text is kept beside it).
  fetchMethod: async (_key, _stale, { context }) => deepFreeze(await readPage(context.member, context.query, context.countLimit, context.revision, context.timeZone)),
});

function deepFreeze(page: DealTablePage): DealTablePage {
  for (const row of page.rows) Object.freeze(row);
  Object.freeze(page.rows);
  return Object.freeze(page);
}

/** A kept page's JSON text, written once: serializing 50 rows costs more than the rest of a cached answer. */
const pageJson = new WeakMap<DealTablePage, string>();

/** Whose deals a page shows (deals.ts dealAudience, the rule visibleTo applies). */
const audience = (member: Member) => (dealAudience(member) === "company" ? "company" : `own:${member.userId}`);

function pageKey(member: Member, q: DealTableQuery, countLimit: number, revision: Revision, timeZone: string | null): string {
  return JSON.stringify([member.companyId, audience(member), revision.deals, countLimit, q.page, q.pageSize, q.sort, q.stage, q.owner, q.source, q.q, q.from, q.to, timeZone]);
}

/** One page of the deals a person may see, paged, sorted and filtered in SQL, with the total. */
export async function dealTablePage(member: Member, query: DealTableQuery, countLimit = DEAL_TABLE_COUNT_LIMIT): Promise<DealTablePage> {
  // The day filters are the company's calendar days: its zone is part of the page's key.
  const [revision, timeZone] = await Promise.all([revisionOf(member.companyId), zoneForDays(member.companyId, query)]);
  const page = await pageCache.fetch(pageKey(member, query, countLimit, revision, timeZone), { context: { member, query, countLimit, revision, timeZone } });
  if (!page) throw new Error("The deals table page could not be read.");
  return page;
}

/** dealTablePage as JSON text, for the table's route handler. */
export async function dealTablePageJson(member: Member, query: DealTableQuery, countLimit = DEAL_TABLE_COUNT_LIMIT): Promise<string> {
  const page = await dealTablePage(member, query, countLimit);
  let text = pageJson.get(page);
  if (text === undefined) {
    text = JSON.stringify(page);
    pageJson.set(page, text);
  }
  return text;
}

export const EXPORT_CHUNK_ROWS = 1_000;

/** Every row of the filtered view, read from the database 1,000 rows at a time. */
export async function* dealTableChunks(member: Member, filters: DealTableFilters, chunkRows = EXPORT_CHUNK_ROWS): AsyncGenerator<DealTableRow[]> {
  const scope = { ...(await resolveSearch(member, filters)), timeZone: await zoneForDays(member.companyId, filters) };
  for (let offset = 0; ; offset += chunkRows) {
    const ids = await pageIds(member, scope, chunkRows, offset);
    if (ids.length > 0) yield await rowsOf(member, ids);
    if (ids.length < chunkRows) return;
  }
}

// ── CSV ──

export const CSV_HEADER = ["Household", "City", "Stage", "System kW DC", "Contract USD", "In stage since", "Created", "Owner", "Source", "Deal ID"];

/**
 * CSV lines (RFC 4180, CRLF after each, so chunks can be joined). Papa Parse quotes what needs
 * it, and `escapeFormulae` puts an apostrophe before text a spreadsheet would run as a formula
 * (=, +, -, @, tab, CR: OWASP "CSV Injection").
 */
export function csvLines(rows: Array<Array<string | number | null>>): string {
  if (rows.length === 0) return "";
  return `${Papa.unparse(rows, { newline: "\r\n", escapeFormulae: true })}\r\n`;
}

function csvCells(r: DealTableRow, timeZone: string): Array<string | null> {
  return [
    r.householdName,
    r.city,
    STAGE_LABELS[r.stage],
    r.systemDcWatts == null ? null : (r.systemDcWatts / 1000).toFixed(2),
    r.contractCents == null ? null : (r.contractCents / 100).toFixed(2),
    dateInZone(new Date(r.stageChangedAt), timeZone), // the company's days, as the table shows them
    dateInZone(new Date(r.createdAt), timeZone),
    r.ownerName,
    r.source,
    r.id,
  ];
}

/** The whole filtered view as a CSV stream (header first), built 1,000 rows at a time; dates are days in `timeZone`. */
export function dealTableCsvStream(member: Member, filters: DealTableFilters, timeZone: string): ReadableStream<Uint8Array> {
  const encoder = new TextEncoder();
  const chunks = dealTableChunks(member, filters);
  let headerSent = false;
  return new ReadableStream<Uint8Array>({
    async pull(controller) {
      if (!headerSent) {
        headerSent = true;
        controller.enqueue(encoder.encode(csvLines([CSV_HEADER])));
        return;
      }
      try {
        const next = await chunks.next();
        if (next.done) controller.close();
        else controller.enqueue(encoder.encode(csvLines(next.value.map((r) => csvCells(r, timeZone)))));
      } catch (err) {
        controller.error(err);
      }
    },
    async cancel() {
      await chunks.return(undefined);
    },
  });
}

/**
 * The people who may own deals, for the owner filter and bulk reassignment (office roles only;
 * reps see their own). Deactivated people stay in the filter (they may still own deals) but
 * cannot be given new ones: `active` says which.
 */
export async function dealOwnerOptions(member: Member): Promise<Array<{ id: string; name: string; active: boolean }>> {
  if (!can(member.role, "deals:read-all")) return [];
  const rows = await db()
    .select({ id: user.id, name: user.name, status: membership.status })
    .from(membership)
    .innerJoin(user, eq(user.id, membership.userId))
    .where(and(eq(membership.companyId, member.companyId), inArray(membership.role, ["owner", "admin", "office_manager", "sales_rep"])))
    .orderBy(user.name);
  return rows.map((r) => ({ id: r.id, name: r.name, active: r.status === "active" }));
}

// ── Bulk actions on selected deals ──

/** Roles that may own deals (the same people as the owner filter). */

/** The household names of the selected deals the person may see (others are not found). */
async function visibleNames(member: Member, dealIds: string[]): Promise<Map<string, string>> {
  const rows = await db()
    .select({ id: deal.id, name: household.name })
    .from(deal)
    .innerJoin(household, and(eq(household.id, deal.householdId), eq(household.companyId, deal.companyId)))
    .where(and(visibleTo(member), inArray(deal.id, dealIds)));
  return new Map(rows.map((r) => [r.id, r.name]));
}

const notFoundResult = (dealId: string): BulkResult => ({ dealId, householdName: null, outcome: "refused", message: "Deal not found." });

/** An active member of the company who may own deals, or a 422 naming the field. */
async function newOwnerOrThrow(member: Member, ownerUserId: string): Promise<{ id: string; name: string }> {
  const [row] = await activeDealOwners(member.companyId, ownerUserId).limit(1);
  if (!row) {
    const message = "Pick an active rep, office manager, admin or owner of your company";
    throw new HttpError(422, "validation_failed", `action.ownerUserId: ${message}`, { "action.ownerUserId": [message] });
  }
  return row;
}

/** Gives one deal a new owner, with its "owner.changed" Timeline event in the same transaction. */
async function reassignOne(member: Member, dealId: string, to: { id: string; name: string }): Promise<BulkResult> {
  return transaction(async (tx) => {
    const [row] = await tx
      .select({ ownerUserId: deal.ownerUserId, householdName: household.name, ownerName: user.name })
      .from(deal)
      .innerJoin(household, and(eq(household.id, deal.householdId), eq(household.companyId, deal.companyId)))
      .leftJoin(user, eq(user.id, deal.ownerUserId))
      .where(and(eq(deal.id, dealId), eq(deal.companyId, member.companyId)))
      .for("update");
    if (!row) return notFoundResult(dealId);
    if (row.ownerUserId === to.id) {
      return { dealId, householdName: row.householdName, outcome: "unchanged", message: `Already owned by ${to.name}.` };
    }
    await tx
      .update(deal)
      .set({ ownerUserId: to.id })
      .where(and(eq(deal.id, dealId), eq(deal.companyId, member.companyId)));
    const summary = `${member.name} reassigned ${row.householdName} from ${row.ownerName ?? "no one"} to ${to.name}`;
    await recordEvent(tx, {
      companyId: member.companyId,
      dealId,
      kind: "owner.changed",
      summary: summary.length > 500 ? `${summary.slice(0, 499)}…` : summary,
      actorUserId: member.userId,
      data: { fromUserId: row.ownerUserId, toUserId: to.id },
    });
    return { dealId, householdName: row.householdName, outcome: "reassigned", message: null };
  });
}

/**
 * POST /api/deals/bulk: the same rules as one deal at a time. Moves go through moveDealStage
 * (permission, stage rules, Timeline event in the move's transaction), one deal after another;
 * a deal the rules refuse is reported with their reason and the others still move.
 * Reassigning is the office's (deals:read-all) and only to an active seller of the company.
 */
export async function bulkDealAction(member: Member, input: z.output<typeof dealBulkSchema>): Promise<BulkAnswer> {
  const { dealIds, action } = input;
  if (action.kind === "reassign" && !can(member.role, "deals:read-all")) {
    throw new HttpError(403, "forbidden", "Only the office can reassign deals.");
  }
  const newOwner = action.kind === "reassign" ? await newOwnerOrThrow(member, action.ownerUserId) : null;
  const names = await visibleNames(member, dealIds);
  const results: BulkResult[] = [];
  for (const dealId of dealIds) {
    const householdName = names.get(dealId);
    if (householdName === undefined) {
      results.push(notFoundResult(dealId));
      continue;
    }
    if (newOwner) {
      results.push(await reassignOne(member, dealId, newOwner));
      continue;
    }
    if (action.kind !== "move") continue;
    try {
      await moveDealStage(member, dealId, action.to, action.reason);
      results.push({ dealId, householdName, outcome: "moved", message: null });
    } catch (err) {
      if (!(err instanceof HttpError) || err.status >= 500) throw err;
      results.push({ dealId, householdName, outcome: "refused", message: err.message });
    }
  }
  const done = results.filter((r) => r.outcome === "moved" || r.outcome === "reassigned").length;
  return { results, done, refused: results.filter((r) => r.outcome === "refused").length };
}
