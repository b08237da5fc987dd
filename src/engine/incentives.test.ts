import { describe, expect, it } from "vitest";
import { evaluateIncentives, type IncentiveRuleInput } from "./incentives";
import { EngineInputError } from "./errors";

// Invented rules (test data only, not real programmes); all expectations hand-worked.
const taxCredit: IncentiveRuleInput = {
  id: "tax-30",
  name: "Tax credit 30 %",
  amount: { kind: "percent", pct: 30, basis: "net-of-earlier" },
  startDate: "2022-01-01",
  endDate: "2032-12-31",
  timing: { year: 1 },
};
const rebate: IncentiveRuleInput = {
  id: "utility-rebate",
  name: "Utility rebate",
  amount: { kind: "per-watt", centsPerWattDc: 20, capCents: 150_000 },
  startDate: "2024-01-01",
  endDate: "2024-12-31",
};
const cityGrant: IncentiveRuleInput = { id: "city", name: "City grant", amount: { kind: "fixed", amountCents: 50_000 }, startDate: "2024-03-01", endDate: "2024-06-30" };

describe("evaluateIncentives", () => {
  it("applies per-watt with cap, then percent of the net price, then fixed", () => {
    // 8 kW × 1000 W × 20 ¢ = 160,000 ¢ → capped 150,000
    // 30 % of (2,400,000 − 150,000) = 675,000 ¢ in year 1
    // fixed 50,000 upfront
    const r = evaluateIncentives({ rules: [rebate, taxCredit, cityGrant], asOf: "2024-05-15", grossPriceCents: 2_400_000, systemKwDc: 8, payment: "cash" });
    expect(r.applied.map((a) => [a.id, a.amountCents, a.year])).toEqual([
      ["utility-rebate", 150_000, 0],
      ["tax-30", 675_000, 1],
      ["city", 50_000, 0],
    ]);
    expect(r.upfrontCents).toBe(200_000);
    expect(r.byYear).toEqual([200_000, 675_000]);
    expect(r.totalCents).toBe(875_000);
  });

  it("drops a credit that has ended or not started at the evaluation date", () => {
    // 2025-01-02: the rebate ended 2024-12-31; the city grant ended 2024-06-30.
    const late = evaluateIncentives({ rules: [rebate, taxCredit, cityGrant], asOf: "2025-01-02", grossPriceCents: 2_400_000, systemKwDc: 8, payment: "cash" });
    expect(late.applied.map((a) => a.id)).toEqual(["tax-30"]);
    expect(late.skipped.map((s) => [s.id, s.reason])).toEqual([
      ["utility-rebate", "ended 2024-12-31, before the offer on 2025-01-02"],
      ["city", "ended 2024-06-30, before the offer on 2025-01-02"],
    ]);
    // Percent of the full price now: 30 % × 2,400,000 = 720,000
    expect(late.totalCents).toBe(720_000);
    const early = evaluateIncentives({ rules: [cityGrant], asOf: "2024-02-29", grossPriceCents: 100, systemKwDc: 1, payment: "cash" });
    expect(early.applied).toHaveLength(0);
    // The end date itself is inside the window.
    const lastDay = evaluateIncentives({ rules: [cityGrant], asOf: "2024-06-30", grossPriceCents: 2_400_000, systemKwDc: 1, payment: "cash" });
    expect(lastDay.totalCents).toBe(50_000);
  });

  it("a credit that counts at installation is judged on the install date, not the offer date (26 U.S.C. §25D(e)(8))", () => {
    // A dated rule as data: 30 % for systems installed through 2025-12-31 (the residential credit's
    // end for expenditures after 2025, from memory).
    const federal: IncentiveRuleInput = { id: "25d", name: "Federal residential clean energy credit", amount: { kind: "percent", pct: 30 }, startDate: "2022-01-01", endDate: "2025-12-31", timing: { year: 1 }, countsOn: "installation" };
    const offeredInTime = evaluateIncentives({ rules: [federal], asOf: "2025-11-20", installDate: "2026-01-15", grossPriceCents: 2_400_000, systemKwDc: 8, payment: "cash" });
    expect(offeredInTime.applied).toHaveLength(0);
    expect(offeredInTime.skipped[0].reason).toBe("ended 2025-12-31, before installation on 2026-01-15");
    const installedInTime = evaluateIncentives({ rules: [federal], asOf: "2025-10-01", installDate: "2025-12-10", grossPriceCents: 2_400_000, systemKwDc: 8, payment: "cash" });
    expect(installedInTime.totalCents).toBe(720_000);
    expect(installedInTime.applied[0].detail).toContain("counts at installation on 2025-12-10");
  });

  it("a percent credit's basis includes a dealer fee the homeowner pays inside the loan", () => {
    // 30 % × ($24,000 price + $2,880 dealer fee) = $8,064.00
    const r = evaluateIncentives({ rules: [taxCredit], asOf: "2025-01-02", grossPriceCents: 2_400_000, dealerFeeCents: 288_000, systemKwDc: 8, payment: "loan" });
    expect(r.totalCents).toBe(806_400);
    expect(r.applied[0].detail).toContain("incl. the $2,880.00 dealer fee in the loan");
  });

  it("checks size and payment eligibility", () => {
    const rule: IncentiveRuleInput = { ...cityGrant, eligibility: { maxKwDc: 10, payment: ["cash"] } };
    const big = evaluateIncentives({ rules: [rule], asOf: "2024-04-01", grossPriceCents: 3_000_000, systemKwDc: 12, payment: "cash" });
    expect(big.skipped[0].reason).toContain("above the 10 kW maximum");
    const loan = evaluateIncentives({ rules: [rule], asOf: "2024-04-01", grossPriceCents: 3_000_000, systemKwDc: 6, payment: "loan" });
    expect(loan.skipped[0].reason).toContain("loan");
  });

  it("never lets incentives exceed the price", () => {
    const r = evaluateIncentives({ rules: [cityGrant, { ...cityGrant, id: "again" }], asOf: "2024-04-01", grossPriceCents: 70_000, systemKwDc: 1, payment: "cash" });
    expect(r.applied.map((a) => a.amountCents)).toEqual([50_000, 20_000]);
  });

  it("names bad rule fields", () => {
    try {
      evaluateIncentives({
        rules: [{ ...cityGrant, endDate: "2024-02-01" }, { ...rebate, amount: { kind: "percent", pct: 130 } }],
        asOf: "2024-13-01",
        grossPriceCents: 1,
        systemKwDc: 1,
        payment: "cash",
      });
      throw new Error("expected failure");
    } catch (e) {
      expect(e).toBeInstanceOf(EngineInputError);
      const paths = (e as EngineInputError).issues.map((i) => i.path);
      expect(paths).toEqual(expect.arrayContaining(["rules.0.endDate", "rules.1.amount.pct", "asOf"]));
    }
  });
});
