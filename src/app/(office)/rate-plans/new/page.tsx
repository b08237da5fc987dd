import type { Metadata } from "next";
import Link from "next/link";
import { NoAccess } from "@/components/no-access";
import { can } from "@/lib/permissions";
import { getMember } from "@/server/session";
import { listUtilities } from "@/server/utilities";
import { newRatePlanRecord } from "../plan-templates";
import { RatePlanEditor } from "../rate-plan-editor";

export const metadata: Metadata = { title: "New rate plan" };

export default async function NewRatePlanPage() {
  const member = await getMember();
  if (!member) return null;
  if (!can(member.role, "rates:manage")) return <NoAccess section="Rate plans → New" />;
  return (
    <>
      <Link href="/rate-plans" className="text-sm text-copper hover:underline">
        ← Rate plans
      </Link>
      <h1 className="mt-1 text-2xl font-semibold">New rate plan</h1>
      <RatePlanEditor id={null} initial={newRatePlanRecord()} canEdit utilities={await listUtilities(member.companyId)} />
    </>
  );
}
