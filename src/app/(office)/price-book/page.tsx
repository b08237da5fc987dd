import type { Metadata } from "next";
import { NoAccess } from "@/components/no-access";
import { can } from "@/lib/permissions";
import { emptyPriceBook } from "@/lib/schemas/price-book";
import { getPriceBookRecord } from "@/server/price-book";
import { todayInZone } from "@/lib/zoned-time";
import { getCompanySettings } from "@/server/company-settings";
import { getMember } from "@/server/session";
import { listUtilities } from "@/server/utilities";
import { PriceBookClient } from "./price-book-client";

export const metadata: Metadata = { title: "Price book" };

export default async function PriceBookPage() {
  const member = await getMember();
  if (!member) return null;
  if (!can(member.role, "pricebook:read")) return <NoAccess section="Price book" />;
  const [record, utilities, { timeZone }] = await Promise.all([getPriceBookRecord(member.companyId), listUtilities(member.companyId), getCompanySettings(member.companyId)]);
  const canEdit = can(member.role, "pricebook:manage");
  return (
    <>
      <h1 className="text-2xl font-semibold">Price book</h1>
      <p className="mt-1 text-graphite-soft">
        How {member.companyName} prices a system: price per watt by size, adders, line items, discount limits, incentives and the deposit.
        {canEdit ? "" : " Only an owner or admin can change it."}
      </p>
      <PriceBookClient
        initial={record?.document ?? emptyPriceBook()}
        canEdit={canEdit}
        role={member.role}
        savedAt={record ? record.updatedAt.toISOString() : null}
        savedBy={record?.updatedByName ?? null}
        today={todayInZone(timeZone)}
        timeZone={timeZone}
        utilities={utilities.map((u) => ({ id: u.id, name: u.name }))}
      />
    </>
  );
}
