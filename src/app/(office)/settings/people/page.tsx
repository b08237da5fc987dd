import type { Metadata } from "next";
import { NoAccess } from "@/components/no-access";
import { assignableRoles, can } from "@/lib/permissions";
import { listPendingInvitations, listPeople } from "@/server/people";
import { formatDate, formatDateTime } from "@/lib/format";
import { getCompanySettings } from "@/server/company-settings";
import { getMember } from "@/server/session";
import { PeopleClient } from "./people-client";

export const metadata: Metadata = { title: "People" };

export default async function PeoplePage() {
  const member = await getMember();
  if (!member) return null;
  if (!can(member.role, "people:read")) return <NoAccess section="Settings → People" />;
  const [people, invitations, { timeZone }] = await Promise.all([listPeople(member.companyId), listPendingInvitations(member.companyId), getCompanySettings(member.companyId)]);
  return (
    <>
      <p className="text-sm text-graphite-soft">Settings</p>
      <h1 className="text-2xl font-semibold">People</h1>
      <p className="mt-1 text-graphite-soft">Everyone at {member.companyName} who uses Kilowright, and the invitations still open.</p>
      <PeopleClient
        me={member.userId}
        myRole={member.role}
        roles={assignableRoles(member.role)}
        people={people.map((p) => ({ ...p, joinedAt: p.joinedAt.toISOString(), joinedOn: formatDate(p.joinedAt, timeZone) }))}
        invitations={invitations.map((i) => ({ ...i, expiresAt: i.expiresAt.toISOString(), createdAt: i.createdAt.toISOString(), validUntil: formatDateTime(i.expiresAt, timeZone) }))}
      />
    </>
  );
}
