// Inputs mean what they say, through the real route handlers: null, true, [] or "" where a
// JSON body needs a number is a 422 naming the field (never read as 0) and nothing is saved;
// names with hidden characters (controls, bidi overrides) are refused the same way.
import { and, eq } from "drizzle-orm";
import { NextRequest } from "next/server";
import { beforeAll, describe, expect, it } from "vitest";
import { bill, crew, deal, household, savedView, user } from "@/db/schema";
import { auth } from "@/server/auth";
import { db } from "@/server/db";
import type { Member } from "@/server/session";
import { newCompany } from "../support/fixtures";
import { signedInHeaders } from "../support/sign-in";
import { labelOf } from "@/lib/validation-messages";

let owner: Member;
let headers: Record<string, string>;
let dealId: string;

const json = (url: string, method: string, body: unknown) =>
  new NextRequest(`http://localhost${url}`, { method, body: JSON.stringify(body), headers: { ...headers, "content-type": "application/json" } });

async function refused(res: Response, field: string) {
  expect(res.status).toBe(422);
  const body = (await res.json()) as { error: { code: string; message: string; fields: Record<string, string[]> } };
  expect(body.error.code).toBe("validation_failed");
  expect(Object.keys(body.error.fields)).toContain(field);
  // The message names the field in words, never by its dotted path.
  expect(body.error.message.startsWith(labelOf(field))).toBe(true);
}

const lead = { name: "Strict household", contactName: "Sam Strict", street: "2 Exact Way", city: "Testville", region: "NC", postalCode: "27000", latitude: 36.1, longitude: -79.8, source: "Referral" };
const NOT_NUMBERS: [string, unknown][] = [
  ["null", null],
  ["true", true],
  ["[]", []],
  ['""', ""],
];

beforeAll(async () => {
  owner = await newCompany("Strict Input Solar");
  headers = await signedInHeaders(owner);
  const householdId = crypto.randomUUID();
  dealId = crypto.randomUUID();
  await db().insert(household).values({ id: householdId, companyId: owner.companyId, name: "Billed household", street: "3 Meter Row", city: "Testville", region: "NC", postalCode: "27000", latitude: 36, longitude: -79.8 });
  await db().insert(deal).values({ id: dealId, companyId: owner.companyId, householdId, ownerUserId: owner.userId, stage: "lead", source: "Referral" });
});

describe.each(NOT_NUMBERS)("%s where a number belongs", (_label, value) => {
  it("POST /api/deals: a latitude is refused and no lead is created", async () => {
    const { POST } = await import("@/app/api/deals/route");
    const before = await db().select({ id: household.id }).from(household).where(eq(household.companyId, owner.companyId));
    await refused(await POST(json("/api/deals", "POST", { ...lead, latitude: value }), { params: Promise.resolve({}) }), "latitude");
    const after = await db().select({ id: household.id }).from(household).where(eq(household.companyId, owner.companyId));
    expect(after.length).toBe(before.length);
  });

  it("PUT /api/deals/[id]/bills: a bill's kWh is refused and no bill is saved", async () => {
    const { PUT } = await import("@/app/api/deals/[id]/bills/route");
    const res = await PUT(json(`/api/deals/${dealId}/bills`, "PUT", { bills: [{ periodStart: "2026-01-01", periodEnd: "2026-01-31", kwh: value, costCents: 12_000 }] }), { params: Promise.resolve({ id: dealId }) });
    await refused(res, "bills.0.kwh");
    expect(await db().select({ id: bill.id }).from(bill).where(eq(bill.dealId, dealId))).toHaveLength(0);
  });

  it("POST /api/saved-views: a page size is refused and no view is saved", async () => {
    const { POST } = await import("@/app/api/saved-views/route");
    await refused(await POST(json("/api/saved-views", "POST", { name: `Strict ${_label}`, query: { pageSize: value } }), { params: Promise.resolve({}) }), "query.pageSize");
    expect(await db().select({ id: savedView.id }).from(savedView).where(and(eq(savedView.companyId, owner.companyId), eq(savedView.name, `Strict ${_label}`)))).toHaveLength(0);
  });
});

describe("names with hidden characters", () => {
  it.each([
    ["a right-to-left override", "Crew \u202Eevil"],
    ["a first-strong isolate", "Crew \u2068A"],
    ["a control character", "Crew\u0007"],
    ["a lone surrogate", "Crew \uD83D"],
  ])("POST /api/crews refuses %s and saves nothing", async (_what, name) => {
    const { POST } = await import("@/app/api/crews/route");
    await refused(await POST(json("/api/crews", "POST", { name }), { params: Promise.resolve({}) }), "name");
    expect(await db().select({ id: crew.id }).from(crew).where(and(eq(crew.companyId, owner.companyId), eq(crew.name, name)))).toHaveLength(0);
  });

  it("a plain name in another script is kept", async () => {
    const { POST } = await import("@/app/api/crews/route");
    const res = await POST(json("/api/crews", "POST", { name: "فريق الشمال" }), { params: Promise.resolve({}) });
    expect(res.status).toBe(201);
  });
});

describe("names reaching better-auth directly", () => {
  it("update-user refuses a bidi override in the person's name and keeps the old one", async () => {
    const res = await auth().api.updateUser({ body: { name: "Olive \u202Eenilo" }, headers: new Headers(headers), asResponse: true });
    expect(res.status).toBe(400);
    expect(((await res.json()) as { message: string }).message).toMatch(/text-direction character \(U\+202E\)/);
    const [row] = await db().select({ name: user.name }).from(user).where(eq(user.id, owner.userId));
    expect(row.name).toBe("Olive Owner");
  });
});
