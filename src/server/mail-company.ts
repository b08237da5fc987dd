import "server-only";
// Which company a message about a person belongs to: their membership's. At sign-up the
// verification e-mail is sent while the company is still being created, so the sign-up wraps
// its call in `sendingForNewCompany` with the new company's id.
import { AsyncLocalStorage } from "node:async_hooks";
import { eq } from "drizzle-orm";
import { membership } from "@/db/schema";
import { db } from "@/server/db";

const newCompany = new AsyncLocalStorage<string>();

/** Runs `fn` with mail about people without a membership yet belonging to `companyId`. */
export function sendingForNewCompany<T>(companyId: string, fn: () => Promise<T>): Promise<T> {
  return newCompany.run(companyId, fn);
}

/** The user's company (a person belongs to one company), or the one being created for them; null when neither. */
export async function mailCompanyOfUser(userId: string): Promise<string | null> {
  const [row] = await db().select({ companyId: membership.companyId }).from(membership).where(eq(membership.userId, userId)).limit(1);
  return row?.companyId ?? newCompany.getStore() ?? null;
}
