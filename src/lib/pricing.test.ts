import { describe, expect, it } from "vitest";
import { evaluateIncentives } from "@/engine/incentives";
import { bandFor, depositFor, discountDecisionRefusal, discountLimitCents, priceOffer, PricingInputError, toQuotePrice, type OfferPricingInput } from "@/lib/pricing";
import { incentiveRulesForEngine, priceBookSchema, type PriceBook, type PriceBookInput } from "@/lib/schemas/price-book";

// A price book like the demo company's: $3.10/W below 6 kW, $2.85/W 6–10 kW, $2.65/W above.
const bookInput: PriceBookInput = {
  version: 1,
  bands: [
    { minWatts: 0, maxWatts: 6_000, centsPerWattDc: 310 },
    { minWatts: 6_000, maxWatts: 10_000, centsPerWattDc: 285 },
    { minWatts: 10_000, maxWatts: null, centsPerWattDc: 265 },
  ],
  adders: [
    { id: "tile-roof", name: "Tile roof", kind: "per_watt", centsPerWattDc: 15 },
    { id: "optimizers", name: "Module-level optimizers", kind: "per_module", centsPerModule: 4_500 },
    { id: "main-panel-upgrade", name: "Main panel upgrade", kind: "fixed", amountCents: 225_000 },
  ],
  lineItems: [{ id: "critter-guard", name: "Critter guard", amountCents: 65_000 }],
  discountLimits: { sales_rep: { maxCents: 100_000, maxPct: 3 }, office_manager: { maxCents: 300_000, maxPct: 8 } },
  incentives: [
    {
      id: "coop-rebate",
      name: "Cooperative solar rebate",
      source: "utility",
      amount: { kind: "per-watt", centsPerWattDc: 20, capCents: 150_000 },
      startDate: "2026-01-01",
      endDate: "2027-12-31",
    },
    { id: "old-grant", name: "Old county grant", source: "local", amount: { kind: "fixed", amountCents: 50_000 }, startDate: "2024-01-01", endDate: "2025-06-30" },
  ],
  deposit: { kind: "percent", pct: 10, minCents: 50_000, maxCents: 250_000 },
};
const book: PriceBook = priceBookSchema.parse(bookInput);

const offer = (over: Partial<OfferPricingInput> = {}): OfferPricingInput => ({
  dcWatts: 7_200,
  moduleCount: 18,
  adderIds: [],
  lineItemIds: [],
  discountCents: 0,
  role: "sales_rep",
  ...over,
});

describe("size bands", () => {
  it("prices the whole system at its band's rate; a boundary size takes the upper band", () => {
    // 5,999 W × 310 ¢/W = 1,859,690 ¢ ($18,596.90)
    expect(priceOffer(book, offer({ dcWatts: 5_999 })).baseCents).toBe(1_859_690);
    // 6,000 W × 285 ¢/W = 1,710,000 ¢
    const at6k = priceOffer(book, offer({ dcWatts: 6_000 }));
    expect(at6k.band.index).toBe(1);
    expect(at6k.baseCents).toBe(1_710_000);
    // 9,999 W × 285 = 2,849,715 ¢; 10,000 W × 265 = 2,650,000 ¢ (open-ended last band)
    expect(priceOffer(book, offer({ dcWatts: 9_999 })).baseCents).toBe(2_849_715);
    expect(priceOffer(book, offer({ dcWatts: 10_000 })).band).toEqual({ index: 2, minWatts: 10_000, maxWatts: null, centsPerWattDc: 265 });
    expect(priceOffer(book, offer({ dcWatts: 40_000 })).baseCents).toBe(10_600_000);
    // 0 W falls in the first band and costs nothing.
    expect(bandFor(book, 0).index).toBe(0);
  });

  it("rounds a fractional price per watt to the cent once", () => {
    const fractional = priceBookSchema.parse({ ...bookInput, bands: [{ minWatts: 0, maxWatts: null, centsPerWattDc: 287.5 }] });
    // 7,201 W × 287.5 ¢/W = 2,070,287.5 ¢ → 2,070,288 ¢
    expect(priceOffer(fractional, offer({ dcWatts: 7_201 })).baseCents).toBe(2_070_288);
  });
});

describe("adders and line items", () => {
  it("adds per-watt, per-module and fixed adders and line items, one line each", () => {
    const p = priceOffer(book, offer({ adderIds: ["tile-roof", "optimizers", "main-panel-upgrade"], lineItemIds: ["critter-guard"] }));
    // base 7,200 W × 285 = 2,052,000; tile 7,200 × 15 = 108,000; optimizers 18 × 4,500 = 81,000; panel 225,000
    expect(p.baseCents).toBe(2_052_000);
    expect(p.addersCents).toBe(108_000 + 81_000 + 225_000);
    expect(p.lineItemsCents).toBe(65_000);
    // 2,052,000 + 414,000 + 65,000 = 2,531,000
    expect(p.grossCents).toBe(2_531_000);
    expect(p.contractCents).toBe(2_531_000);
    expect(p.lines.map((l) => [l.kind, l.amountCents])).toEqual([
      ["base", 2_052_000],
      ["adder", 108_000],
      ["adder", 81_000],
      ["adder", 225_000],
      ["line-item", 65_000],
    ]);
    expect(p.lines[0].detail).toBe("7,200 W × 285 ¢/W");
  });

  it("names an unknown adder or line item by its position", () => {
    expect(() => priceOffer(book, offer({ adderIds: ["tile-roof", "solar-shingles"] }))).toThrow(PricingInputError);
    expect(() => priceOffer(book, offer({ adderIds: ["tile-roof", "solar-shingles"] }))).toThrow(/adderIds\.1/);
    expect(() => priceOffer(book, offer({ lineItemIds: ["gold-trim"] }))).toThrow(/lineItemIds\.0/);
  });

  it("matches the engine's quote price form (per watt + adders − discount = contract)", () => {
    const p = priceOffer(book, offer({ adderIds: ["main-panel-upgrade"], lineItemIds: ["critter-guard"], discountCents: 50_000 }));
    const q = toQuotePrice(p);
    expect(Math.round(7_200 * q.perWattCents) + q.adders.reduce((s, a) => s + a.amountCents, 0) - q.discountCents).toBe(p.contractCents);
  });
});

describe("discount approval", () => {
  // Gross 2,531,000 ¢ (as above).
  const withAll = (discountCents: number, role: OfferPricingInput["role"]) =>
    priceOffer(book, offer({ adderIds: ["tile-roof", "optimizers", "main-panel-upgrade"], lineItemIds: ["critter-guard"], discountCents, role }));

  it("a rep may give the lesser of $1,000 and 3 % of the price", () => {
    // 3 % of 2,531,000 = 75,930 < 100,000 → limit 75,930
    expect(withAll(75_930, "sales_rep")).toMatchObject({ discountLimitCents: 75_930, discountNeedsApproval: false, contractCents: 2_455_070 });
    expect(withAll(75_931, "sales_rep").discountNeedsApproval).toBe(true);
    // On a 20 kW job (20,000 × 265 = 5,300,000), 3 % = 159,000 > 100,000 → limit $1,000
    expect(discountLimitCents(book, "sales_rep", 5_300_000)).toBe(100_000);
  });

  it("an office manager may give the lesser of $3,000 and 8 %", () => {
    // 8 % of 2,531,000 = 202,480 < 300,000
    expect(withAll(202_480, "office_manager").discountNeedsApproval).toBe(false);
    expect(withAll(202_481, "office_manager").discountNeedsApproval).toBe(true);
    // 8 % of 5,300,000 = 424,000 > 300,000
    expect(discountLimitCents(book, "office_manager", 5_300_000)).toBe(300_000);
  });

  it("owners and admins have no limit; crew gives nothing without approval; no discount never needs approval", () => {
    expect(withAll(1_000_000, "owner")).toMatchObject({ discountLimitCents: null, discountNeedsApproval: false });
    expect(withAll(1_000_000, "admin").discountNeedsApproval).toBe(false);
    expect(withAll(1, "crew")).toMatchObject({ discountLimitCents: 0, discountNeedsApproval: true });
    expect(withAll(0, "sales_rep").discountNeedsApproval).toBe(false);
  });

  it("a limit with only a percentage, or none at all", () => {
    const pctOnly = priceBookSchema.parse({ ...bookInput, discountLimits: { sales_rep: { maxCents: null, maxPct: 2.5 }, office_manager: { maxCents: null, maxPct: null } } });
    // 2.5 % of 1,000,001 = 25,000.025 → rounded down to 25,000
    expect(discountLimitCents(pctOnly, "sales_rep", 1_000_001)).toBe(25_000);
    expect(discountLimitCents(pctOnly, "office_manager", 1_000_000)).toBe(0);
  });

  it("refuses a discount above the price", () => {
    expect(() => priceOffer(book, offer({ dcWatts: 1_000, discountCents: 310_001 }))).toThrow(/discountCents/);
  });
});

describe("deposit", () => {
  it("10 % of the contract, at least $500 and at most $2,500", () => {
    // 3,000 W × 310 = 930,000 → 10 % = 93,000
    expect(priceOffer(book, offer({ dcWatts: 3_000 })).depositCents).toBe(93_000);
    // 1,500 W × 310 = 465,000 → 10 % = 46,500 → raised to the 50,000 minimum
    expect(priceOffer(book, offer({ dcWatts: 1_500 })).depositCents).toBe(50_000);
    // contract 2,531,000 → 10 % = 253,100 → held to the 250,000 maximum
    expect(priceOffer(book, offer({ adderIds: ["tile-roof", "optimizers", "main-panel-upgrade"], lineItemIds: ["critter-guard"] })).depositCents).toBe(250_000);
    // On the contract after discount: 2,070,288 × 10 % = 207,028.8 → 207,029
    expect(depositFor(book, 2_070_288)).toBe(207_029);
  });

  it("a fixed deposit, never above the contract", () => {
    const fixed = priceBookSchema.parse({ ...bookInput, deposit: { kind: "fixed", amountCents: 100_000 } });
    expect(depositFor(fixed, 2_000_000)).toBe(100_000);
    expect(depositFor(fixed, 60_000)).toBe(60_000);
    expect(depositFor(book, 0)).toBe(0);
  });
});

describe("price book document", () => {
  const issuesOf = (input: unknown) => {
    const r = priceBookSchema.safeParse(input);
    return r.success ? [] : r.error.issues.map((i) => `${i.path.join(".")}: ${i.message}`);
  };

  it("rejects overlapping, gapped, not-from-zero and closed-last bands, naming the field", () => {
    const overlap = { ...bookInput, bands: [{ minWatts: 0, maxWatts: 6_000, centsPerWattDc: 310 }, { minWatts: 5_000, maxWatts: null, centsPerWattDc: 285 }] };
    expect(issuesOf(overlap)).toEqual(["bands.1.minWatts: overlaps the band before, which runs to 6000 W"]);
    const gap = { ...bookInput, bands: [{ minWatts: 0, maxWatts: 6_000, centsPerWattDc: 310 }, { minWatts: 7_000, maxWatts: null, centsPerWattDc: 285 }] };
    expect(issuesOf(gap)).toEqual(["bands.1.minWatts: leaves a gap: the band before ends at 6000 W"]);
    expect(issuesOf({ ...bookInput, bands: [{ minWatts: 100, maxWatts: null, centsPerWattDc: 310 }] })).toEqual(["bands.0.minWatts: the first band must start at 0 W"]);
    expect(issuesOf({ ...bookInput, bands: [{ minWatts: 0, maxWatts: 6_000, centsPerWattDc: 310 }] })).toEqual(["bands.0.maxWatts: the last band must have no upper limit"]);
    expect(issuesOf({ ...bookInput, bands: [{ minWatts: 0, maxWatts: null, centsPerWattDc: 310.123 }] })[0]).toMatch(/^bands\.0\.centsPerWattDc: use at most two decimals/);
  });

  it("rejects duplicate ids, a deposit max below its min, and an incentive ending before it starts", () => {
    expect(issuesOf({ ...bookInput, lineItems: [...bookInput.lineItems, { id: "critter-guard", name: "Again", amountCents: 1 }] })).toEqual([
      'lineItems.1.id: id "critter-guard" is used twice',
    ]);
    expect(issuesOf({ ...bookInput, deposit: { kind: "percent", pct: 10, minCents: 300_000, maxCents: 250_000 } })).toEqual(["deposit.maxCents: must not be below the minimum"]);
    expect(issuesOf({ ...bookInput, incentives: [{ ...bookInput.incentives[0], endDate: "2025-12-31" }] })).toEqual(["incentives.0.endDate: must not be before startDate"]);
  });

  it("feeds the engine's incentive rules; an ended rule never applies", () => {
    const rules = incentiveRulesForEngine(book);
    expect(rules[0]).not.toHaveProperty("source");
    // 7,200 W × 20 ¢/W = 144,000 ¢, under the 150,000 cap
    const r = evaluateIncentives({ rules, asOf: "2026-05-01", grossPriceCents: 2_052_000, systemKwDc: 7.2, payment: "cash" });
    expect(r.applied.map((a) => [a.id, a.amountCents])).toEqual([["coop-rebate", 144_000]]);
    expect(r.skipped.map((s) => s.id)).toEqual(["old-grant"]);
    // 9,000 W × 20 = 180,000 → capped at 150,000
    expect(evaluateIncentives({ rules, asOf: "2026-05-01", grossPriceCents: 2_565_000, systemKwDc: 9, payment: "cash" }).upfrontCents).toBe(150_000);
  });
});

describe("who may decide a discount request", () => {
  // Office managers: at most $3,000 and 8 % of the price before discount; owners and admins: no limit.
  const request = { requestedByUserId: "rep-1", amountCents: 250_000, grossCents: 2_000_000 };

  it("someone else whose own limit covers the discount may", () => {
    expect(discountDecisionRefusal(book, { userId: "om-1", role: "office_manager" }, { ...request, amountCents: 160_000 })).toBeNull();
    expect(discountDecisionRefusal(book, { userId: "owner-1", role: "owner" }, request)).toBeNull();
    expect(discountDecisionRefusal(book, { userId: "admin-1", role: "admin" }, request)).toBeNull();
  });

  it("an office manager may not decide above their own limit (8 % of $20,000 = $1,600)", () => {
    expect(discountDecisionRefusal(book, { userId: "om-1", role: "office_manager" }, request)).toMatch(/above your own limit of \$1,600\.00/);
  });

  it("nobody decides their own request, whatever their limit", () => {
    expect(discountDecisionRefusal(book, { userId: "owner-1", role: "owner" }, { ...request, requestedByUserId: "owner-1" })).toMatch(/You asked for this discount/);
  });
});
