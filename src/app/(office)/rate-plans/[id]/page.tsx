import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { NoAccess } from "@/components/no-access";
import { can } from "@/lib/permissions";
import { HttpError } from "@/server/errors";
import { getRatePlanOrThrow, type RatePlanRow } from "@/server/rate-plans";
import { idSchema } from "@/server/route";
import { getMember } from "@/server/session";
import { listUtilities } from "@/server/utilities";
import { RatePlanEditor } from "../rate-plan-editor";

export const metadata: Metadata = { title: "Rate plan" };

export default async function RatePlanPage({ params }: { params: Promise<{ id: string }> }) {
  const member = await getMember();
  if (!member) return null;
  if (!can(member.role, "rates:read")) return <NoAccess section="Rate plans" />;
  const { id } = await params;
  if (!idSchema.safeParse(id).success) notFound();
  let row: RatePlanRow;
  try {
    row = await getRatePlanOrThrow(member.companyId, id);
  } catch (err) {
    if (err instanceof HttpError && err.status === 404) notFound();
    throw err;
  }
  return (
    <>
      <Link href="/rate-plans" className="text-sm text-copper hover:underline">
        ← Rate plans
      </Link>
      <h1 className="mt-1 text-2xl font-semibold">{row.name}</h1>
      <p className="text-graphite-soft">{row.utilityName}</p>
      <RatePlanEditor id={row.id} initial={{ utilityId: row.utilityId, active: row.active, plan: row.plan }} canEdit={can(member.role, "rates:manage")} utilities={await listUtilities(member.companyId)} />
    </>
  );
}
