import Papa from "papaparse";
import type { RowDataPacket } from "mysql2";
import { beforeAll, describe, expect, it } from "vitest";
import { deal, household, STAGES } from "@/db/schema";
import { dealTableFiltersSchema, dealTableQuerySchema } from "@/lib/schemas/deal-table";
import { db, pool } from "@/server/db";
import { CSV_HEADER, csvLines, dealTableCsvStream, dealTablePage } from "@/server/deal-table";
import type { Member } from "@/server/session";
import { addMember, newCompany } from "../support/fixtures";

const TOTAL = 10_000;
const SOURCES = ["Referral", "Website", "Door to door", "Home show", "Phone"];
const CITIES = ["Greensboro", "Durham", "Raleigh", "Asheville", "Wilmington", "Boone"];

let owner: Member;
let office: Member;
let repA: Member;
let repB: Member;
let stranger: Member;

/** A small deterministic generator so every run seeds the same spread of values. */
function rng(seed: number) {
  let s = seed >>> 0;
  return () => {
    s = (s * 1664525 + 1013904223) >>> 0;
    return s / 2 ** 32;
  };
}

async function seedDeals() {
  const rand = rng(42);
  const owners = [repA.userId, repB.userId, office.userId, null];
  const base = Date.UTC(2025, 0, 1);
  await db().transaction(async (tx) => {
    for (let start = 0; start < TOTAL; start += 1_000) {
      const homes: (typeof household.$inferInsert)[] = [];
      const deals: (typeof deal.$inferInsert)[] = [];
      for (let i = start; i < Math.min(TOTAL, start + 1_000); i++) {
        const hid = crypto.randomUUID();
        const name = i % 997 === 0 ? `=Formula ${i} household` : `Bulk ${String(i).padStart(5, "0")} household`;
        homes.push({
          id: hid,
          companyId: owner.companyId,
          name,
          contactName: `Contact ${i}`,
          street: `${i} Pine Row`,
          city: CITIES[Math.floor(rand() * CITIES.length)],
          region: "NC",
          postalCode: "27401",
          latitude: 36,
          longitude: -79.8,
        });
        const created = new Date(base + Math.floor(rand() * 365) * 86_400_000 + Math.floor(rand() * 86_400_000));
        deals.push({
          id: crypto.randomUUID(),
          companyId: owner.companyId,
          householdId: hid,
          ownerUserId: owners[Math.floor(rand() * owners.length)],
          stage: STAGES[Math.floor(rand() * STAGES.length)],
          // Coarse values so that ties are common and the id tiebreaker matters.
          contractCents: rand() < 0.1 ? null : Math.floor(rand() * 200) * 10_000,
          systemDcWatts: rand() < 0.1 ? null : 3_000 + Math.floor(rand() * 100) * 100,
          source: rand() < 0.05 ? null : SOURCES[Math.floor(rand() * SOURCES.length)],
          createdAt: created,
          stageChangedAt: new Date(created.getTime() + Math.floor(rand() * 30) * 86_400_000),
        });
      }
      await tx.insert(household).values(homes);
      await tx.insert(deal).values(deals);
    }
  });
}

async function sqlRows<T>(sql: string, params: unknown[]): Promise<T[]> {
  const [rows] = await pool().query<RowDataPacket[]>(sql, params);
  return rows as T[];
}

async function sqlCount(where: string, params: unknown[]): Promise<number> {
  const [row] = await sqlRows<{ n: number }>(
    `SELECT COUNT(*) AS n FROM deal d JOIN household h ON h.id = d.household_id AND h.company_id = d.company_id WHERE ${where}`,
    params,
  );
  return Number(row.n);
}

const query = (input: Record<string, string>) => dealTableQuerySchema.parse(input);
const filters = (input: Record<string, string>) => dealTableFiltersSchema.parse(input);

async function csvText(member: Member, input: Record<string, string>): Promise<string> {
  return new Response(dealTableCsvStream(member, filters(input), "America/New_York")).text();
}

beforeAll(async () => {
  owner = await newCompany("Bulk Table Solar");
  office = await addMember(owner, "office_manager", "Oona Office");
  repA = await addMember(owner, "sales_rep", "Reba Rep");
  repB = await addMember(owner, "sales_rep", "Rory Rep");
  stranger = await newCompany("Other Solar Co");
  const t0 = Date.now();
  await seedDeals();
  console.log(`seeded ${TOTAL} deals in ${Date.now() - t0} ms`);
}, 120_000);

describe("deals table over 10,000 deals", () => {
  it("totals the company's deals and pages them 50 at a time", async () => {
    const page = await dealTablePage(office, query({}));
    expect(page.total).toBe(TOTAL);
    expect(page.total).toBe(await sqlCount("d.company_id = ?", [owner.companyId]));
    expect(page.rows).toHaveLength(50);
    expect(page.page).toBe(1);
    expect(page.pageSize).toBe(50);
    const last = await dealTablePage(office, query({ page: String(TOTAL / 200), pageSize: "200" }));
    expect(last.rows).toHaveLength(200);
    const beyond = await dealTablePage(office, query({ page: String(TOTAL / 200 + 1), pageSize: "200" }));
    expect(beyond.rows).toHaveLength(0);
    expect(beyond.total).toBe(TOTAL);
  });

  it("filters by stage with the same count as SQL", async () => {
    const page = await dealTablePage(office, query({ stage: "permitting" }));
    const expected = await sqlCount("d.company_id = ? AND d.stage = 'permitting'", [owner.companyId]);
    expect(expected).toBeGreaterThan(0);
    expect(page.total).toBe(expected);
    expect(page.rows.every((r) => r.stage === "permitting")).toBe(true);
  });

  it("page 3 sorted by contract value (desc) is the same slice as SQL's, ties broken by id", async () => {
    const page = await dealTablePage(office, query({ page: "3", pageSize: "50", sort: "contractCents:desc" }));
    const expected = await sqlRows<{ id: string }>(
      `SELECT d.id FROM deal d JOIN household h ON h.id = d.household_id AND h.company_id = d.company_id
       WHERE d.company_id = ? ORDER BY d.contract_cents DESC, d.id DESC LIMIT 50 OFFSET 100`,
      [owner.companyId],
    );
    expect(page.rows.map((r) => r.id)).toEqual(expected.map((r) => r.id));
  });

  it("pages never overlap: walking every page of a sort with ties visits each deal once", async () => {
    const seen = new Set<string>();
    for (let p = 1; p <= TOTAL / 200; p++) {
      const page = await dealTablePage(office, query({ page: String(p), pageSize: "200", sort: "source:asc" }));
      for (const r of page.rows) seen.add(r.id);
    }
    expect(seen.size).toBe(TOTAL);
  });

  it("combines source, created dates (the company's days: New York's) and search like SQL does", async () => {
    const input = { source: "Website", from: "2025-03-01", to: "2025-06-30", q: "Pine", sort: "household:asc" };
    const page = await dealTablePage(office, query({ ...input, pageSize: "200" }));
    const expected = await sqlCount(
      "d.company_id = ? AND d.source = 'Website' AND d.created_at >= '2025-03-01 05:00:00' AND d.created_at < '2025-07-01 04:00:00' AND (h.name LIKE '%Pine%' OR h.contact_name LIKE '%Pine%' OR h.street LIKE '%Pine%' OR h.city LIKE '%Pine%')",
      [owner.companyId],
    );
    expect(expected).toBeGreaterThan(0);
    expect(page.total).toBe(expected);
    const names = page.rows.map((r) => r.householdName);
    expect(names).toEqual([...names].sort((a, b) => (a < b ? -1 : a > b ? 1 : 0)));
  });

  it("a rep sees only their own deals, even when asking for someone else's", async () => {
    const mine = await dealTablePage(repA, query({ pageSize: "200" }));
    expect(mine.total).toBe(await sqlCount("d.company_id = ? AND d.owner_user_id = ?", [owner.companyId, repA.userId]));
    expect(mine.rows.every((r) => r.ownerUserId === repA.userId)).toBe(true);
    const theirs = await dealTablePage(repA, query({ owner: repB.userId }));
    expect(theirs.total).toBe(0);
    expect(theirs.rows).toHaveLength(0);
  });

  it("another company sees none of these deals", async () => {
    const page = await dealTablePage(stranger, query({ pageSize: "200" }));
    expect(page.total).toBe(0);
    expect(page.rows).toHaveLength(0);
    const csv = await csvText(stranger, {});
    expect(csv.trim().split("\r\n")).toHaveLength(1);
  });

  it("the CSV export has our header and one row per deal of the filtered view", async () => {
    const text = await csvText(office, { stage: "permitting", sort: "contractCents:desc" });
    const parsed = Papa.parse<string[]>(text.trimEnd(), { skipEmptyLines: true });
    expect(parsed.errors).toEqual([]);
    const [header, ...rows] = parsed.data;
    expect(header).toEqual(CSV_HEADER);
    expect(rows).toHaveLength(await sqlCount("d.company_id = ? AND d.stage = 'permitting'", [owner.companyId]));
    expect(rows.every((r) => r[2] === "Permitting")).toBe(true);
    const all = Papa.parse<string[]>((await csvText(office, {})).trimEnd(), { skipEmptyLines: true });
    expect(all.data).toHaveLength(TOTAL + 1);
    // Names that would run as formulas are kept as text.
    const formula = all.data.filter((r) => r[0].includes("Formula"));
    expect(formula.length).toBeGreaterThan(0);
    expect(formula.every((r) => r[0].startsWith("'="))).toBe(true);
    const repCsv = Papa.parse<string[]>((await csvText(repB, {})).trimEnd(), { skipEmptyLines: true });
    expect(repCsv.data.length - 1).toBe(await sqlCount("d.company_id = ? AND d.owner_user_id = ?", [owner.companyId, repB.userId]));
  });

  it("rejects page sizes over 200 and unknown sort columns", () => {
    expect(dealTableQuerySchema.safeParse({ pageSize: "201" }).success).toBe(false);
    expect(dealTableQuerySchema.safeParse({ sort: "companyId:asc" }).success).toBe(false);
    expect(dealTableQuerySchema.safeParse({ sort: "contractCents:sideways" }).success).toBe(false);
    expect(dealTableQuerySchema.safeParse({ from: "2025-02-30" }).success).toBe(false);
    expect(dealTableQuerySchema.safeParse({ from: "2025-05-01", to: "2025-04-01" }).success).toBe(false);
    expect(dealTableQuerySchema.parse({ stage: "", owner: "" })).toMatchObject({ page: 1, pageSize: 50, sort: "stageChangedAt:desc" });
  });

  it("escapes CSV cells", () => {
    const text = csvLines([['Say "hi", ok', "+1 555", "-x", "@home", null, "line\nbreak", "=SUM(A1)"]]);
    expect(text.endsWith("\r\n")).toBe(true);
    expect(text).toContain('"Say ""hi"", ok"');
    const parsed = Papa.parse<string[]>(text.trimEnd());
    expect(parsed.errors).toEqual([]);
    expect(parsed.data).toEqual([['Say "hi", ok', "'+1 555", "'-x", "'@home", "", "line\nbreak", "'=SUM(A1)"]]);
  });
});
