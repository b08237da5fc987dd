// The created-date filters of the deals table, its CSV export and the board are calendar days
// as the company's clock reads them. A company in Honolulu (UTC−10, no daylight saving) has
// deals created just either side of its midnight, where the UTC date is already the next day.
import { eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { company, deal, household } from "@/db/schema";
import { dealTableQuerySchema } from "@/lib/schemas/deal-table";
import { storedCompanySettingsSchema } from "@/lib/schemas/company-settings";
import { db } from "@/server/db";
import { dealTableChunks, dealTablePage } from "@/server/deal-table";
import type { Member } from "@/server/session";
import { listBoardDeals } from "@/server/stages";
import { newCompany } from "../support/fixtures";

let owner: Member;
const ids = { lateFeb28: crypto.randomUUID(), earlyMar1: crypto.randomUUID(), lateMar31: crypto.randomUUID(), earlyApr1: crypto.randomUUID() };
// Honolulu wall clock → UTC instant (+10 h).
const createdAt: Record<keyof typeof ids, Date> = {
  lateFeb28: new Date("2026-03-01T09:30:00Z"), // 28 Feb 23:30 in Honolulu, already 1 March in UTC
  earlyMar1: new Date("2026-03-01T10:30:00Z"), // 1 Mar 00:30
  lateMar31: new Date("2026-04-01T09:59:00Z"), // 31 Mar 23:59
  earlyApr1: new Date("2026-04-01T10:00:00Z"), // 1 Apr 00:00
};

beforeAll(async () => {
  owner = await newCompany("Midnight Islands Solar");
  await db()
    .update(company)
    .set({ settings: storedCompanySettingsSchema.parse({ timeZone: "Pacific/Honolulu" }) })
    .where(eq(company.id, owner.companyId));
  for (const [key, id] of Object.entries(ids) as [keyof typeof ids, string][]) {
    const householdId = crypto.randomUUID();
    await db().insert(household).values({ id: householdId, companyId: owner.companyId, name: `Home ${key}`, street: "1 Lanai Way", city: "Hilo", region: "HI", postalCode: "96720", latitude: 19.7, longitude: -155.1 });
    await db().insert(deal).values({ id, companyId: owner.companyId, householdId, ownerUserId: owner.userId, source: "Referral", createdAt: createdAt[key] });
  }
});

const march = { from: "2026-03-01", to: "2026-03-31" };
const sorted = (list: string[]) => [...list].sort();

describe("created-date filters in the company's time zone", () => {
  it("the deals table counts the days of Honolulu, not of UTC", async () => {
    const page = await dealTablePage(owner, dealTableQuerySchema.parse({ ...march, pageSize: "50" }));
    expect(sorted(page.rows.map((r) => r.id))).toEqual(sorted([ids.earlyMar1, ids.lateMar31]));
    const lastOfFebruary = await dealTablePage(owner, dealTableQuerySchema.parse({ from: "2026-02-28", to: "2026-02-28" }));
    expect(lastOfFebruary.rows.map((r) => r.id)).toEqual([ids.lateFeb28]);
  });

  it("the CSV export and the board read the same days", async () => {
    const exported: string[] = [];
    for await (const chunk of dealTableChunks(owner, dealTableQuerySchema.parse(march))) exported.push(...chunk.map((r) => r.id));
    expect(sorted(exported)).toEqual(sorted([ids.earlyMar1, ids.lateMar31]));
    const board = await listBoardDeals(owner, march);
    expect(sorted(board.map((d) => d.id))).toEqual(sorted([ids.earlyMar1, ids.lateMar31]));
    expect((await listBoardDeals(owner, { from: "2026-04-01" })).map((d) => d.id)).toEqual([ids.earlyApr1]);
  });
});
