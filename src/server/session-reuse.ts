import "server-only";
import { LRUCache } from "lru-cache";

/**
 * better-auth's answer for one Cookie header, reused for a few seconds. Asking better-auth costs
 * about 1.5 ms of CPU per request (its endpoint context, hooks, the signed-cookie check and a
 * session-table read); a person's browser sends the same Cookie header with every request, and
 * the deals table under load asks hundreds of times a second (docs/benchmarks.md, table-load).
 *
 * The trade-off, kept small: a session revoked elsewhere (a password reset on another device)
 * is still accepted for at most SESSION_REUSE_MS by a process that answered for it just before.
 * Signing out through this process forgets the entry at once. Who may do what is never reused:
 * session.ts reads the membership (active, role) on every request.
 */
export const SESSION_REUSE_MS = 5_000;

type Answer = NonNullable<Awaited<ReturnType<ReturnType<typeof import("@/server/auth").auth>["api"]["getSession"]>>>;

const answers = new LRUCache<string, Answer>({ max: 10_000, ttl: SESSION_REUSE_MS, ttlAutopurge: false });

/** The answer kept for this Cookie header, if younger than SESSION_REUSE_MS and its session not expired. */
export function reusedSession(cookie: string): Answer | undefined {
  const kept = answers.get(cookie);
  if (kept && new Date(kept.session.expiresAt).getTime() <= Date.now()) {
    answers.delete(cookie);
    return undefined;
  }
  return kept;
}

export function keepSession(cookie: string, answer: Answer): void {
  answers.set(cookie, answer);
}

/** On sign-out: the signed-out Cookie header is not answered from memory again. */
export function forgetSession(cookie: string | null | undefined): void {
  if (cookie) answers.delete(cookie);
}
