import "server-only";
import { and, eq } from "drizzle-orm";
import { company, household } from "@/db/schema";
import type { ElectricalDesign } from "@/engine/electrical/design";
import { electricalDesignOf } from "@/lib/electrical-design";
import type { DesignDocument } from "@/lib/schemas/design";
import type { ElectricalSettings, servicePanelSchema } from "@/lib/schemas/electrical";
import { storedCompanySettingsSchema } from "@/lib/schemas/company-settings";
import { unbuildableReason, type SoldInverter } from "@/lib/string-plan-rule";
import { getInverterOrThrow, getModuleOrThrow } from "@/server/catalog";
import { transaction } from "@/server/db";
import type { DealScope } from "@/server/deal-scope";
import { notFound } from "@/server/errors";
import type { Member } from "@/server/session";
import { recordEvent } from "@/server/timeline";
import type { z } from "zod";

type Panel = { serviceBusbarA: number | null; serviceMainBreakerA: number | null; serviceVoltageV: number | null };

/** The equipment an electrical design is drawn for: the design's, or an offer's own choice over it. */
export type ElectricalEquipment = { moduleId: string; inverterId: string; inverterCount: number; moduleCount: number; stringPlan: DesignDocument["stringPlan"] };

/** The electrical design of some equipment on a household's panel; null when a catalog entry is gone. */
export async function electricalFor(companyId: string, edition: ElectricalSettings["necEdition"], panel: Panel, e: ElectricalEquipment): Promise<ElectricalDesign | null> {
  const mod = await getModuleOrThrow(companyId, e.moduleId).catch(() => null);
  const inv = await getInverterOrThrow(companyId, e.inverterId).catch(() => null);
  if (!mod || !inv) return null;
  return electricalDesignOf({
    edition,
    module: mod,
    inverter: inv,
    inverterCount: e.inverterCount,
    moduleCount: e.moduleCount,
    stringPlan: e.stringPlan,
    panel,
  });
}

export const designModuleCount = (doc: DesignDocument) => doc.faces.reduce((s, f) => s + f.moduleCount, 0);

/** The deal's design, wired: for the Design tab and the single-line diagram. */
export async function dealElectrical(scope: DealScope, doc: DesignDocument | null | undefined): Promise<ElectricalDesign | null> {
  if (!doc || designModuleCount(doc) === 0) return null;
  return electricalFor(scope.companyId, scope.settings.electrical.necEdition, scope.household, {
    moduleId: doc.moduleId,
    inverterId: doc.inverterId,
    inverterCount: doc.inverterCount,
    moduleCount: designModuleCount(doc),
    stringPlan: doc.stringPlan,
  });
}

type OfferLike = { inputs: { moduleId: string | null; inverterId: string | null; faceCounts: { faceId: string; moduleCount: number }[] | null } };

/** Why an offer cannot go into a proposal (string plan, electrical design), or null. */
export async function offerUnbuildableReason(scope: DealScope, doc: DesignDocument | null | undefined, o: OfferLike, sold: SoldInverter): Promise<string | null> {
  if (!doc) return unbuildableReason(sold, null, null);
  const moduleCount = o.inputs.faceCounts ? o.inputs.faceCounts.reduce((s, f) => s + f.moduleCount, 0) : designModuleCount(doc);
  const electrical = await electricalFor(scope.companyId, scope.settings.electrical.necEdition, scope.household, {
    moduleId: o.inputs.moduleId ?? doc.moduleId,
    inverterId: o.inputs.inverterId ?? doc.inverterId,
    inverterCount: doc.inverterCount,
    moduleCount,
    stringPlan: doc.stringPlan,
  });
  return unbuildableReason(sold, doc.stringPlan, electrical);
}

/** The Household tab's service panel form. */
export async function updateServicePanel(scope: DealScope, input: z.output<typeof servicePanelSchema>): Promise<void> {
  const { member, dealId } = scope;
  await transaction(async (tx) => {
    await tx.update(household).set(input).where(and(eq(household.id, scope.deal.householdId), eq(household.companyId, member.companyId)));
    const text = (a: number | null) => (a === null ? "not known" : `${a} A`);
    await recordEvent(tx, {
      companyId: member.companyId,
      dealId,
      kind: "household.updated",
      summary: `Service panel set by ${member.name}: busbar ${text(input.serviceBusbarA)}, main breaker ${text(input.serviceMainBreakerA)}${input.serviceVoltageV ? `, ${input.serviceVoltageV} V` : ""}`,
      actorUserId: member.userId,
    });
  });
}

/** Settings → Company → Electrical design. Other keys of company.settings are kept. */
export async function saveElectricalSettings(member: Member, input: ElectricalSettings): Promise<void> {
  await transaction(async (tx) => {
    const [row] = await tx.select({ settings: company.settings }).from(company).where(eq(company.id, member.companyId)).for("update");
    if (!row) throw notFound("Company");
    const previous = row.settings ?? storedCompanySettingsSchema.parse({});
    await tx.update(company).set({ settings: { ...previous, electrical: input } }).where(eq(company.id, member.companyId));
  });
}
