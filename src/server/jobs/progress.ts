import "server-only";
import { and, eq } from "drizzle-orm";
import { deal, type Stage } from "@/db/schema";
import { db } from "@/server/db";
import { companyToday } from "./dates";
import { findJobForDeal } from "./read";

// ── The customer's view of the project (their proposal page) ────────────────────────────

export type ProjectProgress = {
  stage: Stage;
  today: string;
  /** Only dates and whether the permit is approved: no staff names, numbers or notes. */
  job: { surveyDate: string | null; installDate: string | null; inspectionOn: string | null; ptoOn: string | null; permitApproved: boolean; installed: boolean } | null;
};

/** What the customer's project page shows, for the deal of a signed proposal. */
export async function getProjectProgress(companyId: string, dealId: string, now = new Date()): Promise<ProjectProgress | null> {
  const [d] = await db()
    .select({ stage: deal.stage })
    .from(deal)
    .where(and(eq(deal.id, dealId), eq(deal.companyId, companyId)))
    .limit(1);
  if (!d) return null;
  const j = await findJobForDeal(companyId, dealId);
  return {
    stage: d.stage,
    today: await companyToday(companyId, now),
    job: j
      ? {
          surveyDate: j.surveyDate,
          installDate: j.installDate,
          inspectionOn: j.inspectionOn,
          ptoOn: j.ptoOn,
          permitApproved: !!j.permitApprovedOn,
          installed: !!j.installedAt,
        }
      : null,
  };
}
