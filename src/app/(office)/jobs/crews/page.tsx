import type { Metadata } from "next";
import Link from "next/link";
import { NoAccess } from "@/components/no-access";
import { can } from "@/lib/permissions";
import { listCrews, listInstallers } from "@/server/crews";
import { getMember } from "@/server/session";
import { CrewsClient } from "./crews-client";

export const metadata: Metadata = { title: "Crews" };

export default async function CrewsPage() {
  const member = await getMember();
  if (!member) return null;
  if (!can(member.role, "crews:manage")) return <NoAccess section="Jobs → Crews" />;
  const [crews, installers] = await Promise.all([listCrews(member), listInstallers(member.companyId)]);
  return (
    <>
      <Link href="/jobs" className="text-sm text-copper underline-offset-2 hover:underline">
        ← Jobs
      </Link>
      <h1 className="mt-1 text-2xl font-semibold">Crews</h1>
      <p className="mt-1 text-graphite-soft">
        Installers see only the jobs of their crew. Each crew has a calendar address for their phones; renew it if it was shared
        too widely (the old address then stops working).
      </p>
      <CrewsClient
        crews={crews.map((c) => ({ id: c.id, name: c.name, feedUrl: c.feedUrl, openJobs: c.openJobs, memberIds: c.members.map((m) => m.membershipId) }))}
        installers={installers.map((i) => ({ id: i.membershipId, name: i.name, email: i.email, active: i.status === "active", crewId: i.crewId }))}
      />
    </>
  );
}
