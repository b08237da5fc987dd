import "server-only";
import { and, asc, eq, isNull } from "drizzle-orm";
import ical from "ical-generator";
import { env } from "@/env";
import { company, deal, household, job } from "@/db/schema";
import { findCrewByFeedToken } from "@/server/crews";
import { householdAddress } from "@/server/records";
import { db } from "@/server/db";
import { addDaysToDate } from "@/lib/zoned-time";
import { companyToday, JOB_DATE_LABELS, type JobDateKind } from "./dates";

// ── The crew's calendar feed (RFC 5545) ─────────────────────────────────────────────────

/** How far back the feed reaches: recent visits stay visible for a while, older ones drop off. */
const FEED_PAST_DAYS = 60;

/**
 * The iCalendar feed of a crew's jobs behind its secret token, or null for an unknown (or
 * rotated) token. One all-day event per dated visit (survey, install, inspection) with the
 * household, the address and a link to the job; UIDs are stable so calendar apps update
 * events in place instead of duplicating them. No phone numbers: the URL is shareable.
 */
export async function crewCalendarIcs(token: string, now = new Date()): Promise<string | null> {
  const found = await findCrewByFeedToken(token);
  if (!found) return null;
  const rows = await db()
    .select({
      id: job.id,
      surveyDate: job.surveyDate,
      installDate: job.installDate,
      inspectionOn: job.inspectionOn,
      updatedAt: job.updatedAt,
      householdName: household.name,
      ...householdAddress,
    })
    .from(job)
    .innerJoin(deal, and(eq(deal.id, job.dealId), eq(deal.companyId, job.companyId)))
    .innerJoin(household, and(eq(household.id, deal.householdId), eq(household.companyId, deal.companyId)))
    // A cancelled job's events leave the feed (our choice over STATUS:CANCELLED, RFC 5545
    // 3.8.1.11): a subscribed calendar replaces its copy with each fetch, so a missing UID is
    // deleted everywhere, while a cancelled-status event is still shown by some calendar apps.
    .where(and(eq(job.companyId, found.companyId), eq(job.crewId, found.id), isNull(job.cancelledAt)))
    .orderBy(asc(job.id));
  const [co] = await db().select({ name: company.name }).from(company).where(eq(company.id, found.companyId)).limit(1);
  const since = addDaysToDate(await companyToday(found.companyId, now), -FEED_PAST_DAYS);
  const calendar = ical({
    name: `${found.name} — ${co?.name ?? "Jobs"}`,
    prodId: { company: "Kilowright", product: "Crew jobs", language: "EN" },
    description: `Jobs of ${found.name}`,
  });
  for (const r of rows) {
    const address = `${r.street}, ${r.city}, ${r.region} ${r.postalCode}`;
    const visits: { kind: JobDateKind; date: string | null }[] = [
      { kind: "survey", date: r.surveyDate },
      { kind: "install", date: r.installDate },
      { kind: "inspection", date: r.inspectionOn },
    ];
    for (const v of visits) {
      if (!v.date || v.date < since) continue;
      const url = `${env().APP_URL}/jobs/${r.id}`;
      calendar.createEvent({
        id: `job-${r.id}-${v.kind}@kilowright`,
        start: new Date(`${v.date}T00:00:00Z`),
        end: new Date(`${addDaysToDate(v.date, 1)}T00:00:00Z`),
        allDay: true,
        stamp: r.updatedAt,
        summary: `${JOB_DATE_LABELS[v.kind]}: ${r.householdName}`,
        location: { title: r.householdName, address, geo: { lat: r.latitude, lon: r.longitude } },
        description: `${JOB_DATE_LABELS[v.kind]} at ${r.householdName}, ${address}.\nJob packet: ${url}`,
        url,
      });
    }
  }
  return calendar.toString();
}
