import { describe, expect, it } from "vitest";
import { HOURS_PER_YEAR } from "@/engine/year-calendar";
import { computeOfferFigures, engineSystem, manualProductionHourly, suggestStrings, checkStringPlan, type InverterSpec, type ModuleSpec } from "@/lib/offer-figures";
import type { PriceBook } from "@/lib/schemas/price-book";

// A book kept small enough to work by hand: one band at 300 ¢/W, one $500 fixed adder, a rep
// limit of $500, and a 30 % incentive paid in year 1.
const book: PriceBook = {
  version: 1,
  bands: [{ minWatts: 0, maxWatts: null, centsPerWattDc: 300 }],
  adders: [{ id: "trench", name: "Trenching", kind: "fixed", amountCents: 50_000 }],
  lineItems: [],
  discountLimits: { sales_rep: { maxCents: 50_000, maxPct: null }, office_manager: { maxCents: 200_000, maxPct: null } },
  incentives: [
    { id: "credit", name: "Tax credit", source: "federal", amount: { kind: "percent", pct: 30, basis: "gross-price" }, startDate: "2020-01-01", endDate: "2040-12-31", timing: { year: 1 }, countsOn: "installation", eligibility: {}, utilityId: null },
  ],
  deposit: { kind: "fixed", amountCents: 100_000 },
  batteries: [],
  rateSheets: [],
};

const flatPlan = { name: "Flat 10", energy: { kind: "flat" as const, centsPerKwh: 10 }, compensation: { kind: "net-metering" as const } };
const usage = new Float64Array(HOURS_PER_YEAR).fill(1); // 8,760 kWh a year
const production = new Float64Array(HOURS_PER_YEAR).fill(0.5); // 4,380 kWh, never above usage
const noDrift = { degradationPctPerYear: 0, utilityEscalationPctPerYear: 0 };

describe("computeOfferFigures (hand-worked)", () => {
  const base = {
    book,
    role: "sales_rep" as const,
    asOf: "2026-03-02",
    moduleCount: 10,
    moduleWatts: 400,
    productionHourlyKwh: production,
    usageHourlyKwh: usage,
    ratePlan: flatPlan,
    timeZone: "America/Denver",
    payment: { kind: "cash" as const },
    adderIds: ["trench"],
    lineItemIds: [],
    discountCents: 0,
    assumptions: noDrift,
  };

  it("prices, bills and pays back as worked by hand", () => {
    const f = computeOfferFigures(base);
    // 4,000 W × 300 ¢/W = $12,000, + $500 trenching = $12,500.
    expect(f.summary.kwDc).toBe(4);
    expect(f.summary.contractCents).toBe(1_250_000);
    // 30 % of $12,500 = $3,750 in year 1.
    expect(f.summary.incentivesCents).toBe(375_000);
    expect(f.summary.netCostCents).toBe(875_000);
    // Bills: 8,760 kWh × 10 ¢ = $876 without; 4,380 kWh × 10 ¢ = $438 with: $438 saved.
    expect(f.rows[1].billWithoutSolarCents).toBe(87_600);
    expect(f.summary.year1SavingsCents).toBe(43_800);
    // Offset 4,380 / 8,760 = 50 %.
    expect(f.summary.offsetPct).toBe(50);
    // Cumulative: −12,500 + (438 + 3,750) = −8,312 after year 1, +438 a year after that:
    // −428 after year 19, so payback = 19 + 428 / 438 = 19.977 years.
    expect(f.summary.paybackYears).toBeCloseTo(19 + 42_800 / 43_800, 2);
    // 25 years × $438 = $10,950 saved; ROI = (10,950 − 8,750) / 8,750 = 0.2514.
    expect(f.summary.lifetimeSavingsCents).toBe(1_095_000);
    expect(f.summary.simpleRoi).toBeCloseTo(0.2514, 4);
    expect(f.summary.monthlyLoanPaymentCents).toBeNull();
    expect(f.discountNeedsApproval).toBe(false);
  });

  it("a 0 % loan over 120 months pays the contract less the deposit (the down payment) in equal parts", () => {
    const f = computeOfferFigures({ ...base, payment: { kind: "loan", aprPct: 0, termMonths: 120, dealerFeePct: 0, downPaymentCents: null } });
    // The $1,000 deposit paid at signing is the down payment: ($12,500 − $1,000) / 120 = $95.8333 → 9,583 ¢.
    expect(f.summary.monthlyLoanPaymentCents).toBe(9_583);
    expect(f.summary.downPaymentCents).toBe(100_000);
    expect(f.summary.loanAmountCents).toBe(1_150_000);
    // Year 0 shows the down payment.
    expect(f.rows[0]).toMatchObject({ year: 0, systemPaymentCents: 100_000, cashFlowCents: -100_000 });
    // A larger down payment: ($12,500 − $3,000) / 120 = $79.1667 → 7,917 ¢.
    const more = computeOfferFigures({ ...base, payment: { kind: "loan", aprPct: 0, termMonths: 120, dealerFeePct: 0, downPaymentCents: 300_000 } });
    expect(more.summary.monthlyLoanPaymentCents).toBe(7_917);
    expect(more.summary.loanAmountCents).toBe(950_000);
    expect(more.rows[0].systemPaymentCents).toBe(300_000);
  });

  it("the tax credit's basis includes the dealer fee inside the loan; its date is the expected installation", () => {
    const loan = { kind: "loan" as const, aprPct: 5, termMonths: 120, dealerFeePct: 10, downPaymentCents: null };
    const f = computeOfferFigures({ ...base, payment: loan });
    // Borrowed $12,500 − $1,000 deposit = $11,500; grossed up for a 10 % fee: 11,500 / 0.9 = $12,777.78, fee $1,277.78.
    // Credit: 30 % × ($12,500 + $1,277.78) = $4,133.33.
    expect(f.incentives.applied[0].amountCents).toBe(413_333);
    expect(f.incentives.applied[0].detail).toContain("dealer fee in the loan");
    // Installation expected after the credit's end: no credit, with the reason.
    const late = computeOfferFigures({ ...base, book: { ...book, incentives: [{ ...book.incentives[0], endDate: "2026-03-31" }] }, expectedInstallDate: "2026-04-15" });
    expect(late.incentives.applied).toHaveLength(0);
    expect(late.incentives.skipped[0].reason).toBe("ended 2026-03-31, before installation on 2026-04-15");
    // No install date planned: the offer date + 60 days (2026-03-02 → 2026-05-01).
    const assumed = computeOfferFigures({ ...base, book: { ...book, incentives: [{ ...book.incentives[0], endDate: "2026-04-30" }] } });
    expect(assumed.incentives.skipped[0].reason).toBe("ended 2026-04-30, before installation on 2026-05-01");
  });

  it("refuses a down payment below the deposit paid at signing", () => {
    expect(() => computeOfferFigures({ ...base, payment: { kind: "loan", aprPct: 5, termMonths: 120, dealerFeePct: 0, downPaymentCents: 50_000 } })).toThrow(
      /payment.downPaymentCents: the \$1,000(\.00)? deposit is paid at signing/,
    );
  });

  it("a loan longer than the analysis lengthens the table instead of dropping payments", () => {
    const f = computeOfferFigures({ ...base, payment: { kind: "loan", aprPct: 4, termMonths: 360, dealerFeePct: 0, downPaymentCents: null } });
    // noDrift keeps 25 years; the 30-year loan makes the table 30 years (rows 0–30).
    expect(f.rows).toHaveLength(31);
    expect(f.rows[30].systemPaymentCents).toBeGreaterThan(0);
    expect(f.notes.some((n) => n.startsWith("The table runs 30 years"))).toBe(true);
    expect(f.assumptions.years).toBe(30);
  });

  it("simple payback = net cost ÷ year-1 savings; ROI's basis is what the homeowner pays", () => {
    const f = computeOfferFigures(base);
    // Cash: net cost = the year-0 outlay less incentives received later (no loan, no upkeep here).
    const laterIncentives = f.rows.slice(1).reduce((a, r) => a + r.incentivesCents, 0);
    expect(f.summary.roiBasisCents).toBe(-f.rows[0].cashFlowCents - laterIncentives);
    expect(f.summary.simplePaybackYears).toBeCloseTo(f.summary.roiBasisCents! / f.summary.year1SavingsCents, 2);
  });

  it("flags a discount beyond the rep's limit and still prices it", () => {
    const f = computeOfferFigures({ ...base, discountCents: 100_000 });
    expect(f.discountLimitCents).toBe(50_000);
    expect(f.discountNeedsApproval).toBe(true);
    expect(f.summary.contractCents).toBe(1_150_000);
  });

  it("degradation lowers later years' savings", () => {
    const f = computeOfferFigures({ ...base, assumptions: { degradationPctPerYear: 1, utilityEscalationPctPerYear: 0 } });
    // Year 2 produces 99 %: 4,336.2 kWh × 10 ¢ = $433.62 saved; each of the 12 monthly bills is
    // rounded to the cent, so the sum may differ by a cent or two.
    expect(Math.abs(f.rows[2].savingsCents - 43_362)).toBeLessThanOrEqual(2);
  });
});

describe("manualProductionHourly", () => {
  it("keeps the typed annual figure and splits months by days", () => {
    const h = manualProductionHourly(3650, null);
    const total = h.reduce((a, b) => a + b, 0);
    expect(total).toBeCloseTo(3650, 6);
    // January: 31 days of 10 kWh.
    let jan = 0;
    for (let i = 0; i < 31 * 24; i++) jan += h[i];
    expect(jan).toBeCloseTo(310, 6);
    expect(h[2]).toBe(0); // no production at 02:00
  });
});

const mod: ModuleSpec = { stcWatts: 400, vocV: 49.5, iscA: 10.6, vmpV: 41.2, impA: 9.7, gammaPmaxPctPerC: -0.34, betaVocPctPerC: -0.27 };
const stringInv: InverterSpec = { kind: "string", acWatts: 7600, efficiencyPct: 97, maxDcVoltageV: 600, mpptMinV: 200, mpptMaxV: 480, maxInputCurrentA: 15, mpptCount: 2, modulesPerUnit: null };

describe("string plan", () => {
  it("suggests strings no longer than the cold-Voc limit", () => {
    // At −10 °C: 49.5 × (1 + (−35 × −0.27 %)) = 54.18 V; 600 / 54.18 → 11 modules in series.
    const sizes = suggestStrings(20, mod, stringInv, -10, 35);
    expect(sizes).toEqual([10, 10]);
    const check = checkStringPlan(mod, stringInv, 1, { stringSizes: sizes, lowestTempC: -10, highestTempC: 35 });
    expect(check.maxInSeries).toBe(11);
    expect(check.results[0].result.status).not.toBe("fail");
  });
  it("fails a string over 600 V", () => {
    const check = checkStringPlan(mod, stringInv, 1, { stringSizes: [12], lowestTempC: -10, highestTempC: 35 });
    expect(check.results[0].result.status).toBe("fail");
  });
});

describe("engineSystem", () => {
  it("leaves out empty faces and shares micros per module", () => {
    const micro: InverterSpec = { kind: "micro", acWatts: 640, efficiencyPct: 96.5, maxDcVoltageV: null, mpptMinV: null, mpptMaxV: null, maxInputCurrentA: null, mpptCount: null, modulesPerUnit: 2 };
    const faces = [
      { name: "South", tiltDeg: 25, azimuthDeg: 180, solarAccessPct: 95 },
      { name: "North", tiltDeg: 25, azimuthDeg: 0, solarAccessPct: 100 },
    ];
    const sys = engineSystem(faces, [12, 0], mod, micro, { inverterCount: 1, lossesPct: 14 });
    expect(sys?.faces).toHaveLength(1);
    expect(sys?.inverter).toEqual({ kind: "micro", acWattsPerModule: 320, efficiencyPct: 96.5 });
    expect(engineSystem(faces, [0, 0], mod, micro, { inverterCount: 1, lossesPct: 14 })).toBeNull();
  });
});
