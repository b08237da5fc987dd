// PATCH /api/companies/[id], the route Settings → Company saves through: only a member with
// company:manage, only their own company (another id is 404), and a bad field is a 422 naming it
// with nothing saved.
import { NextRequest } from "next/server";
import { beforeAll, describe, expect, it } from "vitest";
import { DEFAULT_STALL_SETTINGS } from "@/lib/schemas/company-settings";
import { getCompanySettings } from "@/server/company-settings";
import type { Member } from "@/server/session";
import { addMember, newCompany } from "../support/fixtures";
import { signedInHeaders } from "../support/sign-in";

let owner: Member;
let rep: Member;
let stranger: Member;

const patch = (headers: Record<string, string>, id: string, body: unknown) =>
  new NextRequest(`http://localhost/api/companies/${id}`, { method: "PATCH", body: JSON.stringify(body), headers: { ...headers, "content-type": "application/json" } });

const form = (over: Record<string, unknown> = {}) => ({
  name: "Route Settings Solar",
  licenseNumber: "RS-77",
  timeZone: "America/Chicago",
  stallDays: Object.fromEntries(Object.entries(DEFAULT_STALL_SETTINGS).map(([k, v]) => [k, v == null ? "" : String(v)])),
  ...over,
});

async function send(m: Member, id: string, body: unknown) {
  const { PATCH } = await import("@/app/api/companies/[id]/route");
  return PATCH(patch(await signedInHeaders(m), id, body), { params: Promise.resolve({ id }) });
}

beforeAll(async () => {
  owner = await newCompany("Route Settings Solar");
  rep = await addMember(owner, "sales_rep", "Rae Rep");
  stranger = await newCompany("Other Route Solar");
});

describe("PATCH /api/companies/[id]", () => {
  it("saves the owner's settings and answers with them", async () => {
    const res = await send(owner, owner.companyId, form({ stallDays: { ...form().stallDays, permitting: "40" } }));
    expect(res.status).toBe(200);
    const body = (await res.json()) as { data: { name: string; licenseNumber: string; timeZone: string; stallDays: Record<string, number | null> } };
    expect(body.data).toMatchObject({ name: "Route Settings Solar", licenseNumber: "RS-77", timeZone: "America/Chicago" });
    expect(body.data.stallDays.permitting).toBe(40);
    expect((await getCompanySettings(owner.companyId)).timeZone).toBe("America/Chicago");
  });

  it("refuses a sales rep (403) and changes nothing", async () => {
    const res = await send(rep, owner.companyId, form({ name: "Renamed by a rep" }));
    expect(res.status).toBe(403);
    expect((await getCompanySettings(owner.companyId)).name).toBe("Route Settings Solar");
  });

  it("answers 404 for another company's id", async () => {
    const res = await send(owner, stranger.companyId, form({ name: "Taken over" }));
    expect(res.status).toBe(404);
    expect((await getCompanySettings(stranger.companyId)).name).toBe("Other Route Solar");
  });

  it("names the bad field (422) and saves nothing", async () => {
    const res = await send(owner, owner.companyId, form({ name: "Should not stick", stallDays: { ...form().stallDays, survey: "366" } }));
    expect(res.status).toBe(422);
    const body = (await res.json()) as { error: { code: string; message: string; fields: Record<string, string[]> } };
    expect(body.error.code).toBe("validation_failed");
    expect(Object.keys(body.error.fields)).toEqual(["stallDays.survey"]);
    expect(body.error.message).toMatch(/^Survey: Whole days from 1 to 365/);
    expect((await getCompanySettings(owner.companyId)).name).toBe("Route Settings Solar");
  });
});
