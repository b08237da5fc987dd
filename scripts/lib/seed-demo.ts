// The invented demo company, Tallgrass Bright Energy: one person per role (plus a second
// sales rep and a second crew, so sharing and assignment can be shown), and a dozen households at every stage.
// Places and people are made up. Idempotent: fixed ids, inserted only when missing.
import { readdirSync } from "node:fs";
import path from "node:path";
import { fileURLToPath } from "node:url";
import { hashPassword } from "better-auth/crypto";
import { eq } from "drizzle-orm";
import { drizzle } from "drizzle-orm/mysql2";
import mysql from "mysql2/promise";
import { DEMO_RATE_PLAN_IDS, DEMO_UTILITIES, DEMO_UTILITY_IDS } from "./seed/pricing";
import { account, company, deal, household, membership, schema, user, utility, type Role, type Stage } from "../../src/db/schema";

export const DEMO_COMPANY_ID = "7a11a55e-0000-4000-8000-000000000001";
export const DEMO_PASSWORD = "tallgrass-demo-2026";

export type DemoPerson = { id: string; name: string; email: string; role: Role };

const uid = (n: number) => `7a11a55e-0000-4000-8000-${String(n).padStart(12, "0")}`;

export const DEMO_PEOPLE: DemoPerson[] = [
  { id: uid(101), name: "Maren Lindqvist", email: "owner@tallgrass.example", role: "owner" },
  { id: uid(102), name: "Dorian Achebe", email: "admin@tallgrass.example", role: "admin" },
  { id: uid(103), name: "Priya Castellanos", email: "office@tallgrass.example", role: "office_manager" },
  { id: uid(104), name: "Tobias Wren", email: "rep@tallgrass.example", role: "sales_rep" },
  { id: uid(105), name: "Ines Okonkwo", email: "rep2@tallgrass.example", role: "sales_rep" },
  { id: uid(106), name: "Cal Brennan", email: "crew@tallgrass.example", role: "crew" },
  { id: uid(107), name: "Rosa Quintero", email: "crew2@tallgrass.example", role: "crew" },
];

const CONTACT_FIRST_NAMES = ["Hollis", "Margit", "Desmond", "Anouk", "Bertram", "Liesl", "Caspian", "Odalys", "Fintan", "Saoirse", "Ruben", "Tamsin", "Ezra", "Noor"];

type DemoHousehold = {
  name: string;
  street: string;
  city: string;
  postalCode: string;
  latitude: number;
  longitude: number;
  stage: Stage;
  rep: 104 | 105;
  source: string;
  dcWatts: number | null;
  contractCents: number | null;
  daysInStage: number;
};

// Invented households around the Piedmont Triad (North Carolina), near the Greensboro
// reference weather station the demo uses.
const HOUSEHOLDS: DemoHousehold[] = [
  { name: "Abernathy household", street: "14 Quillfeather Lane", city: "Greensboro", postalCode: "27405", latitude: 36.1012, longitude: -79.7711, stage: "lead", rep: 104, source: "Referral", dcWatts: null, contractCents: null, daysInStage: 1 },
  { name: "Baptiste household", street: "220 Larkmoor Drive", city: "Greensboro", postalCode: "27408", latitude: 36.1139, longitude: -79.8254, stage: "bills_in", rep: 105, source: "Home show", dcWatts: null, contractCents: null, daysInStage: 3 },
  { name: "Calloway household", street: "9 Tinder Hollow Road", city: "Jamestown", postalCode: "27282", latitude: 36.0032, longitude: -79.9348, stage: "designing", rep: 104, source: "Website", dcWatts: 7_600, contractCents: null, daysInStage: 2 },
  { name: "Dunmore household", street: "31 Wrenfield Court", city: "Summerfield", postalCode: "27358", latitude: 36.2087, longitude: -79.8933, stage: "proposal_out", rep: 105, source: "Door to door", dcWatts: 8_400, contractCents: 2_394_000, daysInStage: 6 },
  { name: "Esposito household", street: "402 Saltbox Way", city: "High Point", postalCode: "27262", latitude: 35.9821, longitude: -80.0103, stage: "signed", rep: 104, source: "Referral", dcWatts: 6_800, contractCents: 1_972_000, daysInStage: 1 },
  { name: "Fairweather household", street: "77 Copperbeech Street", city: "Greensboro", postalCode: "27403", latitude: 36.0652, longitude: -79.8261, stage: "deposit_paid", rep: 105, source: "Website", dcWatts: 9_200, contractCents: 2_576_000, daysInStage: 4 },
  { name: "Galloway household", street: "5 Millrace Path", city: "Oak Ridge", postalCode: "27310", latitude: 36.1739, longitude: -79.9889, stage: "survey", rep: 104, source: "Home show", dcWatts: 10_000, contractCents: 2_750_000, daysInStage: 19 },
  { name: "Halvorsen household", street: "118 Thistledown Avenue", city: "Kernersville", postalCode: "27284", latitude: 36.1198, longitude: -80.0737, stage: "permitting", rep: 105, source: "Referral", dcWatts: 7_200, contractCents: 2_088_000, daysInStage: 21 },
  { name: "Iwasaki household", street: "63 Ember Ridge Drive", city: "Greensboro", postalCode: "27410", latitude: 36.1034, longitude: -79.8822, stage: "install_booked", rep: 104, source: "Website", dcWatts: 8_000, contractCents: 2_280_000, daysInStage: 5 },
  { name: "Jablonski household", street: "250 Hearthstone Loop", city: "Browns Summit", postalCode: "27214", latitude: 36.2143, longitude: -79.7131, stage: "installed", rep: 105, source: "Door to door", dcWatts: 6_400, contractCents: 1_856_000, daysInStage: 3 },
  { name: "Kowalczyk household", street: "19 Birchglow Terrace", city: "Greensboro", postalCode: "27407", latitude: 36.0301, longitude: -79.8659, stage: "inspected", rep: 104, source: "Referral", dcWatts: 11_200, contractCents: 3_024_000, daysInStage: 12 },
  { name: "Lindgren household", street: "88 Sunfallow Circle", city: "Whitsett", postalCode: "27377", latitude: 36.0754, longitude: -79.5692, stage: "live", rep: 105, source: "Website", dcWatts: 5_600, contractCents: 1_652_000, daysInStage: 30 },
  { name: "Marchetti household", street: "140 Cinderwick Road", city: "Pleasant Garden", postalCode: "27313", latitude: 35.9624, longitude: -79.7619, stage: "on_hold", rep: 104, source: "Home show", dcWatts: 7_000, contractCents: null, daysInStage: 14 },
  { name: "Nakamura household", street: "7 Glassmere Court", city: "Greensboro", postalCode: "27455", latitude: 36.1521, longitude: -79.8347, stage: "lost", rep: 105, source: "Door to door", dcWatts: 6_000, contractCents: 1_740_000, daysInStage: 40 },
];

/** What each area's seed module (scripts/lib/seed/<area>.ts) receives. */
export type SeedContext = {
  companyId: string;
  people: DemoPerson[];
  /** Deal ids in the order of HOUSEHOLDS (uid(301 + i)). */
  dealIds: string[];
  tx: Parameters<Parameters<ReturnType<typeof drizzle<typeof schema>>["transaction"]>[0]>[0];
};
export type SeedModule = { order: number; seed: (ctx: SeedContext) => Promise<void> };

/** Each area of the product seeds its own demo rows from scripts/lib/seed/*.ts, in `order`. */
async function areaSeeds(): Promise<SeedModule[]> {
  const dir = path.join(path.dirname(fileURLToPath(import.meta.url)), "seed");
  let files: string[] = [];
  try {
    files = readdirSync(dir).filter((f) => f.endsWith(".ts") && !f.endsWith(".test.ts"));
  } catch {
    return [];
  }
  const modules = await Promise.all(files.sort().map(async (f) => (await import(path.join(dir, f))) as SeedModule));
  return modules.sort((a, b) => a.order - b.order);
}

export async function seedDemo(databaseUrl: string): Promise<{ created: boolean }> {
  const connection = await mysql.createConnection({ uri: databaseUrl, timezone: "Z" });
  const db = drizzle(connection, { schema, mode: "default" });
  try {
    const [existing] = await db.select({ id: company.id }).from(company).where(eq(company.id, DEMO_COMPANY_ID)).limit(1);
    if (existing) return { created: false };
    const passwordHash = await hashPassword(DEMO_PASSWORD);
    const areas = await areaSeeds();
    await db.transaction(async (tx) => {
      await tx.insert(company).values({ id: DEMO_COMPANY_ID, name: "Tallgrass Bright Energy", licenseNumber: "NC-DEMO-00417" });
      for (const p of DEMO_PEOPLE) {
        await tx.insert(user).values({ id: p.id, name: p.name, email: p.email, emailVerified: true });
        await tx.insert(account).values({ id: crypto.randomUUID(), accountId: p.id, providerId: "credential", userId: p.id, password: passwordHash });
        await tx.insert(membership).values({ id: crypto.randomUUID(), companyId: DEMO_COMPANY_ID, userId: p.id, role: p.role });
      }
      for (const u of DEMO_UTILITIES) await tx.insert(utility).values({ ...u, companyId: DEMO_COMPANY_ID });
      const now = Date.now();
      for (const [i, h] of HOUSEHOLDS.entries()) {
        const householdId = uid(201 + i);
        const surname = h.name.split(" ")[0];
        await tx.insert(household).values({
          id: householdId,
          companyId: DEMO_COMPANY_ID,
          name: h.name,
          contactName: `${CONTACT_FIRST_NAMES[i % CONTACT_FIRST_NAMES.length]} ${surname}`,
          email: `${surname.toLowerCase()}@homeowner.example`,
          phone: `336-555-01${String(10 + i).padStart(2, "0")}`,
          street: h.street,
          city: h.city,
          region: "NC",
          postalCode: h.postalCode,
          latitude: h.latitude,
          longitude: h.longitude,
          // Invented service panels: a 225 A busbar behind a 200 A main (common in newer homes) lets the
          // demo's largest inverter (11.4 kW, 60 A breaker) pass the 120 % rule: 60 + 200 ≤ 270 A.
          serviceBusbarA: 225,
          serviceMainBreakerA: 200,
          serviceVoltageV: 240,
        });
        await tx.insert(deal).values({
          id: uid(301 + i),
          companyId: DEMO_COMPANY_ID,
          householdId,
          ownerUserId: uid(h.rep),
          stage: h.stage,
          stageChangedAt: new Date(now - h.daysInStage * 86_400_000),
          source: h.source,
          utilityId: DEMO_UTILITY_IDS.piedmont,
          // Every third household chose the time-of-use plan (invented).
          ratePlanId: i % 3 === 2 ? DEMO_RATE_PLAN_IDS.timeOfUse : DEMO_RATE_PLAN_IDS.residential,
          systemDcWatts: h.dcWatts,
          contractCents: h.contractCents,
        });
      }
      const ctx: SeedContext = { companyId: DEMO_COMPANY_ID, people: DEMO_PEOPLE, dealIds: HOUSEHOLDS.map((_, i) => uid(301 + i)), tx };
      for (const area of areas) await area.seed(ctx);
    });
    return { created: true };
  } finally {
    await connection.end();
  }
}
