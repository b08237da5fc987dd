import "server-only";
import { and, asc, count, eq } from "drizzle-orm";
import { savedView } from "@/db/schema";
import {
  SAVED_VIEWS_PER_PERSON,
  type SavedView,
  type SavedViewQuery,
  type savedViewCreateSchema,
  type savedViewUpdateSchema,
} from "@/lib/schemas/deal-table";
import { db, transaction } from "@/server/db";
import { HttpError, notFound } from "@/server/errors";
import type { Member } from "@/server/session";
import type { z } from "zod";

/** A saved view belongs to one person of one company: both in every query. */
const ownedBy = (member: Member) => and(eq(savedView.companyId, member.companyId), eq(savedView.userId, member.userId));

type Row = typeof savedView.$inferSelect;

const toView = (r: Row): SavedView => ({
  id: r.id,
  name: r.name,
  query: r.query,
  createdAt: r.createdAt.toISOString(),
  updatedAt: r.updatedAt.toISOString(),
});

/** Drops empty values so the stored JSON holds only what the view sets. */
function storedQuery(q: SavedViewQuery): SavedViewQuery {
  return Object.fromEntries(Object.entries(q).filter(([, v]) => v !== undefined && v !== null && v !== "")) as SavedViewQuery;
}

const duplicateName = (name: string) =>
  new HttpError(409, "duplicate_name", `You already have a view named “${name}”.`, { name: [`You already have a view named “${name}”`] });

function isDuplicateKey(err: unknown): boolean {
  for (let e: unknown = err, depth = 0; e && depth < 5; depth++) {
    if (typeof e === "object" && e !== null && (e as { code?: unknown }).code === "ER_DUP_ENTRY") return true;
    e = typeof e === "object" && e !== null ? (e as { cause?: unknown }).cause : null;
  }
  return false;
}

export async function listSavedViews(member: Member): Promise<SavedView[]> {
  const rows = await db().select().from(savedView).where(ownedBy(member)).orderBy(asc(savedView.name));
  return rows.map(toView);
}

/** One's own view; another person's (or company's) is simply not found. */
export async function getSavedViewOrThrow(member: Member, id: string): Promise<SavedView> {
  const [row] = await db()
    .select()
    .from(savedView)
    .where(and(eq(savedView.id, id), ownedBy(member)))
    .limit(1);
  if (!row) throw notFound("Saved view");
  return toView(row);
}

export async function createSavedView(member: Member, input: z.output<typeof savedViewCreateSchema>): Promise<SavedView> {
  const id = crypto.randomUUID();
  try {
    await transaction(async (tx) => {
      const [{ n }] = await tx.select({ n: count() }).from(savedView).where(ownedBy(member));
      if (Number(n) >= SAVED_VIEWS_PER_PERSON) {
        throw new HttpError(409, "too_many_views", `You can keep up to ${SAVED_VIEWS_PER_PERSON} views; delete one first.`);
      }
      await tx.insert(savedView).values({ id, companyId: member.companyId, userId: member.userId, name: input.name, query: storedQuery(input.query) });
    });
  } catch (err) {
    if (isDuplicateKey(err)) throw duplicateName(input.name);
    throw err;
  }
  return getSavedViewOrThrow(member, id);
}

export async function updateSavedView(member: Member, id: string, input: z.output<typeof savedViewUpdateSchema>): Promise<SavedView> {
  await getSavedViewOrThrow(member, id);
  const change: Partial<typeof savedView.$inferInsert> = {};
  if (input.name !== undefined) change.name = input.name;
  if (input.query !== undefined) change.query = storedQuery(input.query);
  try {
    await db()
      .update(savedView)
      .set(change)
      .where(and(eq(savedView.id, id), ownedBy(member)));
  } catch (err) {
    if (isDuplicateKey(err) && input.name !== undefined) throw duplicateName(input.name);
    throw err;
  }
  return getSavedViewOrThrow(member, id);
}

export async function deleteSavedView(member: Member, id: string): Promise<void> {
  const result = await db()
    .delete(savedView)
    .where(and(eq(savedView.id, id), ownedBy(member)));
  if (result[0].affectedRows !== 1) throw notFound("Saved view");
}
