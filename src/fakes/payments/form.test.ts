import { describe, expect, it } from "vitest";
import { canonicalParams, FormError, parseForm } from "./form";

describe("parseForm (the SDK's form encoding)", () => {
  it("reads nested objects and indexed arrays", () => {
    const body =
      "mode=payment&line_items[0][quantity]=1&line_items[0][price_data][currency]=usd&line_items[0][price_data][product_data][name]=Deposit%20%26%20fees" +
      "&line_items[1][quantity]=2&metadata[dealId]=d-1&payment_intent_data[metadata][dealId]=d-1&expand[0]=payment_intent";
    expect(parseForm(body)).toEqual({
      mode: "payment",
      line_items: [
        { quantity: "1", price_data: { currency: "usd", product_data: { name: "Deposit & fees" } } },
        { quantity: "2" },
      ],
      metadata: { dealId: "d-1" },
      payment_intent_data: { metadata: { dealId: "d-1" } },
      expand: ["payment_intent"],
    });
  });

  it("accepts encoded brackets, `+` for spaces, `[]` appends and empty values", () => {
    expect(parseForm("a%5Bb%5D=1&name=Ada+Lovelace&types[]=x&types[]=y&empty=")).toEqual({
      a: { b: "1" },
      name: "Ada Lovelace",
      types: ["x", "y"],
      empty: "",
    });
    expect(parseForm("")).toEqual({});
  });

  it("orders array entries by index, not by arrival", () => {
    expect(parseForm("l[1]=b&l[0]=a&l[10]=c")).toEqual({ l: ["a", "b", "c"] });
  });

  it("refuses prototype keys, clashing shapes and bad encodings", () => {
    expect(() => parseForm("__proto__[x]=1")).toThrow(FormError);
    expect(() => parseForm("a[constructor]=1")).toThrow(FormError);
    expect(() => parseForm("a=1&a[b]=2")).toThrow(FormError);
    expect(() => parseForm("a[b]=1&a=2")).toThrow(FormError);
    expect(() => parseForm("a=%E0%A4%A")).toThrow(FormError);
    expect(() => parseForm("a[b=1")).toThrow(FormError);
    expect(({} as Record<string, unknown>).x).toBeUndefined();
  });

  it("canonical text ignores key order", () => {
    expect(canonicalParams(parseForm("a=1&b[y]=2&b[x]=3"))).toBe(canonicalParams(parseForm("b[x]=3&a=1&b[y]=2")));
    expect(canonicalParams(parseForm("a=1"))).not.toBe(canonicalParams(parseForm("a=2")));
  });
});
