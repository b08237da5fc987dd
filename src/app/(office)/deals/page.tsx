import type { Metadata } from "next";
import { NoAccess } from "@/components/no-access";
import { can } from "@/lib/permissions";
import { daysSince, formatCents, formatKwFromWatts } from "@/lib/format";
import { STAGE_LABELS } from "@/lib/stages";
import { listDeals } from "@/server/deals";
import { getMember } from "@/server/session";

export const metadata: Metadata = { title: "Deals" };

export default async function DealsPage() {
  const member = await getMember();
  if (!member) return null;
  if (!can(member.role, "deals:read-own")) return <NoAccess section="Deals" />;
  const deals = await listDeals(member);
  const mine = !can(member.role, "deals:read-all");
  return (
    <>
      <h1 className="text-2xl font-semibold">{mine ? "Your deals" : "Deals"}</h1>
      <p className="mt-1 text-graphite-soft">
        <span className="figure">{deals.length}</span> deal{deals.length === 1 ? "" : "s"}, most recently moved first.
      </p>
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
              <tr key={d.id}>
                <td className="px-4 py-3">
                  <span className="font-medium">{d.householdName}</span>
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
        {deals.length === 0 ? <p className="px-4 py-6 text-graphite-soft">No deals yet.</p> : null}
      </div>
    </>
  );
}
