import { describe, expect, it } from "vitest";
import { billYear, compareBills, makeBillCalculator, ratePlanSchema, touPeriodByHour, type RatePlanInput } from "./rates";
import { EngineInputError } from "./errors";
import { HOUR_MONTH } from "./year-calendar";

// All cases are hand-worked (our own arithmetic, written beside each expectation).
const constantUsage = new Array<number>(8760).fill(1); // 1 kWh every hour: Jan 744 kWh, Feb 672, Apr 720
const flat: RatePlanInput = { name: "flat", fixedMonthlyCents: 1000, energy: { kind: "flat", centsPerKwh: 15 }, compensation: { kind: "no-export" } };

/** Production of `perHour[m]` kWh in every hour of month m. */
function monthlyConstantProduction(perHour: number[]): number[] {
  return Array.from({ length: 8760 }, (_, h) => perHour[HOUR_MONTH[h]]);
}
/** Summer (May–Aug) 1.5 kWh/h → 0.5 kWh/h exported; other months 0.9 kWh/h → 0.1 kWh/h imported. */
const seasonalProduction = monthlyConstantProduction([0.9, 0.9, 0.9, 0.9, 1.5, 1.5, 1.5, 1.5, 0.9, 0.9, 0.9, 0.9]);
/** January only: 2 kWh in hours 10–13 each day, 0 otherwise (so 4 h/day export 1 kWh, 20 h/day import 1 kWh). */
const middayProduction = Array.from({ length: 8760 }, (_, h) => (HOUR_MONTH[h] === 0 && h % 24 >= 10 && h % 24 < 14 ? 2 : 0));

describe("energy charges", () => {
  it("flat: January = 744 kWh × 15 ¢ + $10 fixed = $121.60", () => {
    const bill = billYear({ plan: flat, usageHourlyKwh: constantUsage });
    expect(bill.months[0].totalCents).toBe(744 * 15 + 1000);
    expect(bill.months[1].totalCents).toBe(672 * 15 + 1000);
    // Year: 8760 × 15 + 12 × 1000 = 143,400 ¢
    expect(bill.totalCents).toBe(143_400);
  });

  it("tiered: January 744 kWh = 500 × 10 ¢ + 244 × 20 ¢ = 9,880 ¢", () => {
    const plan: RatePlanInput = {
      name: "tiered",
      energy: { kind: "tiered", tiers: [{ upToKwh: 500, centsPerKwh: 10 }, { upToKwh: null, centsPerKwh: 20 }] },
      compensation: { kind: "no-export" },
    };
    const jan = billYear({ plan, usageHourlyKwh: constantUsage }).months[0];
    expect(jan.lines.map((l) => [l.label, l.kwh, l.amountCents])).toEqual([
      ["tier 1", 500, 5000],
      ["tier 2", 244, 4880],
    ]);
    expect(jan.totalCents).toBe(9880);
  });

  it("time-of-use: January 2023 has 22 weekdays → peak 22 × 5 h = 110 kWh", () => {
    // 1 Jan 2023 was a Sunday; weekends: 1, 7, 8, 14, 15, 21, 22, 28, 29 → 9 days; weekdays 22.
    // Peak (weekdays 16:00–21:00) 110 kWh × 40 ¢ = 4,400; off-peak 744 − 110 = 634 kWh × 10 ¢ = 6,340 → 10,740 ¢.
    // July 2023 (summer season, peak 50 ¢): 21 weekdays → 105 kWh × 50 = 5,250; 639 kWh × 12 ¢ = 7,668 → 12,918 ¢.
    const plan: RatePlanInput = {
      name: "tou",
      energy: {
        kind: "tou",
        periods: [
          { id: "peak", centsPerKwh: 40 },
          { id: "off", centsPerKwh: 10 },
          { id: "summer-peak", centsPerKwh: 50 },
          { id: "summer-off", centsPerKwh: 12 },
        ],
        seasons: [
          { name: "winter", months: [1, 2, 3, 4, 5, 10, 11, 12], otherHoursPeriodId: "off", weekday: [{ startHour: 16, endHour: 21, periodId: "peak" }] },
          { name: "summer", months: [6, 7, 8, 9], otherHoursPeriodId: "summer-off", weekday: [{ startHour: 16, endHour: 21, periodId: "summer-peak" }] },
        ],
      },
      compensation: { kind: "no-export" },
    };
    const bill = billYear({ plan, usageHourlyKwh: constantUsage, calendarYear: 2023 });
    expect(bill.months[0].totalCents).toBe(10_740);
    expect(bill.months[6].totalCents).toBe(12_918);
  });

  it("time-of-use: hour ranges can wrap past midnight", () => {
    const parsed = ratePlanSchema.parse({
      name: "night",
      energy: {
        kind: "tou",
        periods: [{ id: "day", centsPerKwh: 20 }, { id: "night", centsPerKwh: 8 }],
        seasons: [
          {
            name: "all",
            months: [1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12],
            otherHoursPeriodId: "day",
            weekday: [{ startHour: 22, endHour: 6, periodId: "night" }],
            weekend: [{ startHour: 22, endHour: 6, periodId: "night" }],
          },
        ],
      },
      compensation: { kind: "no-export" },
    });
    if (parsed.energy.kind !== "tou") throw new Error("unreachable");
    const byHour = touPeriodByHour(parsed.energy);
    expect(Array.from(byHour.slice(0, 24))).toEqual([1, 1, 1, 1, 1, 1, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 1, 1]);
  });

  it("minimum bill: 7.44 kWh × 15 ¢ = 112 ¢ + 500 fixed = 612 < 1,000 → top-up 388", () => {
    const plan: RatePlanInput = { ...flat, fixedMonthlyCents: 500, minimumBillCents: 1000 };
    const jan = billYear({ plan, usageHourlyKwh: new Array(8760).fill(0.01) }).months[0];
    expect(jan.lines.find((l) => l.kind === "minimum-bill")?.amountCents).toBe(388);
    expect(jan.totalCents).toBe(1000);
  });
});

describe("compensation", () => {
  it("net metering: monthly netting, credits carried forward, annual true-up at the surplus rate", () => {
    // Flat 15 ¢, $10 fixed, true-up in December, surplus 3 ¢/kWh.
    // Jan 74.4 kWh net import → 1,116 + 1,000 = 2,116; Feb 67.2 → 1,008 + 1,000 = 2,008; Mar 2,116; Apr 72 → 2,080.
    // May–Aug export 372, 360, 372, 372 kWh → credits 5,580 + 5,400 + 5,580 + 5,580 = 22,140 ¢; bills 1,000 each.
    // Sep–Dec energy 1,080 + 1,116 + 1,080 + 1,116 = 4,392 paid from credit → bills 1,000 each; 17,748 ¢ left.
    // True-up: exports 2,952 h × 0.5 = 1,476 kWh − imports 5,808 h × 0.1 = 580.8 kWh
    //   = 895.2 kWh × 3 ¢ = 2,685.6 → 2,686 ¢ paid; 17,748 ¢ lapses.
    //   (An earlier hand count used 581.2 kWh of imports; the 8 non-summer months have
    //   8760 − 123 × 24 = 5,808 hours, so 580.8 is right.)
    // December: 1,000 fixed − 2,686 = −1,686.
    // Year: 2,116 + 2,008 + 2,116 + 2,080 + 8 × 1,000 − 2,686 = 13,634 ¢.
    const plan: RatePlanInput = { ...flat, compensation: { kind: "net-metering", trueUpMonth: 12, surplusCentsPerKwh: 3 } };
    const bill = billYear({ plan, usageHourlyKwh: constantUsage, productionHourlyKwh: seasonalProduction });
    expect(bill.months.map((m) => m.totalCents)).toEqual([2116, 2008, 2116, 2080, 1000, 1000, 1000, 1000, 1000, 1000, 1000, -1686]);
    expect(bill.months[7].creditCarriedCents).toBe(22_140);
    expect(bill.months[11].lines.find((l) => l.kind === "true-up")?.amountCents).toBe(-2686);
    expect(bill.months[11].creditCarriedCents).toBe(0);
    expect(bill.totalCents).toBe(13_634);
  });

  it("net metering: the cycle starts after the true-up month", () => {
    // True-up in April: the May–Aug credits (22,140) pay Sep–Apr energy (4,392 + 1,116 + 1,008 + 1,116 + 1,080 = 8,712).
    const plan: RatePlanInput = { ...flat, compensation: { kind: "net-metering", trueUpMonth: 4, surplusCentsPerKwh: 3 } };
    const bill = billYear({ plan, usageHourlyKwh: constantUsage, productionHourlyKwh: seasonalProduction });
    expect(bill.months.slice(0, 3).map((m) => m.totalCents)).toEqual([1000, 1000, 1000]);
    // April: 1,000 fixed − 2,686 true-up (same 895.2 kWh surplus × 3 ¢) = −1,686
    expect(bill.months[3].totalCents).toBe(-1686);
  });

  it("net metering nets the month; net billing credits each hour's export at the export rate; no export pays 0", () => {
    const usage = constantUsage;
    // January: imports 20 kWh/day × 31 = 620 kWh; exports 4 kWh/day × 31 = 124 kWh.
    const nm = billYear({ plan: { ...flat, fixedMonthlyCents: 0, compensation: { kind: "net-metering" } }, usageHourlyKwh: usage, productionHourlyKwh: middayProduction });
    // Net metering: (620 − 124) = 496 kWh × 15 = 7,440 ¢
    expect(nm.months[0].totalCents).toBe(7440);
    const nb = billYear({
      plan: { ...flat, fixedMonthlyCents: 0, compensation: { kind: "net-billing", exportCentsPerKwh: 5 } },
      usageHourlyKwh: usage,
      productionHourlyKwh: middayProduction,
    });
    // Net billing: 620 × 15 = 9,300 − 124 × 5 = 620 credit → 8,680 ¢
    expect(nb.months[0].totalCents).toBe(8680);
    const none = billYear({ plan: { ...flat, fixedMonthlyCents: 0 }, usageHourlyKwh: usage, productionHourlyKwh: middayProduction });
    // No export: 620 × 15 = 9,300 ¢
    expect(none.months[0].totalCents).toBe(9300);
  });

  it("net billing: credits carry forward and lapse at the true-up month", () => {
    // May–Aug exports × 5 ¢ = 1,860 + 1,800 + 1,860 + 1,860 = 7,380; Sep–Dec use 4,392; 2,988 lapses in December.
    const plan: RatePlanInput = { ...flat, compensation: { kind: "net-billing", exportCentsPerKwh: 5, trueUpMonth: 12 } };
    const bill = billYear({ plan, usageHourlyKwh: constantUsage, productionHourlyKwh: seasonalProduction });
    expect(bill.months[7].creditCarriedCents).toBe(7380);
    expect(bill.months[11].lines.find((l) => l.kind === "credit-lapsed")?.label).toContain("$29.88");
    expect(bill.totalCents).toBe(2116 + 2008 + 2116 + 2080 + 8 * 1000);
  });

  it("compareBills gives the savings; a bill calculator reuses a validated plan", () => {
    const result = compareBills({ plan: flat, usageHourlyKwh: constantUsage, productionHourlyKwh: middayProduction });
    expect(result.withoutSolar.months[0].totalCents - result.withSolar.months[0].totalCents).toBe(744 * 15 - 620 * 15);
    expect(result.annualSavingsCents).toBe(124 * 15);
    const calc = makeBillCalculator(flat);
    expect(calc(constantUsage, middayProduction).totalCents).toBe(result.withSolar.totalCents);
  });
});

describe("validation", () => {
  it("names bad plan fields", () => {
    try {
      billYear({
        plan: {
          name: "bad",
          energy: {
            kind: "tou",
            periods: [{ id: "a", centsPerKwh: 10 }],
            seasons: [{ name: "s", months: [1, 2, 3], otherHoursPeriodId: "zz" }],
          },
          compensation: { kind: "no-export" },
        },
        usageHourlyKwh: constantUsage,
      });
      throw new Error("expected failure");
    } catch (e) {
      expect(e).toBeInstanceOf(EngineInputError);
      const paths = (e as EngineInputError).issues.map((i) => i.path);
      expect(paths).toContain("plan.energy.seasons.0.otherHoursPeriodId");
      expect((e as EngineInputError).issues.some((i) => i.message.includes("month 4 is in no season"))).toBe(true);
    }
  });

  it("rejects a short usage series", () => {
    expect(() => billYear({ plan: flat, usageHourlyKwh: [1, 2, 3] })).toThrow(EngineInputError);
  });

  it("the bill calculator names the series of the wrong length", () => {
    const calc = makeBillCalculator(flat);
    expect(() => calc(constantUsage, [1, 2])).toThrow(/productionHourlyKwh: must have 8760 values, got 2/);
  });
});
