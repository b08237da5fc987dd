// Set-up helpers for integration tests: real MariaDB (the test profile's, started by
// `npm test`), records written through the app's own modules where they exist.
import { eq } from "drizzle-orm";
import { expect } from "vitest";
import { company, membership, user, type Role } from "@/db/schema";
import { db } from "@/server/db";
import { HttpError } from "@/server/errors";
import { createCompanyForOwner } from "@/server/people";
import type { Member } from "@/server/session";
import { createUtility } from "@/server/utilities";

export const uniqueEmail = (prefix: string) => `${prefix}-${Date.now().toString(36)}-${Math.random().toString(36).slice(2, 7)}@integration.example`;

async function insertUser(name: string, email: string): Promise<string> {
  const id = crypto.randomUUID();
  await db().insert(user).values({ id, name, email, emailVerified: true });
  return id;
}

/** A fresh company with its owner, returned as the Member the server modules take. */
export async function newCompany(name = "Integration Solar Co"): Promise<Member> {
  const email = uniqueEmail("owner");
  const userId = await insertUser("Olive Owner", email);
  const companyId = await createCompanyForOwner(userId, name);
  const [m] = await db().select().from(membership).where(eq(membership.userId, userId));
  return { userId, name: "Olive Owner", email, membershipId: m.id, companyId, companyName: name, role: "owner" };
}

/** Adds a person with a role to a company. */
export async function addMember(owner: Member, role: Role, name = "Sam Member"): Promise<Member> {
  const email = uniqueEmail(role);
  const userId = await insertUser(name, email);
  const membershipId = crypto.randomUUID();
  await db().insert(membership).values({ id: membershipId, companyId: owner.companyId, userId, role });
  const [c] = await db().select().from(company).where(eq(company.id, owner.companyId));
  return { userId, name, email, membershipId, companyId: owner.companyId, companyName: c.name, role };
}

/** Awaits a rejection and checks it is an HttpError with this status (and this code, when given). */
export async function rejects(promise: Promise<unknown>, status: number, code?: string): Promise<HttpError> {
  const err = await promise.then(
    () => null,
    (e: unknown) => e,
  );
  expect(err).toBeInstanceOf(HttpError);
  expect((err as HttpError).status).toBe(status);
  if (code) expect((err as HttpError).code).toBe(code);
  return err as HttpError;
}

/** A utility of the owner's company (rate plans belong to one). */
export async function newUtility(owner: Member, name = "Test Electric"): Promise<string> {
  return (await createUtility(owner, { name, timeZone: "America/New_York", territoryNotes: null })).id;
}
