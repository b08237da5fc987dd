import { describe, expect, it } from "vitest";
import { billsTableSchema } from "./energy";
import { householdSchema, leadSchema } from "./deal";
import { signUpSchema } from "./people";
import { createCrewSchema } from "./jobs";
import { savedViewCreateSchema } from "./deal-table";
import { numberFromField, plainText, textProblem } from "./text";

describe("textProblem", () => {
  it("passes plain names in any script, with emoji (surrogate pairs) and right-to-left marks", () => {
    for (const name of ["Rivera household", "Zoë Ångström", "محمد الأحمد", "李小龍", "Sunny 🌞 Solar", "O’Brien\u200f"]) expect(textProblem(name)).toBeNull();
  });

  it("names a control character, a lone surrogate, and bidi overrides and isolates", () => {
    expect(textProblem("Bell\u0007")).toMatch(/control character \(U\+0007\)/);
    expect(textProblem("Line\nbreak")).toMatch(/control character \(U\+000A\)/);
    expect(textProblem("C1\u0085")).toMatch(/U\+0085/);
    expect(textProblem("half \ud83d pair")).toMatch(/unpaired surrogate/);
    expect(textProblem("\udc00 low first")).toMatch(/unpaired surrogate/);
    for (const c of ["\u202a", "\u202b", "\u202c", "\u202d", "\u202e", "\u2066", "\u2067", "\u2068", "\u2069"]) {
      expect(textProblem(`Acme ${c}gnp.exe`)).toMatch(/text-direction character/);
    }
  });

  it("lets a multi-line text keep line breaks and tabs, nothing else", () => {
    expect(textProblem("first\r\nsecond\tcolumn", { multiline: true })).toBeNull();
    expect(textProblem("first\u0000", { multiline: true })).toMatch(/U\+0000/);
    expect(textProblem("evil \u202e", { multiline: true })).toMatch(/text-direction/);
  });

  it("plainText refuses with a clear message", () => {
    const r = plainText().safeParse("Acme\u202Egnp.exe");
    expect(r.success).toBe(false);
    expect(r.error?.issues[0].message).toBe("This text contains a text-direction character (U+202E) that makes it display differently than it is stored; remove it");
  });
});

describe("schemas use it for names", () => {
  const household = { name: "Rivera household", contactName: "Ana Rivera", street: "1 Main St", city: "Greensboro", region: "NC", postalCode: "27401", latitude: 36.07, longitude: -79.79 };

  it("household, person, crew and saved-view names refuse hidden characters", () => {
    expect(householdSchema.safeParse(household).success).toBe(true);
    const bad = householdSchema.safeParse({ ...household, contactName: "Ana\u202eavir" });
    expect(bad.error?.issues[0].path).toEqual(["contactName"]);
    expect(signUpSchema.safeParse({ companyName: "Sun\u0000Co", name: "Ann", email: "a@example.com", password: "long-enough-pw" }).error?.issues[0].path).toEqual(["companyName"]);
    expect(createCrewSchema.safeParse({ name: "Crew \u2066A" }).success).toBe(false);
    expect(savedViewCreateSchema.safeParse({ name: "Mine\u0008", query: {} }).error?.issues[0].path).toEqual(["name"]);
  });
});

describe("numbers in JSON are numbers", () => {
  const household = { name: "Rivera household", contactName: "Ana Rivera", street: "1 Main St", city: "Greensboro", region: "NC", postalCode: "27401", latitude: 36.07, longitude: -79.79 };

  it.each([[null], [true], [[]], [""], ["36.07"], [{}]])("latitude %j is refused, never read as 0", (value) => {
    const r = householdSchema.safeParse({ ...household, latitude: value });
    expect(r.success).toBe(false);
    expect(r.error?.issues[0].path).toEqual(["latitude"]);
  });

  it.each([[null], [true], [[]], [""]])("a bill's kWh %j is refused", (value) => {
    const r = billsTableSchema.safeParse({ bills: [{ periodStart: "2026-01-01", periodEnd: "2026-01-31", kwh: value }] });
    expect(r.success).toBe(false);
    expect(r.error?.issues[0].path).toEqual(["bills", 0, "kwh"]);
  });

  it("a saved view's page size must be a number", () => {
    expect(savedViewCreateSchema.safeParse({ name: "Big", query: { pageSize: "25" } }).success).toBe(false);
    expect(savedViewCreateSchema.safeParse({ name: "Big", query: { pageSize: 25 } }).success).toBe(true);
  });

  it("the form turns typed text into a number before the same schema sees it", () => {
    expect(numberFromField(" 36.07 ")).toBe(36.07);
    expect(numberFromField("")).toBeNaN();
    expect(numberFromField(-79.8)).toBe(-79.8);
    expect(leadSchema.safeParse({ ...household, latitude: numberFromField("36.07"), longitude: numberFromField("-79.79"), source: "Referral" }).success).toBe(true);
    expect(householdSchema.safeParse({ ...household, latitude: numberFromField("") }).error?.issues[0].message).toBe("Enter the latitude in degrees");
  });
});
