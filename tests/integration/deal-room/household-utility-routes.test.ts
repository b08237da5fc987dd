// The Household tab's two saves through their route handlers (PUT /api/deals/<id>/household and
// /utility) and the new-lead route, signed in through better-auth: a bad body is refused naming
// the field (a site without a real position above all), a role without deals:write is refused,
// and another company's (or another rep's) deal is not found.
import { eq } from "drizzle-orm";
import { NextRequest } from "next/server";
import { beforeAll, describe, expect, it } from "vitest";
import { deal, household } from "@/db/schema";
import { createLead } from "@/server/deals";
import { db } from "@/server/db";
import { createRatePlan } from "@/server/rate-plans";
import type { Member } from "@/server/session";
import { addMember, newCompany, newUtility } from "../support/fixtures";
import { signedInHeaders } from "../support/sign-in";
import { labelOf } from "@/lib/validation-messages";

type Route = (req: NextRequest, ctx: { params: Promise<{ id: string }> }) => Promise<Response>;
type ErrorBody = { error: { code: string; message: string; fields?: Record<string, string[]> } };

let owner: Member;
let dealId: string;
let householdId: string;
const as = new Map<string, Record<string, string>>();
let householdRoute: Route;
let utilityRoute: Route;

const home = {
  name: "Routewell household",
  contactName: "Rory Routewell",
  email: "rory@example.com",
  street: "4 Handler Road",
  city: "Greensboro",
  region: "NC",
  postalCode: "27405",
  latitude: 36.1,
  longitude: -79.8,
};

function put(route: Route, who: string, id: string, body: string): Promise<Response> {
  const headers = { ...as.get(who), "content-type": "application/json" };
  const req = new NextRequest(`http://localhost/api/deals/${id}/x`, { method: "PUT", headers, body });
  return route(req, { params: Promise.resolve({ id }) });
}
const putJson = (route: Route, who: string, id: string, body: unknown) => put(route, who, id, JSON.stringify(body));

async function refusedNaming(res: Response, field: string): Promise<void> {
  expect(res.status).toBe(422);
  const body = (await res.json()) as ErrorBody;
  expect(body.error.code).toBe("validation_failed");
  expect(Object.keys(body.error.fields ?? {})).toContain(field);
  // The message names the field in words, never by its dotted path.
  expect(body.error.message.startsWith(labelOf(field))).toBe(true);
}

const storedHousehold = async () => (await db().select().from(household).where(eq(household.id, householdId)))[0];
const storedDeal = async () => (await db().select().from(deal).where(eq(deal.id, dealId)))[0];

beforeAll(async () => {
  householdRoute = (await import("@/app/api/deals/[id]/household/route")).PUT as Route;
  utilityRoute = (await import("@/app/api/deals/[id]/utility/route")).PUT as Route;
  owner = await newCompany("Household Route Solar");
  const rep = await addMember(owner, "sales_rep", "Reese Rep");
  const otherRep = await addMember(owner, "sales_rep", "Otto Otherrep");
  const crew = await addMember(owner, "crew", "Cory Crew");
  const stranger = await newCompany("Elsewhere Solar");
  for (const [who, m] of Object.entries({ owner, rep, otherRep, crew, stranger })) as.set(who, await signedInHeaders(m));
  ({ dealId, householdId } = await createLead(rep, { ...home, source: "Referral", ratePlanId: "" }));
});

describe("PUT /api/deals/<id>/household", () => {
  it("saves the household for the deal's rep and the office", async () => {
    const res = await putJson(householdRoute, "rep", dealId, { ...home, phone: "336-555-0101" });
    expect(res.status).toBe(200);
    expect(((await res.json()) as { data: { dealId: string } }).data.dealId).toBe(dealId);
    expect((await storedHousehold()).phone).toBe("336-555-0101");
    expect((await putJson(householdRoute, "owner", dealId, { ...home, city: "High Point" })).status).toBe(200);
    expect((await storedHousehold()).city).toBe("High Point");
  });

  it("keeps the homeowner's language: English for a new household, the rep's choice when saved, unchanged when left out", async () => {
    expect((await storedHousehold()).language).toBe("en");
    expect((await putJson(householdRoute, "rep", dealId, { ...home, language: "es" })).status).toBe(200);
    expect((await storedHousehold()).language).toBe("es");
    expect((await putJson(householdRoute, "rep", dealId, home)).status).toBe(200);
    expect((await storedHousehold()).language).toBe("es");
    await refusedNaming(await putJson(householdRoute, "rep", dealId, { ...home, language: "fr" }), "language");
    expect((await storedHousehold()).language).toBe("es");
    expect((await putJson(householdRoute, "rep", dealId, { ...home, language: "en" })).status).toBe(200);
    expect((await storedHousehold()).language).toBe("en");
  });

  it("refuses a bad body naming the field (422), and malformed JSON (400), saving nothing", async () => {
    await refusedNaming(await putJson(householdRoute, "owner", dealId, { ...home, name: "x" }), "name");
    await refusedNaming(await putJson(householdRoute, "owner", dealId, { ...home, latitude: "36.1" }), "latitude");
    const malformed = await put(householdRoute, "owner", dealId, "{ not json");
    expect(malformed.status).toBe(400);
    expect(((await malformed.json()) as ErrorBody).error.code).toBe("invalid_json");
    expect((await storedHousehold()).name).toBe(home.name);
  });

  it("refuses a role without deals:write (403)", async () => {
    const res = await putJson(householdRoute, "crew", dealId, { ...home, name: "Crew was here" });
    expect(res.status).toBe(403);
    expect((await storedHousehold()).name).toBe(home.name);
  });

  it("answers 404 for another company's deal and for another rep's deal, changing nothing", async () => {
    for (const who of ["stranger", "otherRep"]) {
      const res = await putJson(householdRoute, who, dealId, { ...home, name: `Taken by ${who}` });
      expect(res.status).toBe(404);
    }
    expect((await putJson(householdRoute, "owner", "not-a-uuid", home)).status).toBe(404);
    expect((await storedHousehold()).name).toBe(home.name);
  });
});

describe("coordinates are required and real", () => {
  it("refuses a lead or household without a usable position, naming the reason, and stores nothing", async () => {
    const leadRoute = (await import("@/app/api/deals/route")).POST as unknown as Route;
    const postLead = (body: unknown) =>
      leadRoute(new NextRequest("http://localhost/api/deals", { method: "POST", headers: { ...as.get("rep"), "content-type": "application/json" }, body: JSON.stringify(body) }), { params: Promise.resolve({ id: "" }) });
    const lead = { ...home, name: "Nowhere household", source: "Referral" };
    const reasons: [unknown, RegExp][] = [
      [{ ...lead, latitude: null }, /Enter the latitude/],
      [{ ...lead, latitude: 0, longitude: 0 }, /0, 0 is open sea/],
      [{ ...lead, latitude: 136.1 }, /between −90 and 90/],
      // A dropped minus sign puts a Greensboro house in China: refused against the ZIP.
      [{ ...lead, longitude: 79.8 }, /km from ZIP 27405 \(Greensboro, NC\)/],
    ];
    for (const [body, reason] of reasons) {
      const res = await postLead(body);
      expect(res.status).toBe(422);
      const error = ((await res.json()) as ErrorBody).error;
      expect(Object.keys(error.fields ?? {})).toContain("latitude");
      expect(error.fields?.latitude?.[0] ?? "").toMatch(reason);
    }
    expect(await db().select().from(household).where(eq(household.name, "Nowhere household"))).toEqual([]);
    expect((await postLead(lead)).status).toBe(201);

    await refusedNaming(await putJson(householdRoute, "rep", dealId, { ...home, latitude: 0, longitude: 0 }), "latitude");
    await refusedNaming(await putJson(householdRoute, "rep", dealId, { ...home, latitude: -79.8, longitude: 36.1 }), "latitude");
    expect(await storedHousehold()).toMatchObject({ latitude: home.latitude, longitude: home.longitude });
  });
});

describe("PUT /api/deals/<id>/utility", () => {
  it("sets the utility and one of its plans, and clears them", async () => {
    const utilityId = await newUtility(owner, "Route Electric");
    const plan = await createRatePlan(owner, {
      utilityId,
      active: true,
      plan: { name: "Flat route", fixedMonthlyCents: 1000, energy: { kind: "flat", centsPerKwh: 14 }, compensation: { kind: "net-metering" } },
    });
    expect((await putJson(utilityRoute, "rep", dealId, { utilityId, ratePlanId: plan.id })).status).toBe(200);
    expect(await storedDeal()).toMatchObject({ utilityId, ratePlanId: plan.id });
    expect((await putJson(utilityRoute, "rep", dealId, { utilityId: "", ratePlanId: "" })).status).toBe(200);
    expect(await storedDeal()).toMatchObject({ utilityId: null, ratePlanId: null });
    // A plan alone names its utility.
    expect((await putJson(utilityRoute, "rep", dealId, { utilityId: "", ratePlanId: plan.id })).status).toBe(200);
    expect(await storedDeal()).toMatchObject({ utilityId, ratePlanId: plan.id });
    expect((await putJson(utilityRoute, "rep", dealId, { utilityId: "", ratePlanId: "" })).status).toBe(200);
  });

  it("refuses a malformed id, another company's utility or plan, and a plan of another utility, naming the field", async () => {
    const ours = await newUtility(owner, "Our Electric");
    const neighbour = await newUtility(owner, "Neighbour Electric");
    const neighbourPlan = await createRatePlan(owner, {
      utilityId: neighbour,
      active: true,
      plan: { name: "Neighbour flat", fixedMonthlyCents: 900, energy: { kind: "flat", centsPerKwh: 12 }, compensation: { kind: "net-metering" } },
    });
    await refusedNaming(await putJson(utilityRoute, "owner", dealId, { utilityId: ours, ratePlanId: "plan-7" }), "ratePlanId");
    const res = await putJson(utilityRoute, "owner", dealId, { utilityId: ours, ratePlanId: neighbourPlan.id });
    expect(((await res.clone().json()) as ErrorBody).error.fields?.ratePlanId).toEqual(["This plan belongs to Neighbour Electric: pick one of the household's utility's plans"]);
    await refusedNaming(res, "ratePlanId");
    const elsewhere = await newCompany("Plan Owner Solar");
    const theirUtility = await newUtility(elsewhere, "Their Electric");
    const theirs = await createRatePlan(elsewhere, {
      utilityId: theirUtility,
      active: true,
      plan: { name: "Theirs", fixedMonthlyCents: 900, energy: { kind: "flat", centsPerKwh: 12 }, compensation: { kind: "net-metering" } },
    });
    await refusedNaming(await putJson(utilityRoute, "owner", dealId, { utilityId: "", ratePlanId: theirs.id }), "ratePlanId");
    await refusedNaming(await putJson(utilityRoute, "owner", dealId, { utilityId: theirUtility, ratePlanId: "" }), "utilityId");
    await refusedNaming(await putJson(utilityRoute, "owner", dealId, { utilityId: 7, ratePlanId: "" }), "utilityId");
    expect(await storedDeal()).toMatchObject({ utilityId: null, ratePlanId: null });
  });

  it("refuses a crew member (403) and another company (404)", async () => {
    const utilityId = await newUtility(owner, "Crew Power");
    expect((await putJson(utilityRoute, "crew", dealId, { utilityId, ratePlanId: "" })).status).toBe(403);
    expect((await putJson(utilityRoute, "stranger", dealId, { utilityId, ratePlanId: "" })).status).toBe(404);
    expect((await storedDeal()).utilityId).toBeNull();
  });
});
