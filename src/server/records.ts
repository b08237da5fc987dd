import "server-only";
import { and, eq } from "drizzle-orm";
import type { MySqlColumn, MySqlTable } from "drizzle-orm/mysql-core";
import { household } from "@/db/schema";
import { db } from "@/server/db";
import { HttpError, notFound } from "@/server/errors";

/** A company-owned table: every row has its id and its company. */
type CompanyTable = MySqlTable & { id: MySqlColumn; companyId: MySqlColumn };

/**
 * One whole row of a company-owned table by id, in the company's scope: another company's row
 * (or no row) is simply not found, named `what` ("Crew", "Refund"…).
 */
export async function companyRowOrThrow<T extends CompanyTable>(table: T, companyId: string, id: string, what: string): Promise<T["$inferSelect"]> {
  const [row] = await db()
    .select()
    .from(table as MySqlTable)
    .where(and(eq(table.id, id), eq(table.companyId, companyId)))
    .limit(1);
  if (!row) throw notFound(what);
  return row as T["$inferSelect"];
}

/**
 * Checks a record's parent (its deal, its job) with the parent's own rule, and answers a hidden
 * parent as the record itself not found: a rep asking for a payment of someone else's deal
 * learns nothing about the deal.
 */
export async function hiddenWithParent(parentCheck: Promise<unknown>, what: string): Promise<void> {
  await parentCheck.catch((err: unknown) => {
    throw err instanceof HttpError && err.status === 404 ? notFound(what) : err;
  });
}

/** The household's address and position, as the deal room, the job packet and the crews' calendar read it. */
export const householdAddress = {
  street: household.street,
  city: household.city,
  region: household.region,
  postalCode: household.postalCode,
  latitude: household.latitude,
  longitude: household.longitude,
};
