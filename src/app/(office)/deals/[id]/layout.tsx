import Link from "next/link";
import { notFound } from "next/navigation";
import type { ReactNode } from "react";
import { DEAL_TABS } from "@/lib/deal-tabs";
import { can } from "@/lib/permissions";
import { STAGE_LABELS } from "@/lib/stages";
import { HttpError } from "@/server/errors";
import { openDeal } from "@/server/deal-scope";
import { getMember } from "@/server/session";
import { idSchema } from "@/server/route";
import { DealTabs } from "./deal-tabs";

export default async function DealRoomLayout({ children, params }: { children: ReactNode; params: Promise<{ id: string }> }) {
  const { id } = await params;
  const member = await getMember();
  if (!member || !can(member.role, "deals:read-own") || !idSchema.safeParse(id).success) notFound();
  const room = await openDeal(member, id).catch((err: unknown) => {
    if (err instanceof HttpError && err.status === 404) notFound();
    throw err;
  });
  const { deal, household } = room;
  return (
    <div>
      <Link href="/deals" className="text-sm text-copper underline-offset-2 hover:underline">
        ← Deals
      </Link>
      <header className="mt-2 flex flex-wrap items-start justify-between gap-3">
        <div>
          <h1 className="text-2xl font-semibold">{household.name}</h1>
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
