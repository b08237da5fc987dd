import { describe, expect, it } from "vitest";
import { figureDefinitions } from "@/lib/figure-definitions";

const assumptions = { years: 25, degradationPctPerYear: 0.5, utilityEscalationPctPerYear: 2.5 };
const summary = {
  paybackYears: 9.4,
  simplePaybackYears: 8.75,
  roiBasisCents: 875_000,
  downPaymentCents: null,
  lifetimeSavingsCents: 1_095_000,
  irr: 0.061,
  irrNote: null,
  netCostCents: 875_000,
};

describe("figureDefinitions", () => {
  it("cash: payback with escalation and degradation, ROI over the net price, simple payback", () => {
    const d = figureDefinitions({ summary, assumptions }, "cash");
    expect(d.payback).toBe(
      "Payback is the year in which the running total of bill savings, incentives and what you pay turns positive (electricity prices rising 2.5 % a year, panel output falling 0.5 % a year).",
    );
    expect(d.roi).toBe("Simple ROI = (bill savings over 25 years − what you pay) ÷ what you pay. What you pay: $8,750, the cash price after the incentives and credits.");
    expect(d.simplePayback).toBe("Simple payback (net cost ÷ first-year savings, without price rises or panel wear): 8.8 years.");
    expect(d.irr).toBeNull();
  });

  it("loan: ROI's denominator is the down payment plus the loan payments; IRR's reason when it has none", () => {
    const d = figureDefinitions(
      { summary: { ...summary, roiBasisCents: 1_612_345, downPaymentCents: 250_000, irr: null, irrNote: "not meaningful: the cash flows never turn positive" }, assumptions },
      "loan",
    );
    expect(d.payback).toContain("loan payments as they fall due");
    expect(d.roi).toContain("What you pay: $16,123, the $2,500 down payment plus all the loan's payments, less incentives paid back to you later.");
    expect(d.irr).toBe("IRR not meaningful: the cash flows never turn positive.");
  });

  it("says when the first year saves nothing, and leaves out a simple payback older figures lack", () => {
    expect(figureDefinitions({ summary: { ...summary, simplePaybackYears: null }, assumptions }, "cash").simplePayback).toBe(
      "Simple payback (net cost ÷ first-year savings): none, as the first year saves nothing.",
    );
    expect(figureDefinitions({ summary: { ...summary, simplePaybackYears: undefined, roiBasisCents: undefined }, assumptions }, "cash").simplePayback).toBeNull();
  });
});
