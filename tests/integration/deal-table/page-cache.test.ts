// The deals table keeps pages in memory under the company's deals revision, which database
// triggers bump inside every writer's transaction (drizzle/0004_deals-revision.sql). These
// tests write the way other code and other processes do (plain SQL) and check that the next
// read shows the change, and that a read with no change in between is served from memory.
import { eq } from "drizzle-orm";
import type { RowDataPacket } from "mysql2";
import { beforeAll, describe, expect, it } from "vitest";
import { deal, household } from "@/db/schema";
import { dealTableQuerySchema } from "@/lib/schemas/deal-table";
import { db, pool } from "@/server/db";
import { dealTablePage, dealTablePageJson } from "@/server/deal-table";
import type { Member } from "@/server/session";
import { moveDealStage } from "@/server/stages";
import { addMember, newCompany } from "../support/fixtures";

let owner: Member;
let office: Member;
let rep: Member;
let stranger: Member;
const homes: string[] = [];
const deals: string[] = [];

const query = (input: Record<string, string> = {}) => dealTableQuerySchema.parse({ sort: "household:asc", ...input });

async function revision(companyId: string): Promise<number> {
  const [rows] = await pool().query<RowDataPacket[]>("SELECT revision FROM deals_revision WHERE company_id = ?", [companyId]);
  return Number(rows[0]?.revision ?? 0);
}

async function exec(sqlText: string, params: unknown[]): Promise<void> {
  await pool().query(sqlText, params);
}

beforeAll(async () => {
  owner = await newCompany("Cache Solar");
  office = await addMember(owner, "office_manager", "Otto Office");
  rep = await addMember(owner, "sales_rep", "Rita Rep");
  stranger = await newCompany("Elsewhere Cache Solar");
  for (let i = 0; i < 3; i++) {
    const hid = crypto.randomUUID();
    const did = crypto.randomUUID();
    homes.push(hid);
    deals.push(did);
    await db()
      .insert(household)
      .values({ id: hid, companyId: owner.companyId, name: `Cache ${i} household`, street: `${i} Tern Lane`, city: "Durham", region: "NC", postalCode: "27701", latitude: 36, longitude: -78.9 });
    await db()
      .insert(deal)
      .values({ id: did, companyId: owner.companyId, householdId: hid, ownerUserId: i === 0 ? rep.userId : office.userId, stage: "lead", contractCents: 2_000_000 + i });
  }
});

describe("deals table pages kept in memory", () => {
  it("serves a repeated read from memory while nothing changed", async () => {
    const first = await dealTablePage(office, query());
    const again = await dealTablePage(office, query());
    expect(again).toBe(first);
    expect(first.rows.map((r) => r.householdName)).toEqual(["Cache 0 household", "Cache 1 household", "Cache 2 household"]);
  });

  it("answers the route's JSON text of the kept page, and a new text after a change; kept pages are frozen", async () => {
    const page = await dealTablePage(office, query());
    const text = await dealTablePageJson(office, query());
    expect(text).toBe(JSON.stringify(page));
    expect(await dealTablePageJson(office, query())).toBe(text);
    expect(Object.isFrozen(page) && Object.isFrozen(page.rows) && page.rows.every((r) => Object.isFrozen(r))).toBe(true);
    await exec("UPDATE deal SET contract_cents = contract_cents + 100 WHERE id = ?", [deals[0]]);
    const changed = JSON.parse(await dealTablePageJson(office, query())) as typeof page;
    expect(changed.rows.find((r) => r.id === deals[0])?.contractCents).toBe(page.rows.find((r) => r.id === deals[0])!.contractCents! + 100);
  });

  it("shows a stage move made by another process's SQL on the next read", async () => {
    const before = await dealTablePage(office, query());
    await exec("UPDATE deal SET stage = 'designing' WHERE id = ?", [deals[1]]);
    const after = await dealTablePage(office, query());
    expect(after).not.toBe(before);
    expect(after.rows.find((r) => r.id === deals[1])?.stage).toBe("designing");
  });

  it("shows a move through moveDealStage (the app's own transaction) on the next read", async () => {
    await dealTablePage(office, query({ stage: "bills_in" }));
    await moveDealStage(office, deals[2], "bills_in");
    const after = await dealTablePage(office, query({ stage: "bills_in" }));
    expect(after.rows.map((r) => r.id)).toEqual([deals[2]]);
    expect(after.total).toBe(1);
  });

  it("shows a renamed household, and a search finds it by its new name", async () => {
    await dealTablePage(office, query({ q: "Heron" }));
    await exec("UPDATE household SET name = 'Heron Point household' WHERE id = ?", [homes[0]]);
    const found = await dealTablePage(office, query({ q: "Heron" }));
    expect(found.rows.map((r) => r.householdName)).toEqual(["Heron Point household"]);
  });

  it("shows an owner's new name", async () => {
    const before = await dealTablePage(office, query({ sort: "owner:asc" }));
    expect(before.rows.find((r) => r.id === deals[0])?.ownerName).toBe("Rita Rep");
    await exec("UPDATE user SET name = 'Rita Quill' WHERE id = ?", [rep.userId]);
    const after = await dealTablePage(office, query({ sort: "owner:asc" }));
    expect(after.rows.find((r) => r.id === deals[0])?.ownerName).toBe("Rita Quill");
  });

  it("keeps a rep's pages apart from the office's, and follows a reassignment", async () => {
    const repPage = await dealTablePage(rep, query());
    expect(repPage.rows.map((r) => r.id)).toEqual([deals[0]]);
    expect((await dealTablePage(office, query())).total).toBe(3);
    await exec("UPDATE deal SET owner_user_id = ? WHERE id = ?", [rep.userId, deals[1]]);
    expect((await dealTablePage(rep, query())).rows.map((r) => r.id).sort()).toEqual([deals[0], deals[1]].sort());
  });

  it("keeps a search's households across a stage move, and finds a new household", async () => {
    const before = await dealTablePage(office, query({ q: "Tern Lane" }));
    expect(before.total).toBe(3);
    await exec("UPDATE deal SET stage = 'designing' WHERE id = ?", [deals[0]]);
    const moved = await dealTablePage(office, query({ q: "Tern Lane" }));
    expect(moved.rows.find((r) => r.id === deals[0])?.stage).toBe("designing");
    const hid = crypto.randomUUID();
    await exec(
      "INSERT INTO household (id, company_id, name, street, city, region, postal_code, latitude, longitude) VALUES (?, ?, 'Cache 8 household', '8 Tern Lane', 'Durham', 'NC', '27701', 36, -78.9)",
      [hid, owner.companyId],
    );
    const newDeal = crypto.randomUUID();
    await exec("INSERT INTO deal (id, company_id, household_id, stage) VALUES (?, ?, ?, 'lead')", [newDeal, owner.companyId, hid]);
    const grown = await dealTablePage(office, query({ q: "Tern Lane" }));
    expect(grown.total).toBe(4);
    expect(grown.rows.map((r) => r.id)).toContain(newDeal);
    await exec("DELETE FROM household WHERE id = ?", [hid]);
    expect((await dealTablePage(office, query({ q: "Tern Lane" }))).total).toBe(3);
  });

  it("counts a new deal and forgets a deleted household's deal", async () => {
    const before = await dealTablePage(office, query());
    const hid = crypto.randomUUID();
    await exec(
      "INSERT INTO household (id, company_id, name, street, city, region, postal_code, latitude, longitude) VALUES (?, ?, 'Cache 9 household', '9 Tern Lane', 'Durham', 'NC', '27701', 36, -78.9)",
      [hid, owner.companyId],
    );
    await exec("INSERT INTO deal (id, company_id, household_id, stage) VALUES (?, ?, ?, 'lead')", [crypto.randomUUID(), owner.companyId, hid]);
    expect((await dealTablePage(office, query())).total).toBe(before.total + 1);
    // Deleting the household removes its deal by a foreign-key cascade, which fires no deal trigger.
    await exec("DELETE FROM household WHERE id = ?", [hid]);
    expect((await dealTablePage(office, query())).total).toBe(before.total);
  });

  it("moves the revision only for changes the table shows, and only the writer's company's", async () => {
    const ours = await revision(owner.companyId);
    const theirs = await revision(stranger.companyId);
    await exec("UPDATE deal SET rate_plan_id = UUID() WHERE id = ?", [deals[0]]);
    expect(await revision(owner.companyId)).toBe(ours);
    await exec("UPDATE deal SET contract_cents = contract_cents + 100 WHERE id = ?", [deals[0]]);
    expect(await revision(owner.companyId)).toBe(ours + 1);
    expect(await revision(stranger.companyId)).toBe(theirs);
  });

  it("does not move the revision when a write is rolled back", async () => {
    const stage = (await dealTablePage(office, query())).rows.find((r) => r.id === deals[0])?.stage;
    expect(stage).not.toBe("lost");
    const ours = await revision(owner.companyId);
    await expect(
      db().transaction(async (tx) => {
        await tx.update(deal).set({ stage: "lost" }).where(eq(deal.id, deals[0]));
        throw new Error("changed my mind");
      }),
    ).rejects.toThrow("changed my mind");
    expect(await revision(owner.companyId)).toBe(ours);
    expect((await dealTablePage(office, query())).rows.find((r) => r.id === deals[0])?.stage).toBe(stage);
  });
});
