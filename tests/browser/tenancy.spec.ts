import { expect, test } from "@playwright/test";
import { apiSignIn, createCompany, withDb } from "./support";

const DEMO_COMPANY_ID = "7a11a55e-0000-4000-8000-000000000001";

/**
 * How each company-owned table is read by id over HTTP. The convention is
 * GET /api/<table, kebab-case, plural>/<id> (module_model → /api/module-models/:id); the
 * exceptions are listed here. The test walks every table that has a company_id column, so
 * a new table without its read-by-id route, or without demo rows, fails it.
 */
const EXCEPTIONS: Record<string, string> = { membership: "people", utility: "utilities" };
const readById = (table: string, id: string) => `/api/${EXCEPTIONS[table] ?? `${table.replaceAll("_", "-")}s`}/${id}`;

test("company B asking for company A's records by id gets 404, for every table", async ({ playwright, request }) => {
  // Company A (the demo company) needs at least one row in every table: add an invitation.
  await apiSignIn(request, "admin@tallgrass.example");
  const invited = await request.post("/api/people", { data: { email: `tenancy-${Date.now()}@tallgrass.example`, role: "crew" } });
  expect(invited.status()).toBe(201);

  const tables = await withDb(async (conn) => {
    const [rows] = await conn.query(
      // A table keyed by company_id alone (deals_revision) holds one company's own counters, not records to read by id.
      "SELECT table_name AS name FROM information_schema.columns WHERE table_schema = DATABASE() AND column_name = 'company_id' AND column_key <> 'PRI' ORDER BY table_name",
    );
    return (rows as { name: string }[]).map((r) => r.name);
  });
  expect(tables.length).toBeGreaterThanOrEqual(4);

  const other = await createCompany("Riverbend Rooftop Power");
  const companyB = await playwright.request.newContext({ baseURL: process.env.APP_URL });
  await apiSignIn(companyB, other.email, other.password);

  for (const table of tables) {
    const ids = await withDb(async (conn) => {
      const [rows] = await conn.query(`SELECT id FROM \`${table}\` WHERE company_id = ? LIMIT 3`, [DEMO_COMPANY_ID]);
      return (rows as { id: string }[]).map((r) => r.id);
    });
    expect(ids.length, `company A has no ${table} row to test with`).toBeGreaterThan(0);
    for (const id of ids) {
      const url = readById(table, id);
      const own = await request.get(url);
      expect(own.status(), `${url} as company A`).toBe(200);
      const foreign = await companyB.get(url);
      expect(foreign.status(), `${url} as company B`).toBe(404);
      expect((await foreign.json()).error.code).toBe("not_found");
    }
  }
  // Writes are scoped the same way.
  const [membershipId] = await withDb(async (conn) => {
    const [rows] = await conn.query("SELECT id FROM membership WHERE company_id = ? AND role = 'sales_rep' LIMIT 1", [DEMO_COMPANY_ID]);
    return (rows as { id: string }[]).map((r) => r.id);
  });
  const patch = await companyB.patch(`/api/people/${membershipId}`, { data: { status: "deactivated" } });
  expect(patch.status()).toBe(404);

  // Pages of another company's records answer 404 as well (a status, not only a not-found text
  // streamed after a 200).
  for (const [table, path] of [["deal", "/deals/"], ["job", "/jobs/"], ["rate_plan", "/rate-plans/"]] as const) {
    const [id] = await withDb(async (conn) => {
      const [rows] = await conn.query(`SELECT id FROM \`${table}\` WHERE company_id = ? LIMIT 1`, [DEMO_COMPANY_ID]);
      return (rows as { id: string }[]).map((r) => r.id);
    });
    expect((await request.get(`${path}${id}`)).status(), `${path}${id} as company A`).toBe(200);
    expect((await companyB.get(`${path}${id}`)).status(), `${path}${id} as company B`).toBe(404);
  }
  await companyB.dispose();
});
