// A real sign-in through better-auth for route-handler tests: the Cookie header (and the
// Origin the browser sends) of a signed-in member.
import { hashPassword } from "better-auth/crypto";
import { expect } from "vitest";
import { account } from "@/db/schema";
import { env } from "@/env";
import { auth } from "@/server/auth";
import { db } from "@/server/db";
import type { Member } from "@/server/session";

const PASSWORD = "route-test-password-2026";

/** Gives the member a password, signs in, and returns the headers a same-origin browser request carries. */
export async function signedInHeaders(m: Member): Promise<Record<string, string>> {
  await db().insert(account).values({ id: crypto.randomUUID(), accountId: m.userId, providerId: "credential", userId: m.userId, password: await hashPassword(PASSWORD) });
  const res = await auth().api.signInEmail({ body: { email: m.email, password: PASSWORD }, asResponse: true });
  expect(res.status).toBe(200);
  const cookie = res.headers
    .getSetCookie()
    .map((c) => c.split(";")[0])
    .join("; ");
  return { cookie, origin: env().APP_URL };
}
