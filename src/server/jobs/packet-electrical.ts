import "server-only";
import { and, eq } from "drizzle-orm";
import { deal, household } from "@/db/schema";
import type { PacketElectrical } from "@/lib/job-packet";
import type { DesignDocument } from "@/lib/schemas/design";
import { singleLineDiagram } from "@/lib/single-line-diagram";
import { getCompanySettings } from "@/server/company-settings";
import { db } from "@/server/db";
import { electricalFor } from "@/server/electrical";

/** The packet's electrical design and single-line diagram, for the equipment the packet shows (null: nothing to wire yet). */
export async function packetElectrical(
  companyId: string,
  x: { dealId: string; doc: DesignDocument | null; moduleId: string | null; inverterId: string | null; moduleCount: number; householdName: string; utilityName: string | null; moduleLabel: string },
): Promise<PacketElectrical | null> {
  if (!x.moduleId || !x.inverterId || x.moduleCount === 0) return null;
  const [panel] = await db()
    .select({ serviceBusbarA: household.serviceBusbarA, serviceMainBreakerA: household.serviceMainBreakerA, serviceVoltageV: household.serviceVoltageV })
    .from(deal)
    .innerJoin(household, and(eq(household.id, deal.householdId), eq(household.companyId, deal.companyId)))
    .where(and(eq(deal.id, x.dealId), eq(deal.companyId, companyId)))
    .limit(1);
  if (!panel) return null;
  const settings = await getCompanySettings(companyId);
  const design = await electricalFor(companyId, settings.electrical.necEdition, panel, {
    moduleId: x.moduleId,
    inverterId: x.inverterId,
    inverterCount: x.doc?.inverterCount ?? 1,
    moduleCount: x.moduleCount,
    stringPlan: x.doc?.stringPlan ?? null,
  });
  if (!design) return null;
  return { design, drawing: singleLineDiagram(design, { householdName: x.householdName, moduleLabel: x.moduleLabel, utilityName: x.utilityName }), checkedBy: settings.electrical.designerName };
}
