import type { Metadata } from "next";
import { NoAccess } from "@/components/no-access";
import { describeStale } from "@/lib/offer-basis";
import { missingStringPlanReason } from "@/lib/string-plan-rule";
import { getDesignForDeal } from "@/server/designs";
import { listOffers } from "@/server/offers";
import { listProposalsForDeal } from "@/server/proposals";
import { dealPageScope } from "../deal-page";
import { ProposalClient, type OfferChoice, type VersionView } from "./proposal-client";

export const metadata: Metadata = { title: "Proposal" };

export default async function ProposalTab({ params }: { params: Promise<{ id: string }> }) {
  const room = await dealPageScope(params);
  if (!room) return null;
  const id = room.dealId;
  if (!room.rights.send) return <NoAccess section="Proposal" />;
  const [offers, versions, design] = await Promise.all([listOffers(room), listProposalsForDeal(room), getDesignForDeal(room)]);
  const choices: OfferChoice[] = offers.map((o) => ({
    id: o.id,
    position: o.position,
    name: o.name,
    contractCents: o.results.summary.contractCents,
    kwDc: o.results.summary.kwDc,
    blockedReason:
      o.discountStatus === "pending"
        ? "Discount waiting for the office's approval"
        : o.discountStatus === "declined"
          ? "Discount declined: change the offer before sending it"
          : o.stale.length > 0
            ? `Recompute it on the Offers tab: the ${describeStale(o.stale)} changed`
            : o.basis
              ? missingStringPlanReason(o.basis.inverter, design?.document.stringPlan)
              : null,
  }));
  const views: VersionView[] = versions.map((v) => ({
    ...v,
    sentAt: v.sentAt.toISOString(),
    expiresAt: v.expiresAt.toISOString(),
    signedAt: v.signedAt?.toISOString() ?? null,
    cancelledAt: v.cancelledAt?.toISOString() ?? null,
    revokedAt: v.revokedAt?.toISOString() ?? null,
    events: v.events.map((e) => ({ ...e, createdAt: e.createdAt.toISOString() })),
  }));
  return <ProposalClient dealId={id} householdEmail={room.household.email ?? ""} hasDesign={!!design} offers={choices} versions={views} timeZone={room.settings.timeZone} />;
}
