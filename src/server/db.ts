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
  globalForDb.kilowrightDb ??= drizzle(readsRetried(pool()), { schema, mode: "default" });
  return globalForDb.kilowrightDb;
}

/** A statement that only reads: running it twice changes nothing (our queries call no GET_LOCK or sequences). */
function isRead(query: unknown): boolean {
  const text = typeof query === "string" ? query : (query as { sql?: unknown } | null)?.sql;
  return typeof text === "string" && /^\s*\(?\s*(select|with|show)\b/i.test(text);
}

/**
 * The pool Drizzle uses outside transactions: a read whose connection was lost (its database
 * node was killed, or HAProxy cut it when marking the node down) runs once more on another
 * connection, which reaches the next node. Writes are never re-sent here: one that reached the
 * server may have been committed before the connection dropped. Transactions take their own
 * connection (`getConnection`) and are retried by `transaction()` below.
 */
function readsRetried(p: mysql.Pool): mysql.Pool {
  return new Proxy(p, {
    get(target, prop) {
      const value = Reflect.get(target, prop, target) as unknown;
      if (typeof value !== "function") return value;
      if (prop !== "query" && prop !== "execute") return value.bind(target);
      return async (...args: unknown[]) => {
        try {
          return await value.apply(target, args);
        } catch (err) {
          if (!isRead(args[0]) || !connectionLost(err)) throw err;
          return await value.apply(target, args);
        }
      };
    },
  });
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

/**
 * The connection itself was lost, not the statement refused: mysql2's codes for a dropped
 * socket, MariaDB's 1927 ER_CONNECTION_KILLED, the client's 2006/2013 ("server has gone away",
 * "Lost connection…"), and mysql2's refusal to use a connection already closed. A transaction
 * open on it was rolled back by the server, which ends any transaction whose connection dies.
 */
const LOST_CODES = new Set(["PROTOCOL_CONNECTION_LOST", "ECONNRESET", "EPIPE", "ECONNREFUSED", "ER_CONNECTION_KILLED"]);
const LOST_ERRNOS = new Set([1927, 2006, 2013]);

export function connectionLost(err: unknown): boolean {
  for (let e: unknown = err, depth = 0; e && depth < 5; e = (e as { cause?: unknown }).cause, depth++) {
    const { code, errno, message } = e as { code?: unknown; errno?: unknown; message?: unknown };
    if (typeof code === "string" && LOST_CODES.has(code)) return true;
    if (typeof errno === "number" && LOST_ERRNOS.has(errno)) return true;
    if (typeof message === "string" && message.includes("connection is in closed state")) return true;
  }
  return false;
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
 * transaction back, so nothing of the failed attempt is kept.
 * A lost connection is retried once, and only when it was lost before COMMIT was sent (while
 * opening the transaction or running `work`): the server rolled that transaction back. A
 * connection lost during COMMIT is not retried: the commit may have landed before the answer
 * was lost, and only some writes have a unique key that would refuse a second copy — the
 * caller answers an error and the person (or Stripe's webhook retry) asks again.
 * `work` must therefore be safe to run twice: it reads what it needs inside the transaction,
 * and any call outside the database is a read or carries an idempotency key.
 */
export async function transaction<T>(work: (tx: Tx) => Promise<T>): Promise<T> {
  let lostRetried = false;
  for (let attempt = 1; ; attempt++) {
    let committing = false;
    try {
      return await db().transaction(async (tx) => {
        const result = await work(tx);
        committing = true;
        return result;
      });
    } catch (err) {
      const lostBeforeCommit = !committing && !lostRetried && connectionLost(err);
      if (attempt >= TRANSACTION_ATTEMPTS || !(retryable(err) || lostBeforeCommit)) throw err;
      if (lostBeforeCommit) lostRetried = true;
      // 10–40 ms, doubling: long enough for the winner to commit, short for a person waiting.
      await new Promise((r) => setTimeout(r, (5 + Math.random() * 15) * 2 ** attempt));
    }
  }
}
