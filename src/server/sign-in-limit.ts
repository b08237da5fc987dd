import "server-only";
import { and, count, eq, gt, lt } from "drizzle-orm";
import { signInFailure } from "@/db/schema";
import { db } from "@/server/db";

/** Five wrong passwords within the window; the sixth attempt is refused with 429. */
export const MAX_FAILURES = 5;
export const WINDOW_MINUTES = 15;

const windowStart = () => new Date(Date.now() - WINDOW_MINUTES * 60_000);

export async function signInBlocked(email: string): Promise<boolean> {
  const [row] = await db()
    .select({ n: count() })
    .from(signInFailure)
    .where(and(eq(signInFailure.email, email), gt(signInFailure.failedAt, windowStart())));
  return (row?.n ?? 0) >= MAX_FAILURES;
}

export async function recordSignInFailure(email: string): Promise<void> {
  await db().insert(signInFailure).values({ email, failedAt: new Date() });
  // Old rows are useless; trimming here keeps the table small without a scheduler.
  await db().delete(signInFailure).where(and(eq(signInFailure.email, email), lt(signInFailure.failedAt, windowStart())));
}

export async function clearSignInFailures(email: string): Promise<void> {
  await db().delete(signInFailure).where(eq(signInFailure.email, email));
}
