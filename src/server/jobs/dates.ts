import "server-only";
import { addDaysToDate, todayInZone } from "@/lib/zoned-time";
import { getCompanySettings } from "@/server/company-settings";

// ── Dates ────────────────────────────────────────────────────────────────────────────────

/** Today in the company's time zone (Settings → Company). */
export async function companyToday(companyId: string, now = new Date()): Promise<string> {
  const { timeZone } = await getCompanySettings(companyId);
  return todayInZone(timeZone, now);
}

export type JobDateKind = "survey" | "install" | "inspection";
export const JOB_DATE_LABELS: Record<JobDateKind, string> = { survey: "Site survey", install: "Install", inspection: "Inspection" };
/** How a crew's list is grouped: work today, in the next 7 days, later, or nothing scheduled ahead. */
export type JobBucket = "today" | "week" | "later" | "none";

/** The next dated visit of a job from `today` on (survey, install, inspection), or null. */
export function nextJobDate(
  j: { surveyDate: string | null; installDate: string | null; inspectionOn: string | null; installedAt?: Date | null },
  today: string,
): { kind: JobDateKind; date: string } | null {
  const dates: { kind: JobDateKind; date: string | null }[] = [
    { kind: "survey", date: j.surveyDate },
    { kind: "install", date: j.installedAt ? null : j.installDate },
    { kind: "inspection", date: j.inspectionOn },
  ];
  const ahead = dates.filter((d): d is { kind: JobDateKind; date: string } => !!d.date && d.date >= today).sort((a, b) => a.date.localeCompare(b.date));
  return ahead[0] ?? null;
}

export function jobBucket(next: { date: string } | null, today: string): JobBucket {
  if (!next) return "none";
  if (next.date === today) return "today";
  return next.date <= addDaysToDate(today, 6) ? "week" : "later";
}
