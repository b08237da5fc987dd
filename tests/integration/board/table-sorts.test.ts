// The deals table's page queries (ids first, rows after; the owner sort read owner by owner)
// against direct SQL over a few thousand deals: every sort column both ways, filters, a search,
// deep pages, namesake owners and deals without an owner.
import type { RowDataPacket } from "mysql2";
import { beforeAll, describe, expect, it } from "vitest";
import { deal, household, STAGES, user } from "@/db/schema";
import { DEAL_TABLE_SORT_COLUMNS, dealTableFiltersSchema, dealTableQuerySchema } from "@/lib/schemas/deal-table";
import { db, pool } from "@/server/db";
import { dealTableChunks, dealTablePage } from "@/server/deal-table";
import type { Member } from "@/server/session";
import { addMember, newCompany } from "../support/fixtures";

const TOTAL = 2_400;
let owner: Member;
let office: Member;
let reps: Member[];
let stranger: Member;

function rng(seed: number) {
  let s = seed >>> 0;
  return () => {
    s = (s * 1664525 + 1013904223) >>> 0;
    return s / 2 ** 32;
  };
}

/**
 * The SQL the table means: the same joins and order; the owner sort by name, then owner, then
 * deal id; the household's columns tied by the household (one deal per household).
 */
const SQL_ORDER: Record<string, string> = {
  household: "h.name {d}, h.id {d}",
  city: "h.city {d}, h.id {d}",
  stage: "d.stage {d}, d.id {d}",
  systemDcWatts: "d.system_dc_watts {d}, d.id {d}",
  contractCents: "d.contract_cents {d}, d.id {d}",
  stageChangedAt: "d.stage_changed_at {d}, d.id {d}",
  createdAt: "d.created_at {d}, d.id {d}",
  owner: "u.name {d}, d.owner_user_id {d}, d.id {d}",
  source: "d.source {d}, d.id {d}",
};

async function sqlIds(where: string, params: unknown[], sort: string, limit: number, offset: number): Promise<string[]> {
  const [column, direction] = sort.split(":");
  const order = SQL_ORDER[column].replaceAll("{d}", direction.toUpperCase());
  const [rows] = await pool().query<RowDataPacket[]>(
    `SELECT d.id FROM deal d JOIN household h ON h.id = d.household_id AND h.company_id = d.company_id LEFT JOIN user u ON u.id = d.owner_user_id
     WHERE d.company_id = ? ${where} ORDER BY ${order} LIMIT ${limit} OFFSET ${offset}`,
    [owner.companyId, ...params],
  );
  return rows.map((r) => r.id as string);
}

beforeAll(async () => {
  owner = await newCompany("Sorts Solar");
  office = await addMember(owner, "office_manager", "Opal Office");
  // Two reps with the same name: their deals stay apart, by user id.
  // Lower and upper case sort as the database's collation does (ada before Ben).
  reps = [await addMember(owner, "sales_rep", "ada Rep"), await addMember(owner, "sales_rep", "Ben Rep"), await addMember(owner, "sales_rep", "Ben Rep")];
  stranger = await newCompany("Elsewhere Sorts Solar");
  const rand = rng(7);
  const owners = [...reps.map((r) => r.userId), office.userId, null];
  const homes: (typeof household.$inferInsert)[] = [];
  const deals: (typeof deal.$inferInsert)[] = [];
  for (let i = 0; i < TOTAL; i++) {
    const hid = crypto.randomUUID();
    homes.push({
      id: hid,
      companyId: owner.companyId,
      // Few distinct names and cities: ties everywhere.
      name: `${["Oak", "Ash", "Elm", "Yew"][Math.floor(rand() * 4)]} household`,
      contactName: `Contact ${i}`,
      street: `${i} ${rand() < 0.3 ? "Ridge" : "Hollow"} Road`,
      city: ["Greensboro", "Durham", "Boone"][Math.floor(rand() * 3)],
      region: "NC",
      postalCode: "27401",
      latitude: 36,
      longitude: -79.8,
    });
    const created = new Date(Date.UTC(2025, 0, 1) + Math.floor(rand() * 90) * 86_400_000);
    deals.push({
      id: crypto.randomUUID(),
      companyId: owner.companyId,
      householdId: hid,
      ownerUserId: owners[Math.floor(rand() * owners.length)],
      stage: STAGES[Math.floor(rand() * STAGES.length)],
      contractCents: rand() < 0.2 ? null : Math.floor(rand() * 20) * 100_000,
      systemDcWatts: rand() < 0.2 ? null : 4_000 + Math.floor(rand() * 10) * 500,
      source: rand() < 0.1 ? null : ["Referral", "Website", "Phone"][Math.floor(rand() * 3)],
      createdAt: created,
      stageChangedAt: new Date(created.getTime() + Math.floor(rand() * 5) * 86_400_000),
    });
  }
  await db().insert(household).values(homes);
  await db().insert(deal).values(deals);
  // A deal of another company in the same shapes must never show up.
  const hid = crypto.randomUUID();
  await db().insert(household).values({ ...homes[0], id: hid, companyId: stranger.companyId });
  await db().insert(deal).values({ ...deals[0], id: crypto.randomUUID(), companyId: stranger.companyId, householdId: hid, ownerUserId: stranger.userId });
  expect(await db().select({ id: user.id }).from(user)).not.toHaveLength(0);
}, 60_000);

describe("deals table page queries", () => {
  it("match SQL for every sort column in both directions, on the first and a deep page", async () => {
    for (const column of DEAL_TABLE_SORT_COLUMNS) {
      for (const direction of ["asc", "desc"]) {
        const sort = `${column}:${direction}`;
        for (const [page, pageSize] of [
          [1, 50],
          [7, 200],
        ]) {
          const got = await dealTablePage(office, dealTableQuerySchema.parse({ sort, page: String(page), pageSize: String(pageSize) }));
          expect(got.total).toBe(TOTAL);
          expect(got.rows.map((r) => r.id), `${sort} page ${page}`).toEqual(await sqlIds("", [], sort, pageSize, (page - 1) * pageSize));
        }
      }
    }
  });

  it("match SQL with filters and a search, for the owner and household sorts too", async () => {
    const cases: { input: Record<string, string>; where: string; params: unknown[] }[] = [
      { input: { stage: "lead" }, where: "AND d.stage = 'lead'", params: [] },
      { input: { owner: reps[1].userId }, where: "AND d.owner_user_id = ?", params: [reps[1].userId] },
      { input: { source: "Website", from: "2025-02-01", to: "2025-02-28" }, where: "AND d.source = 'Website' AND d.created_at >= '2025-02-01 05:00:00' AND d.created_at < '2025-03-01 05:00:00'", params: [] },
      {
        input: { q: "Ridge" },
        where: "AND (h.name LIKE '%Ridge%' OR h.contact_name LIKE '%Ridge%' OR h.street LIKE '%Ridge%' OR h.city LIKE '%Ridge%')",
        params: [],
      },
    ];
    for (const c of cases) {
      for (const sort of ["owner:asc", "owner:desc", "household:asc", "city:desc", "contractCents:asc"]) {
        const got = await dealTablePage(office, dealTableQuerySchema.parse({ ...c.input, sort, page: "2", pageSize: "25" }));
        expect(got.rows.map((r) => r.id), `${JSON.stringify(c.input)} ${sort}`).toEqual(await sqlIds(c.where, c.params, sort, 25, 25));
        const [[{ n }]] = await pool().query<RowDataPacket[]>(
          `SELECT COUNT(*) AS n FROM deal d JOIN household h ON h.id = d.household_id AND h.company_id = d.company_id WHERE d.company_id = ? ${c.where}`,
          [owner.companyId, ...c.params],
        );
        expect(got.total).toBe(Number(n));
      }
    }
  });

  it("finds nothing for a search no household matches, and a search's few households by their ids", async () => {
    const none = await dealTablePage(office, dealTableQuerySchema.parse({ q: "Nowhere-at-all" }));
    expect(none).toMatchObject({ total: 0, totalCapped: false, hasNextPage: false, rows: [] });
    const one = await dealTablePage(office, dealTableQuerySchema.parse({ q: "Contact 1234", sort: "household:asc" }));
    expect(one.rows.map((r) => r.id)).toEqual(await sqlIds("AND h.contact_name LIKE '%Contact 1234%'", [], "household:asc", 50, 0));
    expect(one.total).toBe(1);
  });

  it("counts up to the limit and then says there are more, while paging on", async () => {
    const capped = await dealTablePage(office, dealTableQuerySchema.parse({ page: "3", pageSize: "50" }), 1_000);
    expect(capped).toMatchObject({ total: 1_000, totalCapped: true, hasNextPage: true });
    expect(capped.rows).toHaveLength(50);
    const exact = await dealTablePage(office, dealTableQuerySchema.parse({ stage: "lead", pageSize: "200" }), 1_000);
    expect(exact.totalCapped).toBe(false);
    const [[{ n }]] = await pool().query<RowDataPacket[]>("SELECT COUNT(*) AS n FROM deal WHERE company_id = ? AND stage = 'lead'", [owner.companyId]);
    expect(exact.total).toBe(Number(n));
    expect(exact.hasNextPage).toBe(Number(n) > 200);
    // Exactly at the limit is still exact.
    expect(await dealTablePage(office, dealTableQuerySchema.parse({}), TOTAL)).toMatchObject({ total: TOTAL, totalCapped: false });
    const last = await dealTablePage(office, dealTableQuerySchema.parse({ page: String(TOTAL / 200), pageSize: "200" }), 1_000);
    expect(last).toMatchObject({ hasNextPage: false, totalCapped: true });
    expect(last.rows).toHaveLength(200);
  });

  it("walks every page of the owner sort once, deals without an owner first", async () => {
    const seen: string[] = [];
    for (let page = 1; page <= TOTAL / 200; page++) {
      const got = await dealTablePage(office, dealTableQuerySchema.parse({ sort: "owner:asc", page: String(page), pageSize: "200" }));
      seen.push(...got.rows.map((r) => r.id));
      if (page === 1) expect(got.rows[0].ownerName).toBeNull();
    }
    expect(new Set(seen).size).toBe(TOTAL);
  });

  it("shows a rep their own deals in the owner sort, and exports the view in the same order", async () => {
    const mine = await dealTablePage(reps[0], dealTableQuerySchema.parse({ sort: "owner:desc", pageSize: "200" }));
    expect(mine.rows.length).toBeGreaterThan(0);
    expect(mine.rows.every((r) => r.ownerUserId === reps[0].userId)).toBe(true);
    const exported: string[] = [];
    for await (const chunk of dealTableChunks(office, dealTableFiltersSchema.parse({ sort: "household:desc", stage: "survey" }), 37)) exported.push(...chunk.map((r) => r.id));
    expect(exported).toEqual(await sqlIds("AND d.stage = 'survey'", [], "household:desc", TOTAL, 0));
    expect((await dealTablePage(stranger, dealTableQuerySchema.parse({ sort: "owner:asc" }))).total).toBe(1);
  });
});
