import "server-only";
import { and, eq, sql } from "drizzle-orm";
import { headers } from "next/headers";
import { cache } from "react";
import { company, membership, type Role } from "@/db/schema";
import { can, type Permission } from "@/lib/permissions";
import { auth } from "@/server/auth";
import { db } from "@/server/db";
import { forbidden, unauthorized } from "@/server/errors";

/** The better-auth session of this request, read once per request. */
export const getSession = cache(async () => {
  const requestHeaders = await headers(); // first: it marks the page as per-request
  return auth().api.getSession({ headers: requestHeaders });
});

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

/** The signed-in, active member of this request, or null. */
export const getMember = cache(async (): Promise<Member | null> => {
  const s = await getSession();
  if (!s) return null;
  const row = await activeMembership(s.user.id);
  if (!row) return null;
  return { userId: s.user.id, name: s.user.name, email: s.user.email, ...row };
});

/** For actions and route handlers: the member, or a 401/403 HttpError. */
export async function requireMember(permission: Permission): Promise<Member> {
  const member = await getMember();
  if (!member) throw unauthorized();
  if (!can(member.role, permission)) throw forbidden();
  return member;
}
