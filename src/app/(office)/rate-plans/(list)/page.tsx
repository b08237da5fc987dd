import type { Metadata } from "next";
import Link from "next/link";
import { NoAccess } from "@/components/no-access";
import type { RatePlan } from "@/engine/rates";
import { formatCents } from "@/lib/format";
import { can } from "@/lib/permissions";
import { PREVIEW_MONTHLY_KWH } from "@/lib/schemas/rate-plan";
import { listRatePlans } from "@/server/rate-plans";
import { getMember } from "@/server/session";
import { sampleBill } from "../sample-bill";

export const metadata: Metadata = { title: "Rate plans" };

const ENERGY_LABELS: Record<RatePlan["energy"]["kind"], string> = { flat: "Flat", tiered: "Tiered", tou: "Time-of-use" };
const COMPENSATION_LABELS: Record<RatePlan["compensation"]["kind"], string> = {
  "net-metering": "Net metering",
  "net-billing": "Net billing",
  "no-export": "No export",
};

export default async function RatePlansPage() {
  const member = await getMember();
  if (!member) return null;
  if (!can(member.role, "rates:read")) return <NoAccess section="Rate plans" />;
  const plans = await listRatePlans(member.companyId);
  const canEdit = can(member.role, "rates:manage");
  return (
    <>
      <div className="flex flex-wrap items-end justify-between gap-3">
        <div>
          <h1 className="text-2xl font-semibold">Rate plans</h1>
          <p className="mt-1 text-graphite-soft">The utility tariffs offers bill against, before and after solar.</p>
        </div>
        {canEdit ? (
          <Link href="/rate-plans/new" className="btn-primary">
            New rate plan
          </Link>
        ) : null}
      </div>
      {plans.length === 0 ? (
        <p className="card mt-6 p-5 text-graphite-soft">{canEdit ? "No rate plans yet. Add the plans of the utilities you work with." : "No rate plans yet. An owner or admin adds them."}</p>
      ) : (
        <div className="mt-6 overflow-x-auto rounded-card border border-paper-line bg-white">
          <table className="w-full min-w-[760px] text-left text-sm">
            <thead className="bg-paper-deep text-xs uppercase tracking-wide text-graphite-soft">
              <tr>
                <th scope="col" className="px-4 py-2">Plan</th>
                <th scope="col" className="px-4 py-2">Energy</th>
                <th scope="col" className="px-4 py-2">Exports</th>
                <th scope="col" className="px-4 py-2 text-right">Fixed / month</th>
                <th scope="col" className="px-4 py-2 text-right">Sample bill ({PREVIEW_MONTHLY_KWH} kWh)</th>
                <th scope="col" className="px-4 py-2">Status</th>
              </tr>
            </thead>
            <tbody className="divide-y divide-paper-line">
              {plans.map((p) => (
                <tr key={p.id} data-testid={`rate-plan-${p.id}`}>
                  <td className="px-4 py-2">
                    <Link href={`/rate-plans/${p.id}`} className="font-medium text-copper hover:underline">
                      {p.name}
                    </Link>
                    <span className="block text-xs text-graphite-soft">{p.utilityName}</span>
                  </td>
                  <td className="px-4 py-2">{ENERGY_LABELS[p.plan.energy.kind]}</td>
                  <td className="px-4 py-2">{COMPENSATION_LABELS[p.plan.compensation.kind]}</td>
                  <td className="figure px-4 py-2 text-right">{formatCents(p.plan.fixedMonthlyCents)}</td>
                  <td className="figure px-4 py-2 text-right">{formatCents(sampleBill(p.plan).totalCents / 12)} avg</td>
                  <td className="px-4 py-2">{p.active ? <span className="text-sage">In use</span> : <span className="text-graphite-soft">Retired</span>}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </>
  );
}
