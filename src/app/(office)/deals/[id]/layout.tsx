import Link from "next/link";
import { notFound } from "next/navigation";
import type { ReactNode } from "react";
import { DEAL_TABS } from "@/lib/deal-tabs";
import { STAGE_LABELS } from "@/lib/stages";
import { dealPageScope } from "./deal-page";
import { DealTabs } from "./deal-tabs";

export default async function DealRoomLayout({ children, params }: { children: ReactNode; params: Promise<{ id: string }> }) {
  const room = await dealPageScope(params);
  if (!room) notFound();
  const { deal, household } = room;
  return (
    <div>
      <Link href="/deals" className="text-sm text-copper underline-offset-2 hover:underline">
        ← Deals
      </Link>
      <header className="mt-2 flex flex-wrap items-start justify-between gap-3">
        <div>
          <h1 className="text-2xl font-semibold wrap-anywhere">{household.name}</h1>
          <p className="text-graphite-soft">
            {household.street}, {household.city}, {household.region} {household.postalCode}
          </p>
        </div>
        <p className="rounded-full bg-copper-light px-3 py-1 text-sm font-medium text-copper-dark" data-testid="deal-stage">
          {STAGE_LABELS[deal.stage]}
        </p>
      </header>
      <DealTabs dealId={deal.id} tabs={DEAL_TABS.map((t) => ({ ...t }))} />
      <div className="mt-6">{children}</div>
    </div>
  );
}
