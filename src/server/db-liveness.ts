import "server-only";
// Is MariaDB reachable right now? Asked by src/proxy.ts before every page and API request, so
// the answer is cached: at most one `SELECT 1` per second per process (our choice), on its own
// one-connection pool with short timeouts, shared by every request that arrives meanwhile.
import mysql from "mysql2/promise";
import { env } from "@/env";

const PROBE_EVERY_MS = 1_000;
const PROBE_TIMEOUT_MS = 1_000;

type State = { pool?: mysql.Pool; up: boolean | null; checkedAt: number; inflight: Promise<boolean> | null };
// On globalThis so the proxy's bundle and a reload share one pool and one answer per process.
const g = globalThis as unknown as { kilowrightLiveness?: State };
const state: State = (g.kilowrightLiveness ??= { up: null, checkedAt: 0, inflight: null });

function probePool(): mysql.Pool {
  state.pool ??= mysql.createPool({ uri: env().DATABASE_URL, connectionLimit: 1, maxIdle: 1, connectTimeout: PROBE_TIMEOUT_MS, enableKeepAlive: true });
  return state.pool;
}

async function probe(): Promise<boolean> {
  try {
    await probePool().query({ sql: "SELECT 1", timeout: PROBE_TIMEOUT_MS });
    return true;
  } catch {
    return false;
  }
}

/** True when the database answered within the last second (or answers now). Never throws. */
export async function databaseIsUp(now = Date.now()): Promise<boolean> {
  if (state.up !== null && now - state.checkedAt < PROBE_EVERY_MS) return state.up;
  if (state.inflight) return state.up ?? state.inflight;
  state.checkedAt = now;
  state.inflight = probe().then((up) => {
    state.up = up;
    state.checkedAt = Date.now();
    state.inflight = null;
    return up;
  });
  return state.inflight;
}
