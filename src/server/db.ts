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
