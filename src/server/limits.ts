import "server-only";
import { createHash } from "node:crypto";
import { RateLimiterMySQL, RateLimiterRes } from "rate-limiter-flexible";
import { env } from "@/env";
import { pool } from "@/server/db";
import { HttpError } from "@/server/errors";

/**
 * The one limiter of the app: rate-limiter-flexible's MySQL store on our MariaDB (table
 * `rate_limit`, created by a migration), so every app process shares the same counts. A turn is
 * taken atomically (one INSERT … ON DUPLICATE KEY UPDATE in a transaction) *before* the work it
 * guards, so requests sent at once cannot all slip under a limit. Every number below is our
 * choice unless a source is named.
 */
export const LIMITS = {
  /** Every sign-in attempt from one address (an office behind one NAT shares it); a success gives its turn back. */
  signInAddress: { points: 30, minutes: 15, what: "sign-in attempts from this address" },
  /** One e-mail from one address: OWASP ASVS 4.0 V2.2.1 (anti-automation); at most 5 passwords checked. */
  signInPair: { points: 5, minutes: 15, what: "wrong passwords for this e-mail" },
  /**
   * One e-mail from every address together: short on purpose, and lifted by a password reset,
   * so a stranger can hold an account back for at most 15 minutes at a time while its owner's
   * reset link always works.
   */
  signInEmail: { points: 10, minutes: 15, what: "wrong passwords for this e-mail" },
  /** Not a limit but a mark: an address this e-mail signed in from lately is spared the e-mail-wide lock. */
  knownAddress: { points: 1, minutes: 30 * 24 * 60, what: "" },
  signUpAddress: { points: 5, minutes: 60, what: "sign-ups from this address" },
  resetAddress: { points: 10, minutes: 15, what: "password reset requests from this address" },
  resetEmail: { points: 3, minutes: 15, what: "password reset e-mails for this address" },
  verificationEmail: { points: 3, minutes: 15, what: "confirmation e-mails for this address" },
  invitationCompany: { points: 30, minutes: 60, what: "invitations from your company" },
  invitationEmail: { points: 3, minutes: 60, what: "invitations to this address" },
  questionLink: { points: 20, minutes: 60, what: "questions on this proposal" },
  questionAddress: { points: 30, minutes: 60, what: "questions from this address" },
  /** A double tap on "send me a code" sends one code. */
  signingCodeGap: { points: 1, minutes: 1 / 3, what: "codes just now" },
  signingCodeLink: { points: 10, minutes: 60, what: "signing codes for this proposal" },
  signingCodeAddress: { points: 20, minutes: 60, what: "signing codes asked from this address" },
  /** The homeowner's language switch writes the proposal row each time: a person switches a few times, a script thousands (our choice). */
  languageLink: { points: 30, minutes: 10, what: "language changes on this proposal" },
  languageAddress: { points: 60, minutes: 10, what: "language changes from this address" },
  /** Each /verify check reads and hashes up to 25 MB with no account. */
  verifyAddress: { points: 20, minutes: 10, what: "checks from this address" },
} as const;

export type LimitName = keyof typeof LIMITS;

/** A refused turn: 429 with the wait in its message and in Retry-After (RFC 9110 §10.2.3). */
export class TooManyRequests extends HttpError {
  constructor(
    code: string,
    message: string,
    readonly retryAfterSeconds: number,
  ) {
    super(429, code, message);
  }
}

function databaseName(): string {
  return new URL(env().DATABASE_URL).pathname.replace(/^\//, "");
}

const globalForLimits = globalThis as unknown as { kilowrightLimiters?: Map<LimitName, RateLimiterMySQL> };

function limiter(name: LimitName): RateLimiterMySQL {
  const all = (globalForLimits.kilowrightLimiters ??= new Map());
  let found = all.get(name);
  if (!found) {
    const spec = LIMITS[name];
    found = new RateLimiterMySQL({
      storeClient: pool().pool, // the callback pool under mysql2/promise: the store's own API
      storeType: "pool",
      dbName: databaseName(),
      tableName: "rate_limit",
      tableCreated: true,
      keyPrefix: name,
      points: spec.points,
      duration: Math.round(spec.minutes * 60),
    });
    all.set(name, found);
  }
  return found;
}

/** E-mail addresses are kept as hashes: the table counts, it does not collect addresses. */
export function emailKey(email: string): string {
  return createHash("sha256").update(email.trim().toLowerCase()).digest("hex");
}

/** "3 minutes", "40 seconds": the wait as a person reads it. */
export function waitText(seconds: number): string {
  if (seconds < 60) return `${seconds} second${seconds === 1 ? "" : "s"}`;
  const minutes = Math.ceil(seconds / 60);
  return `${minutes} minute${minutes === 1 ? "" : "s"}`;
}

/**
 * Takes one turn of a limit for a key, or throws TooManyRequests naming the wait. The turn is
 * counted before the caller does the work; pass `message` to say it in the place's own words.
 */
export async function takeTurn(name: LimitName, key: string, message?: (wait: string) => string): Promise<void> {
  try {
    await limiter(name).consume(key);
  } catch (err) {
    if (!(err instanceof RateLimiterRes)) throw err; // the database is down: the caller answers 503
    const seconds = Math.max(1, Math.ceil(err.msBeforeNext / 1000));
    const wait = waitText(seconds);
    throw new TooManyRequests(`too_many_${name.replace(/[A-Z]/g, (c) => `_${c.toLowerCase()}`)}`, message ? message(wait) : `Too many ${LIMITS[name].what}. Try again in ${wait}.`, seconds);
  }
}

/** Like takeTurn, but answers false instead of throwing (for work that is skipped when over). */
export async function tryTurn(name: LimitName, key: string): Promise<boolean> {
  try {
    await takeTurn(name, key);
    return true;
  } catch (err) {
    if (err instanceof TooManyRequests) return false;
    throw err;
  }
}

/** Gives one turn back (a sign-in that succeeded). */
export async function giveBack(name: LimitName, key: string): Promise<void> {
  await limiter(name).reward(key, 1);
}

/** Sets the mark of a key (knownAddress) for its limit's whole window. */
export async function mark(name: LimitName, key: string): Promise<void> {
  await limiter(name).set(key, 1, Math.round(LIMITS[name].minutes * 60));
}

/** Whether a key holds a mark or a count now. */
export async function isMarked(name: LimitName, key: string): Promise<boolean> {
  return (await limiter(name).get(key)) !== null;
}

/** Forgets a key's count (a successful sign-in or password reset lifts the e-mail's lock). */
export async function clearTurns(name: LimitName, key: string): Promise<void> {
  await limiter(name).delete(key);
}
