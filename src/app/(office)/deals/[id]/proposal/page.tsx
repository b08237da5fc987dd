import type { Metadata } from "next";
import { NoAccess } from "@/components/no-access";
import { describeStale } from "@/lib/offer-basis";
import { getDesignForDeal } from "@/server/designs";
import { offerUnbuildableReason } from "@/server/electrical";
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
  // Complete or refused: each current offer's string plan and electrical design (the same rule the send route applies).
  const unbuildable = await Promise.all(offers.map((o) => (o.basis ? offerUnbuildableReason(room, design?.document, o, o.basis.inverter) : null)));
  const choices: OfferChoice[] = offers.map((o, i) => ({
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
            : unbuildable[i],
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
