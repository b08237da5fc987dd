// Settings → Company against a real MariaDB: defaults until set, validation of the form's
// schema, damaged JSON falling back per stage, tenancy; and the permit rule of Install booked
// reading the job's permit approval date.
import { eq, sql } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { company, job } from "@/db/schema";
import { companySettingsSchema, DEFAULT_FINANCE, DEFAULT_STALL_SETTINGS, storedCompanySettingsSchema } from "@/lib/schemas/company-settings";
import { DEFAULT_STALL_DAYS } from "@/lib/stage-rules";
import { getCompanyOrThrow, getCompanySettings, updateCompanySettings } from "@/server/company-settings";
import { db } from "@/server/db";
import type { Member } from "@/server/session";
import { moveDealStage, StageRuleError } from "@/server/stages";
import { addMember, newCompany } from "../support/fixtures";
import { dealRow, eventsOf, newDeal, rejects } from "./support";

let owner: Member;
let office: Member;
let stranger: Member;

beforeAll(async () => {
  owner = await newCompany("Settings Solar");
  office = await addMember(owner, "office_manager", "Opal Office");
  stranger = await newCompany("Elsewhere Solar");
});

describe("company settings", () => {
  it("start at the defaults of the stage rules", async () => {
    const s = await getCompanySettings(owner.companyId);
    expect(s.name).toBe("Settings Solar");
    expect(s.licenseNumber).toBeNull();
    expect(s.timeZone).toBe("America/New_York");
    expect(s.stallDays).toEqual(DEFAULT_STALL_SETTINGS);
    expect(s.stallLimits).toEqual(DEFAULT_STALL_DAYS);
  });

  it("saves name, licence number, time zone and stall days; empty means never", async () => {
    const input = companySettingsSchema.parse({
      name: "  Settings Solar & Roofing ",
      licenseNumber: " NC-12345 ",
      timeZone: "America/Denver",
      stallDays: { ...Object.fromEntries(Object.entries(DEFAULT_STALL_SETTINGS).map(([k, v]) => [k, v == null ? "" : String(v)])), permitting: "45", designing: "" },
    });
    const saved = await updateCompanySettings(owner, input);
    expect(saved).toMatchObject({ name: "Settings Solar & Roofing", licenseNumber: "NC-12345", timeZone: "America/Denver" });
    expect(saved.stallDays.permitting).toBe(45);
    expect(saved.stallDays.designing).toBeNull();
    expect(saved.stallLimits.permitting).toBe(45);
    expect("designing" in saved.stallLimits).toBe(false);
    expect(await getCompanySettings(owner.companyId)).toEqual(saved);
    // Another company is untouched.
    expect((await getCompanySettings(stranger.companyId)).stallDays).toEqual(DEFAULT_STALL_SETTINGS);
  });

  it("keeps keys of company.settings that other areas own", async () => {
    await db()
      .update(company)
      .set({ settings: storedCompanySettingsSchema.parse({ depositPolicy: { kind: "fixed" }, stallDays: { lead: 3 } }) })
      .where(eq(company.id, stranger.companyId));
    const input = companySettingsSchema.parse({ name: "Elsewhere Solar", licenseNumber: "", timeZone: "America/Chicago", stallDays: { ...DEFAULT_STALL_SETTINGS, lead: 4 } });
    await updateCompanySettings(stranger, input);
    const [row] = await db().select({ settings: company.settings }).from(company).where(eq(company.id, stranger.companyId));
    expect(row.settings).toMatchObject({ depositPolicy: { kind: "fixed" }, stallDays: { lead: 4 }, timeZone: "America/Chicago" });
    expect((await getCompanySettings(stranger.companyId)).licenseNumber).toBeNull();
  });

  it("refuses days outside 1–365, fractions and words, naming the stage", () => {
    for (const bad of ["0", "366", "2.5", "soon", "-3"]) {
      const r = companySettingsSchema.safeParse({ name: "X", licenseNumber: "", timeZone: "America/New_York", stallDays: { ...DEFAULT_STALL_SETTINGS, survey: bad } });
      expect(r.success, bad).toBe(false);
      if (!r.success) expect(r.error.issues[0].path).toEqual(["stallDays", "survey"]);
    }
    expect(companySettingsSchema.safeParse({ name: "", licenseNumber: "", timeZone: "America/New_York", stallDays: DEFAULT_STALL_SETTINGS }).success).toBe(false);
    expect(companySettingsSchema.safeParse({ name: "X", licenseNumber: "", timeZone: "Europe/Paris", stallDays: DEFAULT_STALL_SETTINGS }).success).toBe(false);
  });

  it("falls back to the default for each damaged stored value, one stage at a time", async () => {
    const other = await newCompany("Damaged Settings Solar");
    await db()
      .update(company)
      .set({ settings: sql`${JSON.stringify({ stallDays: { lead: "seven", survey: 9, permitting: 9999, signed: null }, timeZone: "Mars/Olympus" })}` })
      .where(eq(company.id, other.companyId));
    const s = await getCompanySettings(other.companyId);
    expect(s.stallDays).toEqual({ ...DEFAULT_STALL_SETTINGS, survey: 9, signed: null });
    expect(s.timeZone).toBe("America/New_York");
  });

  it("saves the savings assumptions; a form without them keeps the stored ones", async () => {
    const other = await newCompany("Assumptions Solar");
    expect((await getCompanySettings(other.companyId)).finance).toEqual(DEFAULT_FINANCE);
    const base = { name: "Assumptions Solar", licenseNumber: "", timeZone: "America/New_York", stallDays: DEFAULT_STALL_SETTINGS };
    const saved = await updateCompanySettings(other, companySettingsSchema.parse({ ...base, finance: { years: "30", degradationPctPerYear: "0.4", utilityEscalationPctPerYear: "3.1 %", discountRatePct: "0" } }));
    expect(saved.finance).toEqual({ years: 30, degradationPctPerYear: 0.4, utilityEscalationPctPerYear: 3.1, discountRatePct: 0 });
    const kept = await updateCompanySettings(other, companySettingsSchema.parse({ ...base, name: "Assumptions Solar LLC" }));
    expect(kept.finance).toEqual(saved.finance);
    expect((await getCompanySettings(owner.companyId)).finance).toEqual(DEFAULT_FINANCE);
  });

  it("refuses assumptions outside their ranges, naming the field", () => {
    const base = { name: "X", licenseNumber: "", timeZone: "America/New_York", stallDays: DEFAULT_STALL_SETTINGS };
    const good = { years: "25", degradationPctPerYear: "0.5", utilityEscalationPctPerYear: "2.5", discountRatePct: "5" };
    const cases: [keyof typeof good, string, RegExp][] = [
      ["years", "9", /Whole years from 10 to 40/],
      ["years", "25.5", /Whole years from 10 to 40/],
      ["degradationPctPerYear", "5", /from 0 to 2/],
      ["degradationPctPerYear", "-0.1", /from 0 to 2/],
      ["utilityEscalationPctPerYear", "25", /from -2 to 8/],
      ["discountRatePct", "five", /from 0 to 15/],
      ["discountRatePct", "", /from 0 to 15/],
    ];
    for (const [key, value, message] of cases) {
      const r = companySettingsSchema.safeParse({ ...base, finance: { ...good, [key]: value } });
      expect(r.success, `${key}=${value}`).toBe(false);
      if (!r.success) {
        expect(r.error.issues[0].path).toEqual(["finance", key]);
        expect(r.error.issues[0].message).toMatch(message);
      }
    }
  });

  it("falls back to the default for each damaged stored assumption", async () => {
    const other = await newCompany("Damaged Assumptions Solar");
    await db()
      .update(company)
      .set({ settings: sql`${JSON.stringify({ finance: { years: 99, degradationPctPerYear: "0.7", utilityEscalationPctPerYear: 3, discountRatePct: null } })}` })
      .where(eq(company.id, other.companyId));
    expect((await getCompanySettings(other.companyId)).finance).toEqual({ ...DEFAULT_FINANCE, utilityEscalationPctPerYear: 3 });
  });

  it("reads one's own company by id only", async () => {
    expect((await getCompanyOrThrow(office, owner.companyId)).companyId).toBe(owner.companyId);
    await rejects(getCompanyOrThrow(office, stranger.companyId), 404);
  });
});

describe("Install booked and the permit approval date", () => {
  it("refuses the office without a job or a date, and moves once the job has the date", async () => {
    const id = await newDeal(owner, "permitting", { name: "Permitwood household" });
    const noJob = await rejects(moveDealStage(office, id, "install_booked"), 422);
    expect(noJob.message).toMatch(/^No permit approval date is recorded for this deal/);

    const jobId = crypto.randomUUID();
    await db().insert(job).values({ id: jobId, companyId: owner.companyId, dealId: id, permitNumber: "BP-2026-0117" });
    await rejects(moveDealStage(office, id, "install_booked"), 422);
    expect((await dealRow(id)).stage).toBe("permitting");

    await db().update(job).set({ permitApprovedOn: "2026-03-02" }).where(eq(job.id, jobId));
    const moved = await moveDealStage(office, id, "install_booked");
    expect(moved).toMatchObject({ from: "permitting", to: "install_booked", reason: null });
    expect((await dealRow(id)).stage).toBe("install_booked");
    const events = await eventsOf(id, "stage.moved");
    expect(events).toHaveLength(1);
    expect(events[0].summary).toBe("Opal Office moved Permitwood household from Permitting to Install booked");
  });

  it("still lets an owner book without a date when giving a reason, and asks for it otherwise", async () => {
    const id = await newDeal(owner, "permitting");
    const err = await rejects(moveDealStage(owner, id, "install_booked"), 422);
    expect(err).toBeInstanceOf(StageRuleError);
    expect((err as StageRuleError).needs).toBe("admin_reason");
    await moveDealStage(owner, id, "install_booked", "Approved at the counter; stamp to follow");
    expect((await dealRow(id)).stage).toBe("install_booked");
  });

  it("does not read another company's job for the date", async () => {
    const id = await newDeal(owner, "permitting");
    // A job row of another company pointing at this deal (never happens through the app).
    await db().insert(job).values({ id: crypto.randomUUID(), companyId: stranger.companyId, dealId: id, permitApprovedOn: "2026-01-05" });
    await rejects(moveDealStage(office, id, "install_booked"), 422);
  });
});
