// A deal page render (layout, tab page and their loaders) reads the deal row once: the deal
// scope (src/server/deal-scope.ts) is opened once per request. Counted through the real stack
// with MariaDB's general query log, switched on by the database administrator (root over the
// instance's socket), never by the app.
import { spawnSync } from "node:child_process";
import { expect, test } from "@playwright/test";
import { instance } from "../../scripts/lib/instance";
import { mariaDbPaths } from "../../scripts/lib/mariadb";
import { apiSignIn, withDb } from "./support";

const inst = instance("test");

function asRoot(statement: string): string {
  const r = spawnSync("mariadb", [`--defaults-file=${mariaDbPaths(inst.db).cnf}`, "-N", "-B", "-e", statement], { encoding: "utf8" });
  if (r.status !== 0) throw new Error(`mariadb: ${r.stderr}`);
  return r.stdout;
}

/** Statements that read the `deal` table (FROM or JOIN) and name this deal's id. */
const readsOfDeal = (log: string, dealId: string) => log.split("\n").filter((line) => line.includes(dealId) && /\b(from|join)\s+`deal`(\s|$)/i.test(line));

test("one GET of a deal's Energy tab selects the deal row once", async ({ request }) => {
  await apiSignIn(request, "rep@tallgrass.example");
  const [dealId] = await withDb(async (conn) => {
    const [rows] = await conn.query(
      "SELECT d.id FROM deal d JOIN household h ON h.id = d.household_id JOIN `user` u ON u.id = d.owner_user_id WHERE h.name = 'Abernathy household' AND u.email = 'rep@tallgrass.example'",
    );
    return (rows as { id: string }[]).map((r) => r.id);
  });
  expect(dealId, "the demo's Abernathy deal, owned by rep@").toBeTruthy();

  asRoot("SET GLOBAL log_output = 'TABLE'; TRUNCATE mysql.general_log; SET GLOBAL general_log = 'ON';");
  let log: string;
  try {
    const res = await request.get(`/deals/${dealId}/energy`);
    expect(res.status()).toBe(200);
    expect(await res.text()).toContain("Abernathy household");
  } finally {
    asRoot("SET GLOBAL general_log = 'OFF';");
    log = asRoot("SELECT REPLACE(CONVERT(argument USING utf8mb4), '\\n', ' ') FROM mysql.general_log WHERE command_type IN ('Query', 'Execute'); TRUNCATE mysql.general_log;");
  }
  const reads = readsOfDeal(log, dealId);
  expect(reads.length, `statements reading the deal row:\n${reads.join("\n")}`).toBe(1);
});
