// Demo rows of the Board area: the company's settings (its time zone and the stall limits,
// which start at the defaults) and a few saved views of the deals table. Validated by the
// schemas the app uses, so a bad edit here fails the seed instead of the page.
import { eq } from "drizzle-orm";
import { company, savedView } from "../../../src/db/schema";
import { companySettingsSchema, DEFAULT_STALL_SETTINGS, storedCompanySettingsSchema } from "../../../src/lib/schemas/company-settings";
import { savedViewCreateSchema } from "../../../src/lib/schemas/deal-table";
import type { SeedContext } from "../seed-demo";

export const order = 90;

const uid = (n: number) => `7a11a55e-0000-4000-8000-${String(n).padStart(12, "0")}`;

// Saved views are private to their person. The admin's come first (lowest ids and user id):
// the tenancy check reads the company's first saved views by id as admin@.
const VIEWS: { id: number; email: string; name: string; query: Record<string, unknown> }[] = [
  { id: 950, email: "admin@tallgrass.example", name: "Waiting on permits", query: { stage: "permitting", sort: "stageChangedAt:asc" } },
  { id: 951, email: "admin@tallgrass.example", name: "Biggest contracts", query: { sort: "contractCents:desc", pageSize: 25 } },
  { id: 952, email: "admin@tallgrass.example", name: "Referrals", query: { source: "Referral", sort: "createdAt:desc", hiddenColumns: ["city"] } },
  { id: 953, email: "office@tallgrass.example", name: "Ready to book installs", query: { stage: "permitting", sort: "stageChangedAt:asc" } },
  { id: 954, email: "rep@tallgrass.example", name: "My open leads", query: { stage: "lead", sort: "createdAt:desc" } },
];

export async function seed(ctx: SeedContext): Promise<void> {
  const settings = companySettingsSchema.parse({
    name: "Tallgrass Bright Energy",
    licenseNumber: null,
    timeZone: "America/New_York",
    stallDays: DEFAULT_STALL_SETTINGS,
  });
  // Other areas may keep their own keys in company.settings: keep them.
  const [row] = await ctx.tx.select({ settings: company.settings }).from(company).where(eq(company.id, ctx.companyId));
  await ctx.tx
    .update(company)
    .set({ settings: storedCompanySettingsSchema.parse({ ...row?.settings, timeZone: settings.timeZone, stallDays: settings.stallDays }) })
    .where(eq(company.id, ctx.companyId));

  for (const v of VIEWS) {
    const person = ctx.people.find((p) => p.email === v.email);
    if (!person) throw new Error(`Board seed: no demo person ${v.email}`);
    const input = savedViewCreateSchema.parse({ name: v.name, query: v.query });
    await ctx.tx.insert(savedView).values({ id: uid(v.id), companyId: ctx.companyId, userId: person.id, name: input.name, query: input.query });
  }
}
