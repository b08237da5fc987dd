import { describe, expect, it } from "vitest";
import { bookForUtility, emptyPriceBook, priceBookSchema, rateSheetsInForce, type PriceBookInput } from "@/lib/schemas/price-book";

const UTILITY_A = "0b3c2f1e-0000-4000-8000-00000000000a";
const UTILITY_B = "0b3c2f1e-0000-4000-8000-00000000000b";
const lease = (partner: string, monthlyCentsPerWatt: number) => ({ kind: "lease" as const, partner, payment: { basis: "per-watt" as const, monthlyCentsPerWatt }, escalatorPctPerYear: 2.9, termYears: 25 });

function book(rateSheets: PriceBookInput["rateSheets"]) {
  const empty = emptyPriceBook();
  return priceBookSchema.parse({ ...empty, rateSheets, batteries: [{ id: "sw-13", name: "Stillwater 13.5 kWh", batteryModelId: "7a11a55e-0000-4000-8000-000000001021", amountCents: 1_150_000 }] });
}

describe("financing partners' rate sheets in the price book", () => {
  const b = book([
    { id: "north-2026-01", effectiveDate: "2026-01-01", states: ["NC"], terms: lease("North Partner", 1.1) },
    { id: "north-2026-07", effectiveDate: "2026-07-01", states: ["NC"], terms: lease("North Partner", 1.05) },
    { id: "north-2027-01", effectiveDate: "2027-01-01", states: ["NC"], terms: lease("North Partner", 0.99) },
    { id: "coop-ppa", effectiveDate: "2026-03-01", utilityId: UTILITY_B, terms: { kind: "ppa", partner: "Co-op Partner", centsPerKwh: 10.4, escalatorPctPerYear: 2, termYears: 20 } },
  ]);

  it("offers the sheet in force: the latest effective date not after the offer, for the state and utility", () => {
    expect(rateSheetsInForce(b, { asOf: "2026-08-15", state: "NC", utilityId: UTILITY_A }).map((s) => s.id)).toEqual(["north-2026-07"]);
    expect(rateSheetsInForce(b, { asOf: "2026-06-30", state: "NC", utilityId: UTILITY_B }).map((s) => s.id)).toEqual(["north-2026-01", "coop-ppa"]);
    expect(rateSheetsInForce(b, { asOf: "2026-08-15", state: "VA", utilityId: UTILITY_A })).toEqual([]);
    expect(rateSheetsInForce(b, { asOf: "2025-12-31", state: "NC", utilityId: null })).toEqual([]);
  });

  it("drops another utility's sheets with its incentives (bookForUtility)", () => {
    expect(bookForUtility(b, UTILITY_A).rateSheets.map((s) => s.id)).not.toContain("coop-ppa");
    expect(bookForUtility(b, UTILITY_B).rateSheets.map((s) => s.id)).toContain("coop-ppa");
  });

  it("names what is wrong in a sheet or a battery line", () => {
    const bad = priceBookSchema.safeParse({
      ...emptyPriceBook(),
      batteries: [{ id: "x", name: "X", batteryModelId: "not-a-uuid", amountCents: 100 }],
      rateSheets: [
        { id: "a", effectiveDate: "2026-02-30", states: ["North Carolina"], terms: lease("P", 1) },
        { id: "a", effectiveDate: "2026-02-01", terms: { kind: "ppa", partner: "P", centsPerKwh: 10, escalatorPctPerYear: 2, termYears: 45 } },
      ],
    });
    expect(bad.success).toBe(false);
    const issues = bad.error?.issues.map((i) => `${i.path.join(".")}: ${i.message}`) ?? [];
    expect(issues).toEqual(
      expect.arrayContaining([
        "batteries.0.batteryModelId: Pick the battery from the catalog",
        "rateSheets.0.effectiveDate: must be a date as YYYY-MM-DD",
        "rateSheets.0.states.0: use two-letter state codes (e.g. NC)",
        expect.stringMatching(/^rateSheets\.1\.terms\.termYears: /),
      ]),
    );
  });

  it("a book saved before these lists reads with none", () => {
    const { batteries, rateSheets, ...older } = emptyPriceBook();
    expect([batteries, rateSheets]).toEqual([[], []]);
    expect(priceBookSchema.parse(older)).toMatchObject({ batteries: [], rateSheets: [] });
  });
});
