// The member of a request: better-auth's session and the membership, reused for the same Cookie
// header for SESSION_REUSE_MS (session-reuse.ts), forgotten at sign-out and when the people
// rules change a person. Real sign-ins through better-auth against the test MariaDB.
import { hashPassword } from "better-auth/crypto";
import { eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { account, membership, session } from "@/db/schema";
import { auth } from "@/server/auth";
import { db } from "@/server/db";
import { updatePerson } from "@/server/people";
import { memberFromHeaders, type Member } from "@/server/session";
import { SESSION_REUSE_MS } from "@/server/session-reuse";
import { addMember, newCompany } from "../support/fixtures";

const PASSWORD = "reuse-test-password-2026";
let owner: Member;

async function withPassword(m: Member): Promise<Member> {
  await db().insert(account).values({ id: crypto.randomUUID(), accountId: m.userId, providerId: "credential", userId: m.userId, password: await hashPassword(PASSWORD) });
  return m;
}

/** A real sign-in: the Cookie header the browser sends afterwards. */
async function signIn(m: Member): Promise<Headers> {
  const res = await auth().api.signInEmail({ body: { email: m.email, password: PASSWORD }, asResponse: true });
  expect(res.status).toBe(200);
  const cookie = res.headers
    .getSetCookie()
    .map((c) => c.split(";")[0])
    .join("; ");
  return new Headers({ cookie });
}

beforeAll(async () => {
  owner = await newCompany("Reuse Solar");
});

describe("the member of a request", () => {
  it("takes a role change or deactivation made through the people rules from the next request", async () => {
    const person = await withPassword(await addMember(owner, "sales_rep", "Rae Reuse"));
    const headers = await signIn(person);
    expect((await memberFromHeaders(headers))?.role).toBe("sales_rep");

    await updatePerson(owner, person.membershipId, { role: "office_manager" });
    expect((await memberFromHeaders(headers))?.role).toBe("office_manager");

    await updatePerson(owner, person.membershipId, { status: "deactivated" });
    expect(await memberFromHeaders(headers)).toBeNull();
  });

  it("forgets the session at sign-out, and takes no unsigned or altered cookie", async () => {
    const person = await withPassword(await addMember(owner, "office_manager", "Odo Reuse"));
    const headers = await signIn(person);
    expect((await memberFromHeaders(headers))?.userId).toBe(person.userId);

    const altered = new Headers({ cookie: headers.get("cookie")!.replace(/session_token=(.)/, (_m, c: string) => `session_token=${c === "A" ? "B" : "A"}`) });
    expect(await memberFromHeaders(altered)).toBeNull();
    const unsigned = new Headers({ cookie: `better-auth.session_token=${headers.get("cookie")!.match(/session_token=([^.;]+)/)![1]}` });
    expect(await memberFromHeaders(unsigned)).toBeNull();

    const out = await auth().api.signOut({ headers, asResponse: true });
    expect(out.status).toBe(200);
    expect(await memberFromHeaders(headers)).toBeNull();
  });

  it(`holds a change made by another process (plain SQL) for at most ${SESSION_REUSE_MS} ms`, async () => {
    const person = await withPassword(await addMember(owner, "crew", "Cy Reuse"));
    const other = await withPassword(await addMember(owner, "crew", "Cal Reuse"));
    const headers = await signIn(person);
    const otherHeaders = await signIn(other);
    expect(await memberFromHeaders(headers)).not.toBeNull();
    expect(await memberFromHeaders(otherHeaders)).not.toBeNull();
    // As a password reset elsewhere would: the session row goes; and another person is deactivated by SQL.
    await db().delete(session).where(eq(session.userId, person.userId));
    await db().update(membership).set({ status: "deactivated" }).where(eq(membership.id, other.membershipId));
    expect((await memberFromHeaders(headers))?.userId).toBe(person.userId);
    expect((await memberFromHeaders(otherHeaders))?.userId).toBe(other.userId);
    await new Promise((r) => setTimeout(r, SESSION_REUSE_MS + 200));
    expect(await memberFromHeaders(headers)).toBeNull();
    expect(await memberFromHeaders(otherHeaders)).toBeNull();
  });
});
