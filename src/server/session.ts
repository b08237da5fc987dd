import "server-only";
import { and, eq, sql } from "drizzle-orm";
import { headers } from "next/headers";
import { cache } from "react";
import { company, membership, type Role } from "@/db/schema";
import { can, type Permission } from "@/lib/permissions";
import { auth } from "@/server/auth";
import { db } from "@/server/db";
import { forbidden, unauthorized } from "@/server/errors";
import { keepSession, reusedSession } from "@/server/session-reuse";

/** A signed-in person with their company (the tenant) and role. */
export type Member = {
  userId: string;
  name: string;
  email: string;
  membershipId: string;
  companyId: string;
  companyName: string;
  role: Role;
};

function prepareMembershipQuery() {
  return db()
    .select({
      membershipId: membership.id,
      companyId: membership.companyId,
      role: membership.role,
      companyName: company.name,
    })
    .from(membership)
    .innerJoin(company, eq(company.id, membership.companyId))
    .where(and(eq(membership.userId, sql.placeholder("userId")), eq(membership.status, "active")))
    .limit(1)
    .prepare();
}
let membershipQuery: ReturnType<typeof prepareMembershipQuery> | undefined;

/**
 * A person's active membership with its company, or null (deactivated or none). Every request
 * of a signed-in person asks, so the query is built once per process and only its value bound.
 */
export async function activeMembership(userId: string) {
  membershipQuery ??= prepareMembershipQuery();
  const [row] = await membershipQuery.execute({ userId });
  return row ?? null;
}

/** better-auth's session for these headers; the same Cookie header is answered from memory for a few seconds (session-reuse.ts). */
async function sessionOf(requestHeaders: Headers) {
  const cookie = requestHeaders.get("cookie");
  if (!cookie) return null;
  const reused = reusedSession(cookie);
  if (reused) return reused;
  const s = await auth().api.getSession({ headers: requestHeaders });
  if (s) keepSession(cookie, s);
  return s;
}

/**
 * The signed-in, active member behind a request's headers, or null. The session comes from
 * better-auth (session-reuse.ts may answer a repeated Cookie header for a few seconds); the
 * membership and role are read on every call, so a deactivation or a role change holds from
 * the next request.
 */
export async function memberFromHeaders(requestHeaders: Headers): Promise<Member | null> {
  const s = await sessionOf(requestHeaders);
  if (!s) return null;
  const row = await activeMembership(s.user.id);
  if (!row) return null;
  return { userId: s.user.id, name: s.user.name, email: s.user.email, ...row };
}

/** The signed-in, active member of this request (pages, actions), or null; read once per request. */
export const getMember = cache(async (): Promise<Member | null> => memberFromHeaders(await headers()));

/**
 * For actions and route handlers: the member, or a 401/403 HttpError. A route handler passes
 * its request's headers; an action reads them from Next's request scope.
 */
export async function requireMember(permission: Permission, requestHeaders?: Headers): Promise<Member> {
  const member = requestHeaders ? await memberFromHeaders(requestHeaders) : await getMember();
  if (!member) throw unauthorized();
  if (!can(member.role, permission)) throw forbidden();
  return member;
}
