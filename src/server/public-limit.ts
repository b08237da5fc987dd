import "server-only";
import { LRUCache } from "lru-cache";
import { HttpError } from "@/server/errors";

/**
 * How often one address may use the public signed-PDF check (/verify): each check reads and
 * hashes up to 25 MB, and needs no account. 20 checks in 10 minutes is far more than a person
 * checking their documents needs (our choice). Counted per app process in memory: a limit
 * against abuse, not an exact quota. The address is the first X-Forwarded-For hop (Next
 * fills it from the socket when no proxy set it), as clientMeta reads it.
 */
export const VERIFY_LIMIT = { max: 20, windowMs: 10 * 60_000 } as const;

const checks = new LRUCache<string, number[]>({ max: 50_000, ttl: VERIFY_LIMIT.windowMs });

/** Counts one check for this address, or throws 429 naming when the next one is possible. */
export function takeVerifyTurn(address: string, now = Date.now()): void {
  const recent = (checks.get(address) ?? []).filter((t) => now - t < VERIFY_LIMIT.windowMs);
  if (recent.length >= VERIFY_LIMIT.max) {
    const minutes = Math.max(1, Math.ceil((recent[0] + VERIFY_LIMIT.windowMs - now) / 60_000));
    throw new HttpError(429, "too_many_checks", `Too many checks from this address. Try again in ${minutes} minute${minutes === 1 ? "" : "s"}.`);
  }
  recent.push(now);
  checks.set(address, recent);
}
