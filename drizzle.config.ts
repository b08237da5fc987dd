// drizzle-kit reads the schema from one place and writes SQL migrations into drizzle/
// (committed). The app applies them at start with drizzle-orm's migrator (scripts/lib/migrate.ts).
import { defineConfig } from "drizzle-kit";

export default defineConfig({
  dialect: "mysql",
  schema: "./src/db/schema.ts",
  out: "./drizzle",
  dbCredentials: { url: process.env.DATABASE_URL ?? "mysql://unused@127.0.0.1/unused" },
});
