import { describe, expect, it } from "vitest";
import { dollarsToCents, refundPaymentSchema } from "@/lib/schemas/refund";

describe("dollarsToCents", () => {
  it("reads dollars as people type them into integer cents", () => {
    expect(dollarsToCents("250")).toBe(25_000);
    expect(dollarsToCents("250.5")).toBe(25_050);
    expect(dollarsToCents("$1,250.05")).toBe(125_005);
    expect(dollarsToCents(" 0.07 ")).toBe(7);
    expect(dollarsToCents("19.99")).toBe(1_999); // no binary rounding: 19.99 * 100 = 1998.9999…
  });
  it("refuses what is not an amount with at most two decimals", () => {
    for (const bad of ["", "abc", "1.234", "-5", "1e3", "12.3.4"]) expect(dollarsToCents(bad)).toBeNaN();
  });
});

describe("refundPaymentSchema", () => {
  it("names each bad field", () => {
    const r = refundPaymentSchema.safeParse({ amountCents: Number.NaN, reason: " " });
    expect(r.success).toBe(false);
    const fields = r.success ? [] : r.error.issues.map((i) => i.path.join("."));
    expect(fields.sort()).toEqual(["amountCents", "reason"]);
    expect(refundPaymentSchema.safeParse({ amountCents: 0, reason: "Goodwill" }).success).toBe(false);
    expect(refundPaymentSchema.parse({ amountCents: 5_000, reason: "  Goodwill  " })).toEqual({ amountCents: 5_000, reason: "Goodwill" });
  });
});
