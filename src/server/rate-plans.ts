import "server-only";
import { and, asc, desc, eq, sql } from "drizzle-orm";
import { ratePlan, utility } from "@/db/schema";
import type { RatePlan } from "@/engine/rates";
import { can } from "@/lib/permissions";
import { ratePlanRecordSchema } from "@/lib/schemas/rate-plan";
import { db } from "@/server/db";
import { forbidden, notFound } from "@/server/errors";
import { validationError } from "@/server/route";
import type { Member } from "@/server/session";
import { utilityForField } from "@/server/utilities";

/** Plans with their utility's name (the utility of the plan's own company). */
const plansWithUtility = () =>
  db()
    .select(columns)
    .from(ratePlan)
    .innerJoin(utility, and(eq(utility.id, ratePlan.utilityId), eq(utility.companyId, ratePlan.companyId)));

export type RatePlanRow = {
  id: string;
  name: string;
  utilityId: string;
  /** The utility's name as it is now (the plan belongs to the utility record). */
  utilityName: string;
  /** The utility's time zone: the plan's time-of-use hours are that wall clock's. */
  utilityTimeZone: string;
  active: boolean;
  /** The engine's rate plan (src/engine/rates.ts), defaults filled in. */
  plan: RatePlan;
  /** Every change adds one; offers record the version they were priced with. */
  version: number;
  updatedAt: Date;
};

const columns = {
  id: ratePlan.id,
  name: ratePlan.name,
  utilityId: ratePlan.utilityId,
  utilityName: utility.name,
  utilityTimeZone: utility.timeZone,
  active: ratePlan.active,
  plan: ratePlan.plan,
  version: ratePlan.version,
  updatedAt: ratePlan.updatedAt,
};

/** The company's rate plans: active first, then by utility and name. */
export async function listRatePlans(companyId: string): Promise<RatePlanRow[]> {
  const rows = await plansWithUtility()
    .where(eq(ratePlan.companyId, companyId))
    .orderBy(desc(ratePlan.active), asc(utility.name), asc(ratePlan.name));
  return rows;
}

export async function getRatePlanOrThrow(companyId: string, id: string): Promise<RatePlanRow> {
  const [row] = await plansWithUtility()
    .where(and(eq(ratePlan.id, id), eq(ratePlan.companyId, companyId)))
    .limit(1);
  if (!row) throw notFound("Rate plan");
  return row;
}

function parseInput(input: unknown) {
  const parsed = ratePlanRecordSchema.safeParse(input);
  if (!parsed.success) throw validationError(parsed.error);
  return parsed.data;
}

export async function createRatePlan(member: Member, input: unknown): Promise<RatePlanRow> {
  if (!can(member.role, "rates:manage")) throw forbidden("changing rate plans");
  const data = parseInput(input);
  await utilityForField(member.companyId, data.utilityId, "utilityId");
  const id = crypto.randomUUID();
  await db().insert(ratePlan).values({ id, companyId: member.companyId, name: data.plan.name, utilityId: data.utilityId, plan: data.plan, active: data.active });
  return getRatePlanOrThrow(member.companyId, id);
}

/** Replaces a plan's content (404 for another company's plan; nothing is written on bad input). */
export async function updateRatePlan(member: Member, id: string, input: unknown): Promise<RatePlanRow> {
  if (!can(member.role, "rates:manage")) throw forbidden("changing rate plans");
  const data = parseInput(input);
  await getRatePlanOrThrow(member.companyId, id);
  await utilityForField(member.companyId, data.utilityId, "utilityId");
  await db()
    .update(ratePlan)
    .set({ name: data.plan.name, utilityId: data.utilityId, plan: data.plan, active: data.active, version: sql`${ratePlan.version} + 1` })
    .where(and(eq(ratePlan.id, id), eq(ratePlan.companyId, member.companyId)));
  return getRatePlanOrThrow(member.companyId, id);
}
