// JSON columns that carry their zod schema: every value is checked once on its way into the
// database and once on its way out, so code reading a row gets the schema's type and never
// parses it again. MariaDB keeps JSON as LONGTEXT (with a JSON_VALID check), so the driver
// hands back text; MySQL would hand back a parsed value: both are accepted.
import { customType } from "drizzle-orm/mysql-core";
import type { z } from "zod";

/** A stored JSON value that is not JSON or does not match its column's schema. */
export class JsonColumnError extends Error {
  constructor(
    readonly table: string,
    readonly column: string,
    readonly direction: "read" | "write",
    detail: string,
  ) {
    super(`${table}.${column}: ${direction === "read" ? "the stored JSON" : "the JSON to store"} ${detail}`);
    this.name = "JsonColumnError";
  }
}

/** "offers.0.price: Expected number, received string; …" (at most three issues). */
function describe(error: z.ZodError): string {
  const issues = error.issues.slice(0, 3).map((i) => `${i.path.length > 0 ? i.path.join(".") : "(value)"}: ${i.message}`);
  return `does not match its schema (${issues.join("; ")}${error.issues.length > 3 ? "; …" : ""})`;
}

/**
 * A `json` column of `table` validated by `schema` both ways. The SQL type stays `json`, so
 * switching a column to it needs no migration. The schema must accept its own output (what is
 * written is read back through it), and a schema that should forgive old rows says so itself
 * (`.catch(...)`).
 */
export function jsonColumn<S extends z.ZodType>(table: string, column: string, schema: S) {
  return customType<{ data: z.output<S>; driverData: string }>({
    dataType: () => "json",
    toDriver(value) {
      const parsed = schema.safeParse(value);
      if (!parsed.success) throw new JsonColumnError(table, column, "write", describe(parsed.error));
      return JSON.stringify(parsed.data);
    },
    fromDriver(raw) {
      let value: unknown = raw;
      if (typeof raw === "string") {
        try {
          value = JSON.parse(raw);
        } catch {
          throw new JsonColumnError(table, column, "read", "is not JSON");
        }
      }
      const parsed = schema.safeParse(value);
      if (!parsed.success) throw new JsonColumnError(table, column, "read", describe(parsed.error));
      return parsed.data;
    },
  })(column);
}
