// JSON columns carry their zod schema (src/db/json-column.ts): a stored value that is not JSON or
// does not match is refused on read with an error naming the table and the column, a value
// that does not match is refused on write, and a column whose schema forgives old rows reads
// them with its defaults.
import { eq, sql } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { priceBook, ratePlan } from "@/db/schema";
import { JsonColumnError } from "@/db/json-column";
import { emptyPriceBook, type PriceBook } from "@/lib/schemas/price-book";
import { db } from "@/server/db";
import { getPriceBook } from "@/server/price-book";
import { getRatePlanOrThrow } from "@/server/rate-plans";
import { newCompany, newUtility } from "../support/fixtures";

async function failure(promise: Promise<unknown>): Promise<JsonColumnError> {
  const err = await promise.then(
    () => null,
    (e: unknown) => e,
  );
  expect(err).toBeInstanceOf(JsonColumnError);
  return err as JsonColumnError;
}

describe("JSON columns validated by their schema", () => {
  it("refuses a stored price book that does not match, naming table, column and field", async () => {
    const owner = await newCompany("Bent Book Solar");
    const bad = { ...emptyPriceBook(), bands: [{ minWatts: 0, maxWatts: null, centsPerWattDc: "cheap" }] };
    await db().insert(priceBook).values({ id: crypto.randomUUID(), companyId: owner.companyId, document: sql`${JSON.stringify(bad)}` });
    const err = await failure(getPriceBook(owner.companyId));
    expect(err.message).toMatch(/^price_book\.document: the stored JSON does not match its schema \(bands\.0\.centsPerWattDc: /);
    expect([err.table, err.column, err.direction]).toEqual(["price_book", "document", "read"]);
  });

  it("refuses a stored rate plan that is valid JSON of the wrong shape", async () => {
    const owner = await newCompany("Flat Plan Solar");
    const id = crypto.randomUUID();
    await db().insert(ratePlan).values({ id, companyId: owner.companyId, name: "Old", utilityId: await newUtility(owner), plan: sql`'[1,2,3]'` });
    const err = await failure(getRatePlanOrThrow(owner.companyId, id));
    expect(err.message).toMatch(/^rate_plan\.plan: the stored JSON does not match its schema/);
  });

  it("refuses to write a value that does not match, before it reaches the database", async () => {
    const owner = await newCompany("Careless Writer Solar");
    const bad = { ...emptyPriceBook(), version: 7 } as unknown as PriceBook;
    // drizzle maps the values while building the query: the error comes before any SQL is sent.
    const err = await failure((async () => db().insert(priceBook).values({ id: crypto.randomUUID(), companyId: owner.companyId, document: bad }))());
    expect(err.message).toMatch(/^price_book\.document: the JSON to store does not match its schema \(version: /);
    expect(await db().select().from(priceBook).where(eq(priceBook.companyId, owner.companyId))).toEqual([]);
  });

  it("reads a good value back as the schema's output, without parsing at the call site", async () => {
    const owner = await newCompany("Good Book Solar");
    await db().insert(priceBook).values({ id: crypto.randomUUID(), companyId: owner.companyId, document: emptyPriceBook() });
    const [row] = await db().select({ document: priceBook.document }).from(priceBook).where(eq(priceBook.companyId, owner.companyId));
    expect(row.document).toEqual(emptyPriceBook());
  });
});
