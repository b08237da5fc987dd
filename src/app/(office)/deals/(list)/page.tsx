import type { Metadata } from "next";
import Link from "next/link";
import { NoAccess } from "@/components/no-access";
import { can } from "@/lib/permissions";
import { LEAD_SOURCES } from "@/lib/schemas/deal";
import { dealTableQuerySchema, searchParamsObject } from "@/lib/schemas/deal-table";
import { getCompanySettings } from "@/server/company-settings";
import { dealOwnerOptions, dealTablePage } from "@/server/deal-table";
import { getMember } from "@/server/session";
import { DealsTable } from "../_table/deals-table-client";

export const metadata: Metadata = { title: "Deals" };

export default async function DealsPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const member = await getMember();
  if (!member) return null;
  if (!can(member.role, "deals:read-own")) return <NoAccess section="Deals" />;
  // A bad address (e.g. an old bookmark) falls back to the default view rather than failing.
  const parsed = dealTableQuerySchema.safeParse(searchParamsObject(await searchParams));
  const query = parsed.success ? parsed.data : dealTableQuerySchema.parse({});
  const mine = !can(member.role, "deals:read-all");
  const [initial, owners, { timeZone }] = await Promise.all([dealTablePage(member, query), dealOwnerOptions(member), getCompanySettings(member.companyId)]);
  return (
    <>
      <div className="flex flex-wrap items-end justify-between gap-3">
        <div>
          <h1 className="text-2xl font-semibold">{mine ? "Your deals" : "Deals"}</h1>
          <p className="mt-1 text-graphite-soft">
            {mine ? "The deals you own." : "Every deal of the company."} Sort by any column heading; filters and paging are done on the server.
          </p>
        </div>
        {can(member.role, "deals:write") ? (
          <Link href="/deals/new" className="btn-primary">
            New lead
          </Link>
        ) : null}
      </div>
      <DealsTable initialQuery={query} initial={initial} showOwner={!mine} timeZone={timeZone} owners={owners} sources={[...LEAD_SOURCES]} />
    </>
  );
}
