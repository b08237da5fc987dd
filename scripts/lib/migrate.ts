// Applies the committed migrations in drizzle/ (drizzle-orm's migrator; idempotent).
import path from "node:path";
import { drizzle } from "drizzle-orm/mysql2";
import { migrate } from "drizzle-orm/mysql2/migrator";
import mysql from "mysql2/promise";
import { projectRoot } from "./instance";

export async function applyMigrations(databaseUrl: string): Promise<void> {
  const connection = await mysql.createConnection({ uri: databaseUrl, multipleStatements: true });
  try {
    await migrate(drizzle(connection), { migrationsFolder: path.join(projectRoot, "drizzle") });
  } finally {
    await connection.end();
  }
}
