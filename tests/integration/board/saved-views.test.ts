// Saved views of the deals table against a real MariaDB: each person's own, validated with the
// table's query schema, names unique per person, another person's or company's view not found.
import { eq, sql } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { savedView } from "@/db/schema";
import { dealTableQuerySchema, SAVED_VIEWS_PER_PERSON, savedViewCreateSchema, savedViewUpdateSchema } from "@/lib/schemas/deal-table";
import { db } from "@/server/db";
import { dealTablePage } from "@/server/deal-table";
import { createSavedView, deleteSavedView, getSavedViewOrThrow, listSavedViews, updateSavedView } from "@/server/saved-views";
import type { Member } from "@/server/session";
import { addMember, newCompany } from "../support/fixtures";
import { newDeal, rejects } from "./support";

let owner: Member;
let office: Member;
let rep: Member;
let stranger: Member;

const create = (m: Member, name: string, query: Record<string, unknown>) => createSavedView(m, savedViewCreateSchema.parse({ name, query }));

beforeAll(async () => {
  owner = await newCompany("Views Solar");
  office = await addMember(owner, "office_manager", "Opal Office");
  rep = await addMember(owner, "sales_rep", "Reed Rep");
  stranger = await newCompany("Other Views Solar");
});

describe("saved views", () => {
  it("saves a view with the table's filters and sort, lists it by name, and applies to the same rows", async () => {
    await newDeal(owner, "permitting", { name: "Viewfield household", owner: rep, source: "Website", contractCents: 2_000_000 });
    await newDeal(owner, "permitting", { name: "Viewmoor household", owner: rep, source: "Referral", contractCents: 3_000_000 });
    await newDeal(owner, "lead", { name: "Viewcrest household", owner: rep, source: "Website" });

    const b = await create(office, "Permits by value", { stage: "permitting", sort: "contractCents:desc", pageSize: 25, hiddenColumns: ["city"], q: "" });
    const a = await create(office, "All websites", { source: "Website" });
    expect(b.query).toEqual({ stage: "permitting", sort: "contractCents:desc", pageSize: 25, hiddenColumns: ["city"] });
    expect(a.query).toEqual({ source: "Website", sort: "stageChangedAt:desc" });
    expect((await listSavedViews(office)).map((v) => v.name)).toEqual(["All websites", "Permits by value"]);

    // Stored without the blanks.
    const [row] = await db().select({ query: savedView.query }).from(savedView).where(eq(savedView.id, b.id));
    expect(row.query).toEqual({ stage: "permitting", sort: "contractCents:desc", pageSize: 25, hiddenColumns: ["city"] });

    const page = await dealTablePage(office, dealTableQuerySchema.parse(b.query));
    expect(page.rows.map((r) => r.householdName)).toEqual(["Viewmoor household", "Viewfield household"]);
    expect(page.pageSize).toBe(25);
  });

  it("is private to its person: another person or company gets 404 for read, change and delete", async () => {
    const mine = await create(rep, "My leads", { stage: "lead" });
    expect((await getSavedViewOrThrow(rep, mine.id)).name).toBe("My leads");
    for (const other of [office, owner, stranger]) {
      await rejects(getSavedViewOrThrow(other, mine.id), 404);
      await rejects(updateSavedView(other, mine.id, savedViewUpdateSchema.parse({ name: "Taken" })), 404);
      await rejects(deleteSavedView(other, mine.id), 404);
      expect((await listSavedViews(other)).map((v) => v.id)).not.toContain(mine.id);
    }
    expect((await getSavedViewOrThrow(rep, mine.id)).name).toBe("My leads");
  });

  it("renames and replaces the query; a name taken by the same person is refused, by another person allowed", async () => {
    const v = await create(rep, "Hot", { stage: "designing" });
    await create(rep, "Cold", { stage: "on_hold" });
    const renamed = await updateSavedView(rep, v.id, savedViewUpdateSchema.parse({ name: "Warm" }));
    expect(renamed).toMatchObject({ name: "Warm", query: { stage: "designing" } });
    const requeried = await updateSavedView(rep, v.id, savedViewUpdateSchema.parse({ query: { stage: "bills_in", sort: "createdAt:asc" } }));
    expect(requeried).toMatchObject({ name: "Warm", query: { stage: "bills_in", sort: "createdAt:asc" } });

    const dup = await rejects(create(rep, "cold", {}), 409); // names compare without case
    expect(dup.fields).toHaveProperty("name");
    await rejects(updateSavedView(rep, v.id, savedViewUpdateSchema.parse({ name: "Cold" })), 409);
    expect((await create(office, "Cold", {})).name).toBe("Cold");
  });

  it("validates with the table's schema", () => {
    const bad = [
      { name: "", query: {} },
      { name: "x".repeat(101), query: {} },
      { name: "Bad sort", query: { sort: "companyId:asc" } },
      { name: "Bad stage", query: { stage: "paid" } },
      { name: "Big page", query: { pageSize: 500 } },
      { name: "Bad column", query: { hiddenColumns: ["household"] } },
      { name: "Bad dates", query: { from: "2026-05-01", to: "2026-04-01" } },
    ];
    for (const input of bad) expect(savedViewCreateSchema.safeParse(input).success, input.name).toBe(false);
    expect(savedViewUpdateSchema.safeParse({}).success).toBe(false);
  });

  it("reads a stored query that no longer passes as the default view", async () => {
    const id = crypto.randomUUID();
    await db().insert(savedView).values({ id, companyId: owner.companyId, userId: owner.userId, name: "Old", query: sql`${JSON.stringify({ stage: "archived" })}` });
    expect((await getSavedViewOrThrow(owner, id)).query).toEqual({ sort: "stageChangedAt:desc" });
  });

  it("deletes, and keeps at most the limit per person", async () => {
    const person = await addMember(owner, "sales_rep", "Many Views");
    const first = await create(person, "View 0", {});
    for (let i = 1; i < SAVED_VIEWS_PER_PERSON; i++) await create(person, `View ${i}`, {});
    await rejects(create(person, "One too many", {}), 409);
    await deleteSavedView(person, first.id);
    await rejects(getSavedViewOrThrow(person, first.id), 404);
    await rejects(deleteSavedView(person, first.id), 404);
    expect((await create(person, "Now it fits", {})).name).toBe("Now it fits");
  });
});
