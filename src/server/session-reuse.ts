import "server-only";
import { LRUCache } from "lru-cache";
import type { Member } from "@/server/member";

/**
 * Who is asking, reused for a few seconds per Cookie header. Answering it costs better-auth's
 * session check (≈ 3 ms of CPU: its endpoint context, hooks, the signed cookie and the session
 * table) and the membership query (≈ 0.3 ms); a person's browser sends the same Cookie header
 * with every request, and the deals table under load asks a thousand times a second
 * (docs/benchmarks.md, table-load).
 *
 * The trade-off, kept small: a change made by another app process (a session revoked by a
 * password reset, a role change or deactivation answered by another process) holds there after
 * at most SESSION_REUSE_MS. In this process it holds at once: signing out forgets the Cookie
 * header, and people.ts forgets a person whose role or status changes.
 */
export const SESSION_REUSE_MS = 5_000;

type Kept = { member: Member; sessionExpiresAt: number };
// On globalThis: Next bundles each page and each route handler apart, and a module-level cache
// would be one per bundle, so a role change saved by a route handler would not reach pages.
const globalForReuse = globalThis as unknown as { kilowrightSessionReuse?: LRUCache<string, Kept> };
const members = (globalForReuse.kilowrightSessionReuse ??= new LRUCache<string, Kept>({ max: 10_000, ttl: SESSION_REUSE_MS }));

/** The member kept for this Cookie header, if younger than SESSION_REUSE_MS and the session not expired. */
export function reusedMember(cookie: string): Member | undefined {
  const kept = members.get(cookie);
  if (!kept) return undefined;
  if (kept.sessionExpiresAt <= Date.now()) {
    members.delete(cookie);
    return undefined;
  }
  return kept.member;
}

export function keepMember(cookie: string, member: Member, sessionExpiresAt: Date): void {
  // Frozen: one object answers many requests.
  members.set(cookie, { member: Object.freeze(member), sessionExpiresAt: sessionExpiresAt.getTime() });
}

/** On sign-out: the signed-out Cookie header is not answered from memory again. */
export function forgetCookie(cookie: string | null | undefined): void {
  if (cookie) members.delete(cookie);
}

/** After a role or status change: every kept answer for that person is dropped. */
export function forgetPerson(userId: string): void {
  for (const [cookie, kept] of members.entries()) if (kept.member.userId === userId) members.delete(cookie);
}
