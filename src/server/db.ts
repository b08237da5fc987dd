import "server-only";
import { drizzle, type MySql2Database } from "drizzle-orm/mysql2";
import mysql from "mysql2/promise";
import { env } from "@/env";
import { schema } from "@/db/schema";

export type Db = MySql2Database<typeof schema>;

// One pool per process. The app keeps no other state in memory than caches keyed by a
// revision read from the database (the deals table's pages): after a database restart the
// pool simply opens new connections on the next query, and any process may serve any request.
const globalForDb = globalThis as unknown as { kilowrightPool?: mysql.Pool; kilowrightDb?: Db };

export function pool(): mysql.Pool {
  globalForDb.kilowrightPool ??= mysql.createPool({
    uri: env().DATABASE_URL,
    connectionLimit: 10,
    connectTimeout: 2_000,
    timezone: "Z",
    dateStrings: false,
    enableKeepAlive: true,
  });
  return globalForDb.kilowrightPool;
}

export function db(): Db {
  globalForDb.kilowrightDb ??= drizzle(pool(), { schema, mode: "default" });
  return globalForDb.kilowrightDb;
}

export type Tx = Parameters<Parameters<Db["transaction"]>[0]>[0];

/**
 * MariaDB error numbers after which the whole transaction may simply run again:
 * 1213 ER_LOCK_DEADLOCK — a deadlock, and also how a Galera cluster reports a certification
 * conflict at COMMIT (another node committed a write to the same rows first; row locks are not
 * cluster-wide); 1047 ER_UNKNOWN_COM_ERROR — "WSREP has not yet prepared node for application
 * use": the node left the cluster's primary component, a new connection reaches another.
 */
const RETRYABLE_ERRNOS = new Set([1213, 1047]);
/**
 * 1180 ER_ERROR_DURING_COMMIT is retried only when Galera wrote it ("provider status: …", e.g.
 * "Not connected to Primary Component" right after the node lost the cluster): a write set
 * that could not be replicated is rolled back, never committed on that node alone. Any other
 * 1180 (the storage engine's) is left to the caller.
 */
const GALERA_COMMIT_ERRNO = 1180;

function retryable(err: unknown): boolean {
  const errno = mariaDbErrno(err);
  if (errno !== null && RETRYABLE_ERRNOS.has(errno)) return true;
  return errno === GALERA_COMMIT_ERRNO && /provider status/i.test(mariaDbMessage(err));
}

/** The MariaDB error text under Drizzle's wrapper. */
function mariaDbMessage(err: unknown): string {
  for (let e: unknown = err, depth = 0; e && depth < 5; e = (e as { cause?: unknown }).cause, depth++) {
    const message = (e as { sqlMessage?: unknown }).sqlMessage;
    if (typeof message === "string") return message;
  }
  return "";
}

/** The MariaDB error number under Drizzle's wrapper (DrizzleQueryError keeps it in `cause`). */
export function mariaDbErrno(err: unknown): number | null {
  for (let e: unknown = err, depth = 0; e && depth < 5; e = (e as { cause?: unknown }).cause, depth++) {
    const errno = (e as { errno?: unknown }).errno;
    if (typeof errno === "number") return errno;
  }
  return null;
}

export const TRANSACTION_ATTEMPTS = 4;

/**
 * Runs `work` in one transaction, and runs it again (up to TRANSACTION_ATTEMPTS times in all,
 * after a short random pause) when the database answers with a deadlock, a cluster
 * certification conflict or a write set Galera could not replicate — each rolls the whole
 * transaction back, so nothing of the failed
 * attempt is kept. `work` must therefore be safe to run twice: it reads what it needs inside
 * the transaction, and any call outside the database is a read or carries an idempotency key.
 */
export async function transaction<T>(work: (tx: Tx) => Promise<T>): Promise<T> {
  for (let attempt = 1; ; attempt++) {
    try {
      return await db().transaction(work);
    } catch (err) {
      if (attempt >= TRANSACTION_ATTEMPTS || !retryable(err)) throw err;
      // 10–40 ms, doubling: long enough for the winner to commit, short for a person waiting.
      await new Promise((r) => setTimeout(r, (5 + Math.random() * 15) * 2 ** attempt));
    }
  }
}
