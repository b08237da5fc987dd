import "server-only";
import { randomBytes } from "node:crypto";
import { and, asc, eq, inArray } from "drizzle-orm";
import type { z } from "zod";
import { crew, job, membership, user } from "@/db/schema";
import { env } from "@/env";
import type { createCrewSchema, updateCrewSchema } from "@/lib/schemas/jobs";
import { companyRowOrThrow } from "@/server/records";
import { db, transaction } from "@/server/db";
import { HttpError } from "@/server/errors";
import type { Member } from "@/server/session";

export type CrewPerson = { membershipId: string; userId: string; name: string; email: string; status: "active" | "deactivated" };
export type CrewView = {
  id: string;
  name: string;
  /** The calendar feed's secret URL (anyone holding it can read the crew's schedule). */
  feedUrl: string;
  members: CrewPerson[];
  openJobs: number;
  createdAt: Date;
  updatedAt: Date;
};

/** 32 random bytes, base64url: the calendar feed's secret. */
export function newFeedToken(): string {
  return randomBytes(32).toString("base64url");
}

export function crewFeedUrl(token: string): string {
  return `${env().APP_URL}/api/calendar/${token}`;
}

async function crewPeople(companyId: string, crewIds: string[]): Promise<Map<string, CrewPerson[]>> {
  const byCrew = new Map<string, CrewPerson[]>();
  if (crewIds.length === 0) return byCrew;
  const rows = await db()
    .select({ crewId: membership.crewId, membershipId: membership.id, userId: user.id, name: user.name, email: user.email, status: membership.status })
    .from(membership)
    .innerJoin(user, eq(user.id, membership.userId))
    .where(and(eq(membership.companyId, companyId), eq(membership.role, "crew"), inArray(membership.crewId, crewIds)))
    .orderBy(asc(user.name));
  for (const { crewId, ...person } of rows) if (crewId) (byCrew.get(crewId) ?? byCrew.set(crewId, []).get(crewId)!).push(person);
  return byCrew;
}

async function openJobCounts(companyId: string): Promise<Map<string, number>> {
  const rows = await db()
    .select({ crewId: job.crewId, ptoOn: job.ptoOn })
    .from(job)
    .where(eq(job.companyId, companyId));
  const counts = new Map<string, number>();
  for (const r of rows) if (r.crewId && !r.ptoOn) counts.set(r.crewId, (counts.get(r.crewId) ?? 0) + 1);
  return counts;
}

/** The company's crews with their installers, for the office's crews page. */
export async function listCrews(member: Member): Promise<CrewView[]> {
  const rows = await db().select().from(crew).where(eq(crew.companyId, member.companyId)).orderBy(asc(crew.name));
  return crewViews(member.companyId, rows);
}

/** Crews with their installers, calendar link and open jobs. */
async function crewViews(companyId: string, rows: (typeof crew.$inferSelect)[]): Promise<CrewView[]> {
  const [people, counts] = await Promise.all([crewPeople(companyId, rows.map((r) => r.id)), openJobCounts(companyId)]);
  return rows.map((r) => ({
    id: r.id,
    name: r.name,
    feedUrl: crewFeedUrl(r.feedToken),
    members: people.get(r.id) ?? [],
    openJobs: counts.get(r.id) ?? 0,
    createdAt: r.createdAt,
    updatedAt: r.updatedAt,
  }));
}

/** Crew names only (for pickers on the job page). */
export async function listCrewOptions(companyId: string): Promise<{ id: string; name: string }[]> {
  return db().select({ id: crew.id, name: crew.name }).from(crew).where(eq(crew.companyId, companyId)).orderBy(asc(crew.name));
}

export async function getCrewOrThrow(member: Member, crewId: string): Promise<CrewView> {
  const [view] = await crewViews(member.companyId, [await companyRowOrThrow(crew, member.companyId, crewId, "Crew")]);
  return view;
}

/** The installers of the company (role crew) with the crew each belongs to, for assigning. */
export async function listInstallers(companyId: string): Promise<(CrewPerson & { crewId: string | null })[]> {
  return db()
    .select({ membershipId: membership.id, userId: user.id, name: user.name, email: user.email, status: membership.status, crewId: membership.crewId })
    .from(membership)
    .innerJoin(user, eq(user.id, membership.userId))
    .where(and(eq(membership.companyId, companyId), eq(membership.role, "crew")))
    .orderBy(asc(user.name));
}

/** The crew a signed-in installer belongs to (null: none, or not an installer). */
export async function crewIdOfMember(member: Member): Promise<string | null> {
  if (member.role !== "crew") return null;
  const [row] = await db()
    .select({ crewId: membership.crewId })
    .from(membership)
    .where(and(eq(membership.id, member.membershipId), eq(membership.companyId, member.companyId)))
    .limit(1);
  return row?.crewId ?? null;
}

/** The crew of a signed-in installer with its feed URL (for their own jobs page). */
export async function getOwnCrew(member: Member): Promise<{ id: string; name: string; feedUrl: string } | null> {
  const crewId = await crewIdOfMember(member);
  if (!crewId) return null;
  const [row] = await db()
    .select({ id: crew.id, name: crew.name, feedToken: crew.feedToken })
    .from(crew)
    .where(and(eq(crew.id, crewId), eq(crew.companyId, member.companyId)))
    .limit(1);
  return row ? { id: row.id, name: row.name, feedUrl: crewFeedUrl(row.feedToken) } : null;
}

async function assertNameFree(companyId: string, name: string, exceptId?: string): Promise<void> {
  const rows = await db()
    .select({ id: crew.id, name: crew.name })
    .from(crew)
    .where(eq(crew.companyId, companyId));
  if (rows.some((r) => r.id !== exceptId && r.name.toLowerCase() === name.toLowerCase())) {
    throw new HttpError(422, "validation_failed", "name: Another crew already has this name", { name: ["Another crew already has this name"] });
  }
}

export async function createCrew(member: Member, input: z.output<typeof createCrewSchema>): Promise<CrewView> {
  await assertNameFree(member.companyId, input.name);
  const id = crypto.randomUUID();
  await db().insert(crew).values({ id, companyId: member.companyId, name: input.name, feedToken: newFeedToken() });
  return getCrewOrThrow(member, id);
}

/**
 * Renames a crew and/or sets exactly who is in it. Only installers (role crew) of the same
 * company can join; someone moved here leaves their previous crew (one crew per person).
 */
export async function updateCrew(member: Member, crewId: string, input: z.output<typeof updateCrewSchema>): Promise<CrewView> {
  await getCrewOrThrow(member, crewId);
  if (input.name !== undefined) await assertNameFree(member.companyId, input.name, crewId);
  const memberIds = input.memberIds ? [...new Set(input.memberIds)] : undefined;
  if (memberIds && memberIds.length > 0) {
    const found = await db()
      .select({ id: membership.id, role: membership.role })
      .from(membership)
      .where(and(eq(membership.companyId, member.companyId), inArray(membership.id, memberIds)));
    const ok = new Set(found.filter((f) => f.role === "crew").map((f) => f.id));
    const bad = memberIds.findIndex((id) => !ok.has(id));
    if (bad >= 0) {
      const message = found.some((f) => f.id === memberIds[bad]) ? "Only installers (role Installer crew) can join a crew" : "Unknown person";
      throw new HttpError(422, "validation_failed", `memberIds.${bad}: ${message}`, { [`memberIds.${bad}`]: [message] });
    }
  }
  await transaction(async (tx) => {
    if (input.name !== undefined) {
      await tx
        .update(crew)
        .set({ name: input.name })
        .where(and(eq(crew.id, crewId), eq(crew.companyId, member.companyId)));
    }
    if (memberIds) {
      await tx
        .update(membership)
        .set({ crewId: null })
        .where(and(eq(membership.companyId, member.companyId), eq(membership.crewId, crewId)));
      if (memberIds.length > 0) {
        await tx
          .update(membership)
          .set({ crewId })
          .where(and(eq(membership.companyId, member.companyId), eq(membership.role, "crew"), inArray(membership.id, memberIds)));
      }
    }
  });
  return getCrewOrThrow(member, crewId);
}

/** A new feed secret: the old calendar URL stops working at once (404). */
export async function rotateCrewFeed(member: Member, crewId: string): Promise<CrewView> {
  await getCrewOrThrow(member, crewId);
  await db()
    .update(crew)
    .set({ feedToken: newFeedToken() })
    .where(and(eq(crew.id, crewId), eq(crew.companyId, member.companyId)));
  return getCrewOrThrow(member, crewId);
}

/** Public: the crew behind a calendar feed token, or null (unknown or rotated away). */
export async function findCrewByFeedToken(token: string): Promise<{ id: string; companyId: string; name: string } | null> {
  if (!/^[A-Za-z0-9_-]{32,64}$/.test(token)) return null;
  const [row] = await db()
    .select({ id: crew.id, companyId: crew.companyId, name: crew.name })
    .from(crew)
    .where(eq(crew.feedToken, token))
    .limit(1);
  return row ?? null;
}
