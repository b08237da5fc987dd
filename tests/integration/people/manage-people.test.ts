import { and, eq } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { account, invitation, membership, session, user } from "@/db/schema";
import { db } from "@/server/db";
import { acceptInvitation, findOpenInvitation, getPersonOrThrow, invitePerson, revokeInvitation, updatePerson } from "@/server/people";
import { addMember, newCompany, rejects, uniqueEmail } from "../support/fixtures";

async function latestMailTo(to: string) {
  const res = await fetch(`${process.env.KW_TEST_MAIL_URL}/dev/messages?to=${encodeURIComponent(to)}&limit=1`, {
    headers: { Authorization: `Bearer ${process.env.RESEND_API_KEY}` },
  });
  const body = (await res.json()) as { data: { subject: string; html: string }[] };
  return body.data[0];
}

function tokenFrom(html: string): string {
  const match = html.match(/\/invite\/([A-Za-z0-9_-]+)/);
  if (!match) throw new Error("no invitation link in the message");
  return match[1];
}


describe("invitations", () => {
  it("stores only a hash of the token, e-mails the link, and the link creates a verified member once", async () => {
    const owner = await newCompany("Invitation Test Solar");
    const email = uniqueEmail("invitee");
    const { id } = await invitePerson(owner, { email, role: "sales_rep", name: "Ivy Invitee" });

    const mail = await latestMailTo(email);
    expect(mail.subject).toContain("Invitation Test Solar");
    const token = tokenFrom(mail.html);
    const [row] = await db().select().from(invitation).where(eq(invitation.id, id));
    expect(row.tokenHash).toMatch(/^[0-9a-f]{64}$/);
    expect(row.tokenHash).not.toContain(token);

    expect((await findOpenInvitation(token)).state).toBe("open");
    await acceptInvitation({ token, name: "Ivy Invitee", password: "ivy-password-1", confirm: "ivy-password-1" });
    const [created] = await db().select().from(user).where(eq(user.email, email));
    expect(created.emailVerified).toBe(true);
    const [m] = await db().select().from(membership).where(eq(membership.userId, created.id));
    expect(m).toMatchObject({ companyId: owner.companyId, role: "sales_rep", status: "active" });
    const [acct] = await db().select().from(account).where(eq(account.userId, created.id));
    expect(acct.password).not.toBe("ivy-password-1");

    await rejects(acceptInvitation({ token, name: "Again", password: "ivy-password-2", confirm: "ivy-password-2" }), 410, "invitation_closed");
  });

  it("a withdrawn or replaced invitation no longer works", async () => {
    const owner = await newCompany();
    const email = uniqueEmail("twice");
    await invitePerson(owner, { email, role: "crew" });
    const first = tokenFrom((await latestMailTo(email)).html);
    const { id } = await invitePerson(owner, { email, role: "office_manager", replace: true });
    const second = tokenFrom((await latestMailTo(email)).html);
    expect((await findOpenInvitation(first)).state).toBe("revoked");
    expect((await findOpenInvitation(second)).state).toBe("open");
    await revokeInvitation(owner, id);
    expect((await findOpenInvitation(second)).state).toBe("revoked");
  });

  it("replaces an open invitation only when asked to: 409 invitation_open naming both roles, nothing sent", async () => {
    const owner = await newCompany();
    const email = uniqueEmail("open");
    await invitePerson(owner, { email, role: "crew" });
    const first = tokenFrom((await latestMailTo(email)).html);
    const err = await rejects(invitePerson(owner, { email, role: "admin" }), 409, "invitation_open");
    expect(err.message).toBe(`An invitation for ${email} as Installer crew is open. Send again with replace to replace it with Admin.`);
    expect(tokenFrom((await latestMailTo(email)).html)).toBe(first);
    expect((await findOpenInvitation(first)).state).toBe("open");
  });

  it("refuses an address that already has an account, and owner invitations from admins", async () => {
    const owner = await newCompany();
    const admin = await addMember(owner, "admin");
    await rejects(invitePerson(owner, { email: admin.email, role: "crew" }), 409, "already_member");
    await rejects(invitePerson(admin, { email: uniqueEmail("x"), role: "owner" }), 403);
  });
});

describe("roles and deactivation", () => {
  it("keeps the rules: not yourself, owners only by owners, at least one owner", async () => {
    const owner = await newCompany();
    const admin = await addMember(owner, "admin");
    const rep = await addMember(owner, "sales_rep");

    await rejects(updatePerson(owner, owner.membershipId, { role: "admin" }), 409, "self_change");
    await rejects(updatePerson(admin, owner.membershipId, { status: "deactivated" }), 403);
    await rejects(updatePerson(admin, rep.membershipId, { role: "owner" }), 403);

    const promoted = await updatePerson(admin, rep.membershipId, { role: "office_manager" });
    expect(promoted.role).toBe("office_manager");

    // A second owner demotes the first; then the last owner cannot be demoted by anyone.
    const owner2 = await addMember(owner, "owner");
    await updatePerson(owner2, owner.membershipId, { role: "admin" });
    const formerOwner = { ...owner, role: "admin" as const };
    await rejects(updatePerson(formerOwner, owner2.membershipId, { role: "admin" }), 403);
    const [still] = await db().select().from(membership).where(eq(membership.id, owner2.membershipId));
    expect(still.role).toBe("owner");
  });

  it("deactivating ends the person's sessions in the same transaction", async () => {
    const owner = await newCompany();
    const crew = await addMember(owner, "crew");
    await db().insert(session).values({
      id: crypto.randomUUID(),
      token: crypto.randomUUID(),
      userId: crew.userId,
      expiresAt: new Date(Date.now() + 3600_000),
    });
    await updatePerson(owner, crew.membershipId, { status: "deactivated" });
    expect(await db().select().from(session).where(eq(session.userId, crew.userId))).toEqual([]);
    const [m] = await db().select().from(membership).where(and(eq(membership.id, crew.membershipId)));
    expect(m.status).toBe("deactivated");
  });

  it("another company's person is not found, for reads and writes", async () => {
    const a = await newCompany("Company A");
    const b = await newCompany("Company B");
    const repA = await addMember(a, "sales_rep");
    await rejects(getPersonOrThrow(b.companyId, repA.membershipId), 404, "not_found");
    await rejects(updatePerson(b, repA.membershipId, { status: "deactivated" }), 404, "not_found");
    const [m] = await db().select().from(membership).where(eq(membership.id, repA.membershipId));
    expect(m.status).toBe("active");
  });
});
