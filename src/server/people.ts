import "server-only";
import { hashPassword } from "better-auth/crypto";
import { and, asc, desc, eq, gt, isNull, ne } from "drizzle-orm";
import { createElement } from "react";
import { account, company, invitation, membership, session, user, type Role } from "@/db/schema";
import { env } from "@/env";
import { formatDateTime } from "@/lib/format";
import { assignableRoles, ROLE_LABELS } from "@/lib/permissions";
import type { z } from "zod";
import type { acceptInvitationSchema, inviteSchema, updatePersonSchema } from "@/lib/schemas/people";
import { getCompanySettings } from "@/server/company-settings";
import { db, transaction } from "@/server/db";
import { HttpError, notFound } from "@/server/errors";
import { emailKey, takeTurn } from "@/server/limits";
import { sendEmail } from "@/server/mail";
import { forgetPerson } from "@/server/session-reuse";
import type { Member } from "@/server/session";
import { hashToken, newLinkToken } from "@/server/tokens";
import { InvitationEmail } from "@emails/invitation";

export const INVITATION_DAYS = 7;

export type Person = {
  id: string;
  userId: string;
  name: string;
  email: string;
  role: Role;
  status: "active" | "deactivated";
  joinedAt: Date;
};

export type PendingInvitation = {
  id: string;
  email: string;
  name: string | null;
  role: Role;
  expiresAt: Date;
  createdAt: Date;
};

const personColumns = {
  id: membership.id,
  userId: membership.userId,
  name: user.name,
  email: user.email,
  role: membership.role,
  status: membership.status,
  joinedAt: membership.createdAt,
};

export async function listPeople(companyId: string): Promise<Person[]> {
  return db()
    .select(personColumns)
    .from(membership)
    .innerJoin(user, eq(user.id, membership.userId))
    .where(eq(membership.companyId, companyId))
    .orderBy(asc(user.name));
}

export async function getPersonOrThrow(companyId: string, membershipId: string): Promise<Person> {
  const [row] = await db()
    .select(personColumns)
    .from(membership)
    .innerJoin(user, eq(user.id, membership.userId))
    .where(and(eq(membership.id, membershipId), eq(membership.companyId, companyId)))
    .limit(1);
  if (!row) throw notFound("Person");
  return row;
}

const invitationColumns = {
  id: invitation.id,
  email: invitation.email,
  name: invitation.name,
  role: invitation.role,
  expiresAt: invitation.expiresAt,
  createdAt: invitation.createdAt,
};

export async function listPendingInvitations(companyId: string): Promise<PendingInvitation[]> {
  return db()
    .select(invitationColumns)
    .from(invitation)
    .where(
      and(
        eq(invitation.companyId, companyId),
        isNull(invitation.acceptedAt),
        isNull(invitation.revokedAt),
        gt(invitation.expiresAt, new Date()),
      ),
    )
    .orderBy(desc(invitation.createdAt));
}

export async function getInvitationOrThrow(companyId: string, invitationId: string) {
  const [row] = await db()
    .select({ ...invitationColumns, acceptedAt: invitation.acceptedAt, revokedAt: invitation.revokedAt })
    .from(invitation)
    .where(and(eq(invitation.id, invitationId), eq(invitation.companyId, companyId)))
    .limit(1);
  if (!row) throw notFound("Invitation");
  return row;
}

/** Sends an invitation e-mail with a single-use link; a newer invitation replaces an older one. */
export async function invitePerson(member: Member, input: z.output<typeof inviteSchema>): Promise<{ id: string }> {
  if (!assignableRoles(member.role).includes(input.role)) {
    throw new HttpError(403, "forbidden", "Only an owner can invite another owner.");
  }
  // Only the inviter's own people are named; an address with an account elsewhere (or none)
  // gets the same answer and the same e-mail, so inviting reveals no other company's people.
  const [ours] = await db()
    .select({ id: membership.id })
    .from(membership)
    .innerJoin(user, eq(user.id, membership.userId))
    .where(and(eq(membership.companyId, member.companyId), eq(user.email, input.email)))
    .limit(1);
  if (ours) {
    throw new HttpError(409, "already_member", `${input.email} is already one of your company's people.`, {
      email: ["This person is already in your company"],
    });
  }
  await takeTurn("invitationCompany", member.companyId);
  await takeTurn("invitationEmail", emailKey(input.email), (wait) => `Several invitations went to ${input.email} already. Try again in ${wait}.`);
  const { token, hash } = newLinkToken();
  const id = crypto.randomUUID();
  const expiresAt = new Date(Date.now() + INVITATION_DAYS * 24 * 3600_000);
  await transaction(async (tx) => {
    await tx
      .update(invitation)
      .set({ revokedAt: new Date() })
      .where(
        and(
          eq(invitation.companyId, member.companyId),
          eq(invitation.email, input.email),
          isNull(invitation.acceptedAt),
          isNull(invitation.revokedAt),
        ),
      );
    await tx.insert(invitation).values({
      id,
      companyId: member.companyId,
      email: input.email,
      name: input.name || null,
      role: input.role,
      tokenHash: hash,
      invitedByUserId: member.userId,
      expiresAt,
    });
  });
  await sendEmail({
    companyId: member.companyId,
    to: input.email,
    subject: `${member.name} invited you to ${member.companyName} on Kilowright`,
    react: createElement(InvitationEmail, {
      companyName: member.companyName,
      inviterName: member.name,
      roleLabel: ROLE_LABELS[input.role],
      acceptUrl: `${env().APP_URL}/invite/${token}`,
      validUntil: formatDateTime(expiresAt, (await getCompanySettings(member.companyId)).timeZone),
    }),
  });
  return { id };
}

export async function revokeInvitation(member: Member, invitationId: string): Promise<void> {
  const found = await getInvitationOrThrow(member.companyId, invitationId);
  if (found.acceptedAt) throw new HttpError(409, "already_accepted", "This invitation was already accepted.");
  await db()
    .update(invitation)
    .set({ revokedAt: new Date() })
    .where(and(eq(invitation.id, invitationId), eq(invitation.companyId, member.companyId)));
}

/** Role and status changes, with the rules that keep a company manageable. */
export async function updatePerson(
  member: Member,
  membershipId: string,
  input: z.output<typeof updatePersonSchema>,
): Promise<Person> {
  const target = await getPersonOrThrow(member.companyId, membershipId);
  if (target.userId === member.userId) {
    throw new HttpError(409, "self_change", "You cannot change your own role or deactivate yourself.");
  }
  if (target.role === "owner" && member.role !== "owner") {
    throw new HttpError(403, "forbidden", "Only an owner can change another owner.");
  }
  if (input.role && !assignableRoles(member.role).includes(input.role)) {
    throw new HttpError(403, "forbidden", "Only an owner can make someone an owner.");
  }
  await transaction(async (tx) => {
    await tx
      .update(membership)
      .set({ ...(input.role ? { role: input.role } : {}), ...(input.status ? { status: input.status } : {}) })
      .where(and(eq(membership.id, membershipId), eq(membership.companyId, member.companyId)));
    if (input.status === "deactivated") {
      // Signed-in devices lose access at once, not when their session expires.
      await tx.delete(session).where(eq(session.userId, target.userId));
    }
    const owners = await tx
      .select({ id: membership.id })
      .from(membership)
      .where(and(eq(membership.companyId, member.companyId), eq(membership.role, "owner"), eq(membership.status, "active")));
    if (owners.length === 0) {
      throw new HttpError(409, "last_owner", "A company needs at least one active owner.");
    }
  });
  forgetPerson(target.userId); // their next request reads the new role or status
  return getPersonOrThrow(member.companyId, membershipId);
}

/** What the invitation page shows before the person sets a password. */
export async function findOpenInvitation(token: string) {
  const [row] = await db()
    .select({
      id: invitation.id,
      email: invitation.email,
      name: invitation.name,
      role: invitation.role,
      companyId: invitation.companyId,
      companyName: company.name,
      expiresAt: invitation.expiresAt,
      acceptedAt: invitation.acceptedAt,
      revokedAt: invitation.revokedAt,
    })
    .from(invitation)
    .innerJoin(company, eq(company.id, invitation.companyId))
    .where(eq(invitation.tokenHash, hashToken(token)))
    .limit(1);
  if (!row) return { state: "unknown" as const };
  if (row.acceptedAt) return { state: "accepted" as const, invitation: row };
  if (row.revokedAt) return { state: "revoked" as const, invitation: row };
  if (row.expiresAt <= new Date()) return { state: "expired" as const, invitation: row };
  return { state: "open" as const, invitation: row };
}

/**
 * Creates the invited person's account (the link proved the address, so it counts as
 * verified) and their membership, in one transaction.
 */
export async function acceptInvitation(input: z.output<typeof acceptInvitationSchema>): Promise<{ email: string }> {
  const found = await findOpenInvitation(input.token);
  if (found.state !== "open") {
    const why = { unknown: "is not valid", accepted: "was already used", revoked: "was withdrawn", expired: "has expired" }[found.state];
    throw new HttpError(410, "invitation_closed", `This invitation ${why}. Ask your admin for a new one.`);
  }
  const inv = found.invitation;
  const passwordHash = await hashPassword(input.password);
  const userId = crypto.randomUUID();
  await transaction(async (tx) => {
    const [taken] = await tx.select({ id: user.id }).from(user).where(eq(user.email, inv.email)).limit(1);
    if (taken) throw new HttpError(409, "already_member", `${inv.email} already has a Kilowright account, and a person belongs to one company. Sign in with it, or ask for an invitation to another address.`);
    await tx.insert(user).values({ id: userId, name: input.name, email: inv.email, emailVerified: true });
    await tx.insert(account).values({
      id: crypto.randomUUID(),
      accountId: userId,
      providerId: "credential",
      userId,
      password: passwordHash,
    });
    await tx.insert(membership).values({ id: crypto.randomUUID(), companyId: inv.companyId, userId, role: inv.role });
    const marked = await tx
      .update(invitation)
      .set({ acceptedAt: new Date() })
      .where(and(eq(invitation.id, inv.id), isNull(invitation.acceptedAt), isNull(invitation.revokedAt)));
    if (marked[0].affectedRows !== 1) throw new HttpError(409, "invitation_closed", "This invitation was just used.");
  });
  return { email: inv.email };
}

/** Sign-up: the company and its owner. The user row comes from better-auth (which sends the verification e-mail). */
export async function createCompanyForOwner(userId: string, companyName: string, companyId: string = crypto.randomUUID()): Promise<string> {
  await transaction(async (tx) => {
    await tx.insert(company).values({ id: companyId, name: companyName });
    await tx.insert(membership).values({ id: crypto.randomUUID(), companyId, userId, role: "owner" });
  });
  return companyId;
}

export async function deleteUnattachedUser(userId: string): Promise<void> {
  await db().delete(user).where(and(eq(user.id, userId), ne(user.emailVerified, true)));
}
