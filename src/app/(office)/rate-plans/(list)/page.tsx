import type { Metadata } from "next";
import Link from "next/link";
import { NoAccess } from "@/components/no-access";
import { Badge } from "@/components/ui/badge";
import { EmptyState } from "@/components/ui/empty-state";
import { TableShell, Td, Th } from "@/components/ui/table";
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
        <div className="mt-6">
          <EmptyState>{canEdit ? "No rate plans yet. Add the plans of the utilities you work with." : "No rate plans yet. An owner or admin adds them."}</EmptyState>
        </div>
      ) : (
        <TableShell
          className="mt-6"
          minWidth={760}
          head={
            <>
              <Th>Plan</Th>
              <Th>Energy</Th>
              <Th>Exports</Th>
              <Th numeric>Fixed / month</Th>
              <Th numeric>Sample bill ({PREVIEW_MONTHLY_KWH} kWh)</Th>
              <Th>Status</Th>
            </>
          }
        >
          {plans.map((p) => (
            <tr key={p.id} data-testid={`rate-plan-${p.id}`}>
              <Td>
                <Link href={`/rate-plans/${p.id}`} className="font-medium text-copper hover:underline">
                  {p.name}
                </Link>
                <span className="block text-xs text-graphite-soft">{p.utilityName}</span>
              </Td>
              <Td>{ENERGY_LABELS[p.plan.energy.kind]}</Td>
              <Td>{COMPENSATION_LABELS[p.plan.compensation.kind]}</Td>
              <Td numeric>{formatCents(p.plan.fixedMonthlyCents)}</Td>
              <Td numeric>{formatCents(sampleBill(p.plan).totalCents / 12)} avg</Td>
              <Td>{p.active ? <Badge tone="success">In use</Badge> : <Badge>Retired</Badge>}</Td>
            </tr>
          ))}
        </TableShell>
      )}
    </>
  );
}
