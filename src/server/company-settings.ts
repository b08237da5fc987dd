import "server-only";
import { eq, sql } from "drizzle-orm";
import { company, type Stage } from "@/db/schema";
import { readElectricalSettings, type ElectricalSettings } from "@/lib/schemas/electrical";
import { stallLimits, storedCompanySettingsSchema, type CompanySettingsValues, type CompanyTimeZone, type FinanceAssumptions, type StallDays } from "@/lib/schemas/company-settings";
import { db, transaction } from "@/server/db";
import { notFound } from "@/server/errors";
import type { Member } from "@/server/session";

export type CompanySettings = {
  companyId: string;
  name: string;
  /** Contractor licence number, printed on proposals and packets; null when not entered. */
  licenseNumber: string | null;
  timeZone: CompanyTimeZone;
  /** Per stage: days before a deal is flagged as stalled, or null for never. */
  stallDays: StallDays;
  /** The same limits as the Board and Today read them (stages without one are never flagged). */
  stallLimits: Partial<Record<Stage, number>>;
  /** The savings assumptions every new offer is figured with. */
  finance: FinanceAssumptions;
  /** Grows whenever `finance` changes; offers record the one they used. */
  financeVersion: number;
  /** The NEC edition of the electrical checks and the designer on the packet (src/lib/schemas/electrical.ts). */
  electrical: ElectricalSettings;
};

/**
 * The company's name, licence number and settings. The settings column's schema fills in
 * anything missing or damaged with its default (src/lib/stage-rules.ts DEFAULT_STALL_DAYS).
 */
export async function getCompanySettings(companyId: string): Promise<CompanySettings> {
  const [row] = await db()
    .select({ id: company.id, name: company.name, licenseNumber: company.licenseNumber, settings: company.settings, financeVersion: company.financeVersion })
    .from(company)
    .where(eq(company.id, companyId))
    .limit(1);
  if (!row) throw notFound("Company");
  const { stallDays, timeZone, finance } = row.settings ?? storedCompanySettingsSchema.parse({});
  return { companyId: row.id, name: row.name, licenseNumber: row.licenseNumber, timeZone, stallDays, stallLimits: stallLimits(stallDays), finance, financeVersion: row.financeVersion, electrical: readElectricalSettings(row.settings) };
}

/** GET /api/companies/[id]: one's own company only; any other id is simply not found. */
export async function getCompanyOrThrow(member: Member, companyId: string): Promise<CompanySettings> {
  if (companyId !== member.companyId) throw notFound("Company");
  return getCompanySettings(member.companyId);
}

/**
 * Saves Settings → Company. Keys of company.settings this form does not own are kept, so
 * another area's settings survive an edit here.
 */
export async function updateCompanySettings(member: Member, input: CompanySettingsValues): Promise<CompanySettings> {
  await transaction(async (tx) => {
    const [row] = await tx.select({ settings: company.settings }).from(company).where(eq(company.id, member.companyId)).for("update");
    if (!row) throw notFound("Company");
    const previous = row.settings ?? storedCompanySettingsSchema.parse({});
    const financeChanged = !!input.finance && JSON.stringify(previous.finance) !== JSON.stringify(input.finance);
    await tx
      .update(company)
      .set({
        name: input.name,
        licenseNumber: input.licenseNumber,
        settings: { ...previous, timeZone: input.timeZone, stallDays: input.stallDays, finance: input.finance ?? previous.finance },
        ...(financeChanged ? { financeVersion: sql`${company.financeVersion} + 1` } : {}),
      })
      .where(eq(company.id, member.companyId));
  });
  return getCompanySettings(member.companyId);
}
