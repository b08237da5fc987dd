import { describe, expect, it } from "vitest";
import { checkCardFields, luhnValid, outcomeOf } from "./cards";

const now = new Date("2026-06-15T12:00:00Z");
const good = { number: "4242 4242 4242 4242", exp: "12 / 29", cvc: "123", postalCode: "68508" };

describe("Stripe's documented test cards", () => {
  it("4242… succeeds; 0002 is a generic decline; 9995 is insufficient funds; other valid numbers are incorrect_number", () => {
    expect(outcomeOf("4242424242424242")).toBeNull();
    expect(outcomeOf("4000000000000002")).toEqual({ code: "card_declined", declineCode: "generic_decline", message: "Your card was declined." });
    expect(outcomeOf("4000000000009995")).toEqual({ code: "card_declined", declineCode: "insufficient_funds", message: "Your card has insufficient funds." });
    expect(outcomeOf("4111111111111111")).toEqual({ code: "incorrect_number", message: "Your card number is incorrect." });
  });
});

describe("the form's own checks", () => {
  it("accepts a complete card and reads brand, last 4 and expiry", () => {
    const r = checkCardFields(good, now);
    expect(r).toEqual({ ok: true, card: { digits: "4242424242424242", brand: "visa", last4: "4242", expMonth: 12, expYear: 2029, postalCode: "68508" } });
    expect(checkCardFields({ ...good, number: "3782 822463 10005", cvc: "1234" }, now).ok).toBe(true);
  });

  it("names the field that is wrong", () => {
    expect(checkCardFields({ ...good, number: "" }, now)).toMatchObject({ ok: false, field: "number" });
    expect(checkCardFields({ ...good, number: "4242 4242 4242 4241" }, now)).toMatchObject({ ok: false, field: "number", message: "Your card number is incorrect." });
    expect(checkCardFields({ ...good, exp: "13/29" }, now)).toMatchObject({ ok: false, field: "exp" });
    expect(checkCardFields({ ...good, exp: "05/26" }, now)).toMatchObject({ ok: false, field: "exp", message: "Your card's expiry date is in the past." });
    expect(checkCardFields({ ...good, exp: "06/26" }, now).ok).toBe(true); // the current month is still good
    expect(checkCardFields({ ...good, cvc: "12" }, now)).toMatchObject({ ok: false, field: "cvc" });
    expect(checkCardFields({ ...good, number: "378282246310005", cvc: "123" }, now)).toMatchObject({ ok: false, field: "cvc" });
    expect(checkCardFields({ ...good, postalCode: "" }, now)).toMatchObject({ ok: false, field: "postal" });
  });

  it("Luhn", () => {
    expect(luhnValid("4242424242424242")).toBe(true);
    expect(luhnValid("4242424242424241")).toBe(false);
    expect(luhnValid("378282246310005")).toBe(true);
  });
});
