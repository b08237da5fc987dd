import { NextResponse } from "next/server";
import { inviteSchema } from "@/lib/schemas/people";
import { invitePerson, listPendingInvitations, listPeople } from "@/server/people";
import { readJson, withMember } from "@/server/route";

/** Settings → People: everyone in the caller's company and the open invitations. */
export const GET = withMember("people:read", async ({ member }) => {
  const [people, invitations] = await Promise.all([listPeople(member.companyId), listPendingInvitations(member.companyId)]);
  return NextResponse.json({ data: { people, invitations } });
});

/** Invites a person by e-mail with a role. */
export const POST = withMember("people:manage", async ({ req, member }) => {
  const input = await readJson(req, inviteSchema);
  const created = await invitePerson(member, input);
  return NextResponse.json({ data: created }, { status: 201 });
});
