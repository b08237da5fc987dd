import "server-only";
import { and, eq, sql } from "drizzle-orm";
import { headers } from "next/headers";
import { cache } from "react";
import { company, membership } from "@/db/schema";
import { can, type Permission } from "@/lib/permissions";
import { auth } from "@/server/auth";
import { db } from "@/server/db";
import { forbidden, unauthorized } from "@/server/errors";
import type { Member } from "@/server/member";
import { keepMember, reusedMember } from "@/server/session-reuse";

export type { Member };

/** A signed-in person with their company (the tenant) and role. */

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
 * A person's active membership with its company, or null (deactivated or none). Asked for every
 * request whose answer is not kept (session-reuse.ts), so the query is built once per process
 * and only its value bound.
 */
export async function activeMembership(userId: string) {
  membershipQuery ??= prepareMembershipQuery();
  const [row] = await membershipQuery.execute({ userId });
  return row ?? null;
}

/**
 * The signed-in, active member behind a request's headers, or null: better-auth's session, then
 * the active membership with its role. A repeated Cookie header is answered from memory for up
 * to SESSION_REUSE_MS (session-reuse.ts says what that trades).
 */
export async function memberFromHeaders(requestHeaders: Headers): Promise<Member | null> {
  const cookie = requestHeaders.get("cookie");
  if (!cookie) return null;
  const reused = reusedMember(cookie);
  if (reused) return reused;
  const s = await auth().api.getSession({ headers: requestHeaders });
  if (!s) return null;
  const row = await activeMembership(s.user.id);
  if (!row) return null;
  const member: Member = { userId: s.user.id, name: s.user.name, email: s.user.email, ...row };
  keepMember(cookie, member, new Date(s.session.expiresAt));
  return member;
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
