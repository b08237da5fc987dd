// Sign-in limits through better-auth's real handler against the test MariaDB: turns are taken
// atomically before the password is checked (limits.ts), per address, per e-mail from that
// address and per e-mail; a password reset lifts the e-mail's lock. Deactivation is named only
// after the right password.
import { hashPassword } from "better-auth/crypto";
import { and, eq, like } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { account, membership, verification } from "@/db/schema";
import { env } from "@/env";
import { auth } from "@/server/auth";
import { stampedHeaders } from "@/server/client-address";
import { db } from "@/server/db";
import { LIMITS } from "@/server/limits";
import { addMember, newCompany, uniqueEmail } from "../support/fixtures";
import type { Member } from "@/server/session";

const PASSWORD = "limit-test-password-2026";
let owner: Member;

/** A random documentation address (RFC 5737 / RFC 3849), so runs and tests never share a count. */
const someAddress = () => `198.51.100.${Math.floor(Math.random() * 250) + 1}`;
const someV6 = () => `2001:db8:${Math.floor(Math.random() * 0xffff).toString(16)}::${Math.floor(Math.random() * 0xffff).toString(16)}`;

async function withPassword(m: Member, password = PASSWORD): Promise<Member> {
  await db().insert(account).values({ id: crypto.randomUUID(), accountId: m.userId, providerId: "credential", userId: m.userId, password: await hashPassword(password) });
  return m;
}

/** POST to better-auth's handler as the app server hands a request on (address stamped from the connection). */
function post(path: string, body: unknown, address: string): Promise<Response> {
  const url = `${env().APP_URL}/api/auth${path}`;
  const headers = stampedHeaders(address, { "content-type": "application/json", origin: env().APP_URL });
  return auth().handler(new Request(url, { method: "POST", headers, body: JSON.stringify(body) }));
}

const signIn = (email: string, password: string, address: string) => post("/sign-in/email", { email, password }, address);

beforeAll(async () => {
  owner = await newCompany("Limit Solar");
});

describe("sign-in limits", () => {
  it("checks at most 5 of 50 wrong passwords sent at once; the rest get 429 with Retry-After", async () => {
    const person = await withPassword(await addMember(owner, "sales_rep", "Rory Race"));
    const address = someAddress();
    const answers = await Promise.all(Array.from({ length: 50 }, (_, i) => signIn(person.email, `wrong-password-${i}`, address)));
    const statuses = answers.map((r) => r.status);
    expect(statuses.filter((s) => s === 401).length).toBeLessThanOrEqual(LIMITS.signInPair.points);
    expect(statuses.filter((s) => s === 401).length + statuses.filter((s) => s === 429).length).toBe(50);
    const refused = answers.find((r) => r.status === 429)!;
    expect(Number(refused.headers.get("retry-after"))).toBeGreaterThan(0);
    expect(Number(refused.headers.get("retry-after"))).toBeLessThanOrEqual(15 * 60);
    expect(((await refused.json()) as { message: string }).message).toMatch(/Too many wrong passwords for this e-mail\. Wait \d+ minutes?, or reset your password\./);
    // Even the right password is not checked from this address now.
    expect((await signIn(person.email, PASSWORD, address)).status).toBe(429);
  });

  it("a successful password reset lifts the e-mail's lock", async () => {
    const person = await withPassword(await addMember(owner, "office_manager", "Reese Reset"));
    // A stranger at three other addresses spends every wrong password the e-mail allows.
    for (let a = 0; a < 3; a++) {
      const stranger = someV6();
      for (let i = 0; i < LIMITS.signInPair.points; i++) await signIn(person.email, `guess-${a}-${i}-password`, stranger);
    }
    const home = someAddress();
    const locked = await signIn(person.email, PASSWORD, home);
    expect(locked.status).toBe(429);

    expect((await post("/request-password-reset", { email: person.email, redirectTo: "/reset-password" }, home)).status).toBe(200);
    const [row] = await db().select().from(verification).where(and(like(verification.identifier, "reset-password:%"), eq(verification.value, person.userId)));
    const token = row.identifier.slice("reset-password:".length);
    expect((await post("/reset-password", { token, newPassword: "a-brand-new-password-2026" }, home)).status).toBe(200);

    expect((await signIn(person.email, "a-brand-new-password-2026", home)).status).toBe(200);
  });

  it("a stranger at other addresses cannot keep the owner out where they sign in; the e-mail's lock is short", async () => {
    const person = await withPassword(await addMember(owner, "admin", "Ash Always"));
    const home = someAddress();
    expect((await signIn(person.email, PASSWORD, home)).status).toBe(200); // the owner's usual address
    const strangers = [someV6(), someV6(), someV6()];
    for (const s of strangers) for (let i = 0; i < LIMITS.signInPair.points; i++) await signIn(person.email, `guess-${i}-password`, s);
    // A new address meets the e-mail's lock, which ends within its short window …
    const elsewhere = await signIn(person.email, PASSWORD, someAddress());
    expect(elsewhere.status).toBe(429);
    expect(Number(elsewhere.headers.get("retry-after"))).toBeLessThanOrEqual(LIMITS.signInEmail.minutes * 60);
    // … while the owner's usual address is not held back at all, again and again.
    for (let round = 0; round < 3; round++) {
      for (const s of [someV6(), someV6()]) for (let i = 0; i < LIMITS.signInPair.points; i++) await signIn(person.email, `more-${round}-${i}-password`, s);
      expect((await signIn(person.email, PASSWORD, home)).status, `round ${round}`).toBe(200);
    }
    // The strangers' addresses stay held back for this e-mail.
    expect((await signIn(person.email, PASSWORD, strangers[0])).status).toBe(429);
  });

  it("answers an unknown e-mail exactly like a known one", async () => {
    const address = someAddress();
    const known = await withPassword(await addMember(owner, "crew", "Kit Known"));
    const unknown = uniqueEmail("nobody");
    const run = async (email: string) => {
      const out: number[] = [];
      for (let i = 0; i < 6; i++) out.push((await signIn(email, `wrong-${i}-password`, address)).status);
      return out;
    };
    expect(await run(known.email)).toEqual([401, 401, 401, 401, 401, 429]);
    expect(await run(unknown)).toEqual([401, 401, 401, 401, 401, 429]);
  });

  it("names a deactivated account only after the right password", async () => {
    const person = await withPassword(await addMember(owner, "sales_rep", "Dee Gone"));
    await db().update(membership).set({ status: "deactivated" }).where(eq(membership.id, person.membershipId));
    const address = someAddress();
    const wrong = await signIn(person.email, "not-the-password-at-all", address);
    expect(wrong.status).toBe(401);
    expect(JSON.stringify(await wrong.json())).not.toMatch(/deactivated/i);
    const right = await signIn(person.email, PASSWORD, address);
    expect(right.status).toBe(403);
    expect(((await right.json()) as { message: string }).message).toMatch(/deactivated/);
  });
});
