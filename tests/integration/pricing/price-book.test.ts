import { eq } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { priceBook } from "@/db/schema";
import { priceBookSchema, type PriceBookInput } from "@/lib/schemas/price-book";
import { db } from "@/server/db";
import { HttpError } from "@/server/errors";
import { getPriceBook, getPriceBookOrThrow, getPriceBookRecord, savePriceBook } from "@/server/price-book";
import { addMember, newCompany } from "../support/fixtures";

const DEMO_COMPANY_ID = "7a11a55e-0000-4000-8000-000000000001";

const book: PriceBookInput = {
  version: 1,
  bands: [
    { minWatts: 0, maxWatts: 8_000, centsPerWattDc: 300 },
    { minWatts: 8_000, maxWatts: null, centsPerWattDc: 275.5 },
  ],
  adders: [{ id: "tile-roof", name: "Tile roof", kind: "per_watt", centsPerWattDc: 25 }],
  lineItems: [{ id: "critter-guard", name: "Critter guard", amountCents: 60_000 }],
  discountLimits: { sales_rep: { maxCents: 50_000, maxPct: null }, office_manager: { maxCents: null, maxPct: 5 } },
  incentives: [
    { id: "state-credit", name: "State solar credit", source: "state", amount: { kind: "percent", pct: 10, capCents: 300_000 }, startDate: "2026-01-01", endDate: "2026-12-31", timing: { year: 1 } },
  ],
  deposit: { kind: "fixed", amountCents: 100_000 },
};

async function failure(promise: Promise<unknown>): Promise<HttpError> {
  const err = await promise.then(
    () => null,
    (e: unknown) => e,
  );
  expect(err).toBeInstanceOf(HttpError);
  return err as HttpError;
}

describe("price book", () => {
  it("starts empty, saves a document, and reads it back parsed", async () => {
    const owner = await newCompany("Price Book Solar");
    expect(await getPriceBookRecord(owner.companyId)).toBeNull();
    expect((await getPriceBook(owner.companyId)).bands).toHaveLength(1);

    const saved = await savePriceBook(owner, book);
    expect(saved.document).toEqual(priceBookSchema.parse(book));
    expect(saved.updatedByName).toBe(owner.name);
    expect((await getPriceBook(owner.companyId)).bands[1].centsPerWattDc).toBe(275.5);

    // A second save replaces the one row.
    const second = await savePriceBook(owner, { ...book, deposit: { kind: "percent", pct: 10, minCents: 50_000, maxCents: 200_000 } });
    expect(second.id).toBe(saved.id);
    expect((await db().select().from(priceBook).where(eq(priceBook.companyId, owner.companyId))).length).toBe(1);
    expect((await getPriceBook(owner.companyId)).deposit).toEqual({ kind: "percent", pct: 10, minCents: 50_000, maxCents: 200_000 });
  });

  it("rejects overlapping bands with the field path and keeps the saved book", async () => {
    const owner = await newCompany("Overlap Solar");
    await savePriceBook(owner, book);
    const bad = { ...book, bands: [{ minWatts: 0, maxWatts: 8_000, centsPerWattDc: 300 }, { minWatts: 7_500, maxWatts: null, centsPerWattDc: 280 }] };
    const err = await failure(savePriceBook(owner, bad));
    expect(err.status).toBe(422);
    expect(err.fields).toEqual({ "bands.1.minWatts": ["overlaps the band before, which runs to 8000 W"] });
    expect((await getPriceBook(owner.companyId)).bands[1].minWatts).toBe(8_000);

    const noVersion = await failure(savePriceBook(owner, { ...book, version: 2 }));
    expect(Object.keys(noVersion.fields ?? {})).toEqual(["version"]);
    const badIncentive = await failure(savePriceBook(owner, { ...book, incentives: [{ ...book.incentives[0], startDate: "2026-02-30" }] }));
    expect(Object.keys(badIncentive.fields ?? {})).toEqual(["incentives.0.startDate"]);
  });

  it("only owners and admins may save; reps read", async () => {
    const owner = await newCompany("Roles Solar");
    const rep = await addMember(owner, "sales_rep");
    const office = await addMember(owner, "office_manager");
    expect((await failure(savePriceBook(rep, book))).status).toBe(403);
    expect((await failure(savePriceBook(office, book))).status).toBe(403);
    const admin = await addMember(owner, "admin");
    await savePriceBook(admin, book);
    expect((await getPriceBook(rep.companyId)).lineItems[0].id).toBe("critter-guard");
  });

  it("another company's price book is not found by id", async () => {
    const owner = await newCompany("Tenancy Solar");
    const mine = await savePriceBook(owner, book);
    expect((await getPriceBookOrThrow(owner.companyId, mine.id)).id).toBe(mine.id);
    const other = await newCompany("Other Solar");
    expect((await failure(getPriceBookOrThrow(other.companyId, mine.id))).status).toBe(404);
    // The demo company's seeded book stays its own.
    const [demo] = await db().select({ id: priceBook.id }).from(priceBook).where(eq(priceBook.companyId, DEMO_COMPANY_ID));
    if (demo) expect((await failure(getPriceBookOrThrow(owner.companyId, demo.id))).status).toBe(404);
  });
});
