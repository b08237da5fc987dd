import "server-only";
// Is MariaDB reachable right now? Asked by src/proxy.ts before every page request and by the
// sign-in route, so the answer is cached: at most one `SELECT 1` per second per process (our
// choice), on one connection of its own, shared by every request that arrives meanwhile. Any
// failure or a hang past the timeout drops that connection, and the next probe opens a new one
// (a connection from before a database restart is dead even when the database is back).
import mysql from "mysql2/promise";
import { env } from "@/env";

const PROBE_EVERY_MS = 1_000;
const PROBE_TIMEOUT_MS = 1_000;

type State = { conn: mysql.Connection | null; up: boolean | null; checkedAt: number; inflight: Promise<boolean> | null };
// On globalThis so every bundle of this process shares one connection and one answer.
const g = globalThis as unknown as { kilowrightLiveness?: State };
const state: State = (g.kilowrightLiveness ??= { conn: null, up: null, checkedAt: 0, inflight: null });

async function selectOne(): Promise<void> {
  if (!state.conn) {
    const conn = await mysql.createConnection({ uri: env().DATABASE_URL, connectTimeout: PROBE_TIMEOUT_MS });
    // A connection lost while idle (the server stopped) reports it here; without a listener it would crash the process.
    conn.on("error", () => {
      if (state.conn === conn) state.conn = null;
    });
    state.conn = conn;
  }
  await state.conn.query({ sql: "SELECT 1", timeout: PROBE_TIMEOUT_MS });
}

/**
 * A connection kept from an earlier probe may have died with its database node (killed, or cut
 * by the balancer): that says nothing about the database behind the balancer now, so one more
 * try on a new connection decides. A probe that had to connect is not repeated.
 */
async function probe(): Promise<boolean> {
  const reused = state.conn !== null;
  return (await probeOnce()) || (reused && (await probeOnce()));
}

async function probeOnce(): Promise<boolean> {
  let timer: NodeJS.Timeout | undefined;
  const deadline = new Promise<never>((_, reject) => {
    timer = setTimeout(() => reject(new Error("probe timed out")), PROBE_TIMEOUT_MS + 200);
  });
  try {
    await Promise.race([selectOne(), deadline]);
    return true;
  } catch {
    const dead = state.conn;
    state.conn = null;
    dead?.destroy();
    return false;
  } finally {
    clearTimeout(timer);
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
