import "server-only";
import journal from "../../drizzle/meta/_journal.json";
import pkg from "../../package.json";
import { pool } from "@/server/db";

export type Health = {
  status: "ok" | "degraded";
  version: string;
  /** Reachable or not; never the host, port or the driver's error text (they help an attacker, not the load balancer). */
  database: { reachable: boolean; latencyMs: number | null };
  migrations: { expected: number; applied: number | null; latest: string; upToDate: boolean };
};

const VERSION = pkg.version;
const DB_TIMEOUT_MS = 2_000;

/** App version, database reachability and whether every committed migration is applied. */
export async function checkHealth(): Promise<Health> {
  const entries = journal.entries;
  const latest = entries.at(-1);
  const expected = entries.length;
  const started = performance.now();
  try {
    const [rows] = await pool().query({
      sql: "SELECT COUNT(*) AS n, MAX(created_at) AS last FROM __drizzle_migrations",
      timeout: DB_TIMEOUT_MS,
    });
    const row = (rows as { n: number; last: string | number | null }[])[0];
    const applied = Number(row?.n ?? 0);
    const lastApplied = row?.last == null ? null : Number(row.last);
    const upToDate = applied >= expected && (latest === undefined || lastApplied === latest.when);
    return {
      status: upToDate ? "ok" : "degraded",
      version: VERSION,
      database: { reachable: true, latencyMs: Math.round(performance.now() - started) },
      migrations: { expected, applied, latest: latest?.tag ?? "", upToDate },
    };
  } catch (err) {
    // The details go to the log, which only operators read.
    console.error("health: the database did not answer", err);
    return {
      status: "degraded",
      version: VERSION,
      database: { reachable: false, latencyMs: null },
      migrations: { expected, applied: null, latest: latest?.tag ?? "", upToDate: false },
    };
  }
}
