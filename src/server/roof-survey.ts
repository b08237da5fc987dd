import "server-only";
import { and, eq } from "drizzle-orm";
import { company, roofSurvey } from "@/db/schema";
import { packetSettingsOf, packetSettingsSchema, type PacketSettings } from "@/lib/schemas/packet-settings";
import { EMPTY_ROOF_SURVEY, type RoofSurveyValues } from "@/lib/schemas/roof-survey";
import { db, transaction } from "@/server/db";
import { inDealOrThrow, type DealScope } from "@/server/deal-scope";
import { notFound } from "@/server/errors";
import { validationError } from "@/server/route";
import type { Member } from "@/server/session";

export type RoofSurveyRecord = RoofSurveyValues & { id: string | null; dealId: string };

const columns = { id: roofSurvey.id, dealId: roofSurvey.dealId, designWindMph: roofSurvey.designWindMph, groundSnowPsf: roofSurvey.groundSnowPsf, homeRunM: roofSurvey.homeRunM, roofPlanAreaM2: roofSurvey.roofPlanAreaM2, faces: roofSurvey.faces };

/** The deal's roof survey; an empty one (id null) before the first save. */
export async function getRoofSurvey(companyId: string, dealId: string): Promise<RoofSurveyRecord> {
  const [row] = await db()
    .select(columns)
    .from(roofSurvey)
    .where(and(eq(roofSurvey.companyId, companyId), eq(roofSurvey.dealId, dealId)))
    .limit(1);
  return row ?? { ...EMPTY_ROOF_SURVEY, id: null, dealId };
}

/** A survey by its own id; reps only through deals they may see. */
export async function getRoofSurveyOrThrow(member: Member, id: string): Promise<RoofSurveyRecord> {
  const rows = await db()
    .select(columns)
    .from(roofSurvey)
    .where(and(eq(roofSurvey.id, id), eq(roofSurvey.companyId, member.companyId)))
    .limit(1);
  return inDealOrThrow(member, "Roof survey", rows);
}

/** Saves the deal's survey (one per deal; saving replaces it). */
export async function saveRoofSurvey(scope: DealScope, values: RoofSurveyValues): Promise<RoofSurveyRecord> {
  const { member, dealId } = scope;
  await transaction(async (tx) => {
    const [existing] = await tx
      .select({ id: roofSurvey.id })
      .from(roofSurvey)
      .where(and(eq(roofSurvey.companyId, member.companyId), eq(roofSurvey.dealId, dealId)))
      .for("update");
    if (existing) await tx.update(roofSurvey).set(values).where(and(eq(roofSurvey.id, existing.id), eq(roofSurvey.companyId, member.companyId)));
    else await tx.insert(roofSurvey).values({ id: crypto.randomUUID(), companyId: member.companyId, dealId, ...values });
  });
  return getRoofSurvey(member.companyId, dealId);
}

export async function getPacketSettings(companyId: string): Promise<PacketSettings> {
  const [row] = await db().select({ settings: company.settings }).from(company).where(eq(company.id, companyId)).limit(1);
  if (!row) throw notFound("Company");
  return packetSettingsOf(row.settings);
}

/** Saves the packet settings under company.settings.packet, keeping every other key. */
export async function savePacketSettings(member: Member, input: unknown): Promise<PacketSettings> {
  const parsed = packetSettingsSchema.safeParse(input);
  if (!parsed.success) throw validationError(parsed.error);
  await transaction(async (tx) => {
    const [row] = await tx.select({ settings: company.settings }).from(company).where(eq(company.id, member.companyId)).for("update");
    if (!row) throw notFound("Company");
    await tx.update(company).set({ settings: { ...(row.settings ?? {}), packet: parsed.data } as typeof row.settings }).where(eq(company.id, member.companyId));
  });
  return parsed.data;
}
