import "server-only";
import { and, eq, sql } from "drizzle-orm";
import { priceBook, user } from "@/db/schema";
import { can } from "@/lib/permissions";
import { emptyPriceBook, priceBookSchema, type PriceBook } from "@/lib/schemas/price-book";
import { db, transaction } from "@/server/db";
import { forbidden, HttpError, notFound } from "@/server/errors";
import { validationError } from "@/server/route";
import type { Member } from "@/server/session";
import { listUtilities } from "@/server/utilities";

export type PriceBookRecord = {
  id: string;
  document: PriceBook;
  /** Every save adds one; incentivesVersion only when the incentive rules change (offers record both). */
  version: number;
  incentivesVersion: number;
  updatedAt: Date;
  updatedByName: string | null;
};

const recordColumns = { id: priceBook.id, document: priceBook.document, version: priceBook.version, incentivesVersion: priceBook.incentivesVersion, updatedAt: priceBook.updatedAt, updatedByName: user.name };

/** The company's saved price book with who changed it last, or null before the first save. */
export async function getPriceBookRecord(companyId: string): Promise<PriceBookRecord | null> {
  const [row] = await db()
    .select(recordColumns)
    .from(priceBook)
    .leftJoin(user, eq(user.id, priceBook.updatedByUserId))
    .where(eq(priceBook.companyId, companyId))
    .limit(1);
  return row ?? null;
}

/** The company's price book document; a company that never saved one gets the empty book. */
export async function getPriceBook(companyId: string): Promise<PriceBook> {
  return (await getPriceBookRecord(companyId))?.document ?? emptyPriceBook();
}

export async function getPriceBookOrThrow(companyId: string, id: string): Promise<PriceBookRecord> {
  const [row] = await db()
    .select(recordColumns)
    .from(priceBook)
    .leftJoin(user, eq(user.id, priceBook.updatedByUserId))
    .where(and(eq(priceBook.id, id), eq(priceBook.companyId, companyId)))
    .limit(1);
  if (!row) throw notFound("Price book");
  return row;
}

/** A utility's rebate names one of the company's utilities (422 on that rule's field otherwise). */
async function checkIncentiveUtilities(companyId: string, book: PriceBook): Promise<void> {
  const named = book.incentives.flatMap((rule, i) => (rule.utilityId ? [{ i, utilityId: rule.utilityId }] : []));
  if (named.length === 0) return;
  const known = new Set((await listUtilities(companyId)).map((u) => u.id));
  const fields = Object.fromEntries(named.filter((n) => !known.has(n.utilityId)).map((n) => [`incentives.${n.i}.utilityId`, ["Pick the utility from the list"]]));
  const first = Object.keys(fields)[0];
  if (first) throw new HttpError(422, "validation_failed", `${first}: Pick the utility from the list`, fields);
}

/**
 * Replaces the company's price book with a validated document (422 naming each bad field;
 * nothing is written then). One row per company: the first save creates it.
 */
export async function savePriceBook(member: Member, doc: unknown): Promise<PriceBookRecord> {
  if (!can(member.role, "pricebook:manage")) throw forbidden("changing the price book");
  const parsed = priceBookSchema.safeParse(doc);
  if (!parsed.success) throw validationError(parsed.error);
  await checkIncentiveUtilities(member.companyId, parsed.data);
  await transaction(async (tx) => {
    const [row] = await tx.select({ document: priceBook.document }).from(priceBook).where(eq(priceBook.companyId, member.companyId)).for("update");
    if (!row) {
      // A first save racing another: the later one counts as a change of everything.
      await tx
        .insert(priceBook)
        .values({ id: crypto.randomUUID(), companyId: member.companyId, document: parsed.data, updatedByUserId: member.userId })
        .onDuplicateKeyUpdate({ set: { document: parsed.data, version: sql`${priceBook.version} + 1`, incentivesVersion: sql`${priceBook.incentivesVersion} + 1`, updatedByUserId: member.userId } });
      return;
    }
    const incentivesChanged = JSON.stringify(row.document.incentives) !== JSON.stringify(parsed.data.incentives);
    await tx
      .update(priceBook)
      .set({
        document: parsed.data,
        version: sql`${priceBook.version} + 1`,
        ...(incentivesChanged ? { incentivesVersion: sql`${priceBook.incentivesVersion} + 1` } : {}),
        updatedByUserId: member.userId,
        updatedAt: sql`CURRENT_TIMESTAMP(3)`,
      })
      .where(eq(priceBook.companyId, member.companyId));
  });
  const saved = await getPriceBookRecord(member.companyId);
  if (!saved) throw new Error("price book vanished right after saving");
  return saved;
}
