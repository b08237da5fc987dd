import type { Metadata } from "next";
import Link from "next/link";
import { NoAccess } from "@/components/no-access";
import { can } from "@/lib/permissions";
import { daysSince, formatCents, formatKwFromWatts } from "@/lib/format";
import { dealSearchSchema } from "@/lib/schemas/deal";
import { STAGE_LABELS } from "@/lib/stages";
import { listDeals } from "@/server/deals";
import { getMember } from "@/server/session";

export const metadata: Metadata = { title: "Deals" };

export default async function DealsPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const member = await getMember();
  if (!member) return null;
  if (!can(member.role, "deals:read-own")) return <NoAccess section="Deals" />;
  const parsed = dealSearchSchema.safeParse(await searchParams);
  const q = parsed.success ? (parsed.data.q ?? "") : "";
  const deals = await listDeals(member, q);
  const mine = !can(member.role, "deals:read-all");
  return (
    <>
      <div className="flex flex-wrap items-end justify-between gap-3">
        <div>
          <h1 className="text-2xl font-semibold">{mine ? "Your deals" : "Deals"}</h1>
          <p className="mt-1 text-graphite-soft">
            <span className="figure">{deals.length}</span> deal{deals.length === 1 ? "" : "s"}
            {q ? ` matching “${q}”` : ""}, most recently moved first.
          </p>
        </div>
        {can(member.role, "deals:write") ? (
          <Link href="/deals/new" className="btn-primary">
            New lead
          </Link>
        ) : null}
      </div>
      <form role="search" className="mt-4 flex gap-2" action="/deals">
        <label htmlFor="deal-search" className="sr-only">
          Search deals
        </label>
        <input id="deal-search" name="q" defaultValue={q} placeholder="Household, contact, street or city" className="field-input max-w-md" />
        <button type="submit" className="btn-quiet">
          Search
        </button>
      </form>
      <div className="mt-4 overflow-x-auto rounded-card border border-paper-line bg-white">
        <table className="w-full min-w-[640px] text-left text-sm">
          <thead className="bg-paper-deep text-xs uppercase tracking-wide text-graphite-soft">
            <tr>
              <th scope="col" className="px-4 py-2 font-semibold">Household</th>
              <th scope="col" className="px-4 py-2 font-semibold">Stage</th>
              <th scope="col" className="px-4 py-2 text-right font-semibold">System</th>
              <th scope="col" className="px-4 py-2 text-right font-semibold">Contract</th>
              <th scope="col" className="px-4 py-2 text-right font-semibold">Days in stage</th>
              {mine ? null : <th scope="col" className="px-4 py-2 font-semibold">Owner</th>}
              <th scope="col" className="px-4 py-2 font-semibold">Source</th>
            </tr>
          </thead>
          <tbody className="divide-y divide-paper-line">
            {deals.map((d) => (
              <tr key={d.id} className="hover:bg-paper">
                <td className="px-4 py-3">
                  <Link href={`/deals/${d.id}`} className="font-medium text-graphite underline-offset-2 hover:text-copper hover:underline">
                    {d.householdName}
                  </Link>
                  <span className="block text-xs text-graphite-soft">{d.city}</span>
                </td>
                <td className="px-4 py-3">{STAGE_LABELS[d.stage]}</td>
                <td className="figure px-4 py-3 text-right">{formatKwFromWatts(d.systemDcWatts)}</td>
                <td className="figure px-4 py-3 text-right">{formatCents(d.contractCents)}</td>
                <td className="figure px-4 py-3 text-right">{daysSince(d.stageChangedAt)}</td>
                {mine ? null : <td className="px-4 py-3">{d.ownerName ?? "—"}</td>}
                <td className="px-4 py-3">{d.source ?? "—"}</td>
              </tr>
            ))}
          </tbody>
        </table>
        {deals.length === 0 ? <p className="px-4 py-6 text-graphite-soft">{q ? "No deal matches this search." : "No deals yet."}</p> : null}
      </div>
    </>
  );
}
