import type { Metadata } from "next";
import { NoAccess } from "@/components/no-access";
import { listActiveInverters, listActiveModules } from "@/server/catalog";
import { getDesignForDeal } from "@/server/designs";
import { listDiscountRequestsForDeal, listOffers } from "@/server/offers";
import { getPriceBook } from "@/server/price-book";
import { listRatePlans, type RatePlanRow } from "@/server/rate-plans";
import { utilityClockNote } from "@/server/utilities";
import { dealPageScope } from "../deal-page";
import { OffersClient } from "./offers-client";

export const metadata: Metadata = { title: "Offers" };

export default async function OffersTab({ params }: { params: Promise<{ id: string }> }) {
  const room = await dealPageScope(params);
  if (!room) return null;
  const { member, dealId: id } = room;
  if (!room.rights.price) return <NoAccess section="Offers" />;
  const [offers, design, book, modules, inverters, ratePlans, requests, clockNote] = await Promise.all([
    listOffers(room),
    getDesignForDeal(room),
    getPriceBook(member.companyId),
    listActiveModules(member.companyId),
    listActiveInverters(member.companyId),
    listRatePlans(member.companyId),
    listDiscountRequestsForDeal(room),
    utilityClockNote(room),
  ]);
  return (
    <>
      {clockNote ? (
        <p className="mt-4 text-sm text-graphite-soft" data-testid="utility-clock-note">
          {clockNote}
        </p>
      ) : null}
      <OffersClient
      dealId={id}
      canEdit={room.rights.edit}
      canApprove={room.rights.approveDiscounts}
      dealRatePlanId={room.deal.ratePlanId ?? null}
      offers={offers.map((o) => ({ id: o.id, position: o.position, name: o.name, inputs: o.inputs, results: o.results, discountStatus: o.discountStatus, stale: o.stale }))}
      design={design ? { faces: design.document.faces.map((f) => ({ id: f.id, name: f.name, usableSlots: f.usableSlots, moduleCount: f.moduleCount })), moduleId: design.document.moduleId, inverterId: design.document.inverterId } : null}
      adders={book.adders.map((a) => ({ id: a.id, name: a.name }))}
      lineItems={book.lineItems.map((l) => ({ id: l.id, name: l.name, amountCents: l.amountCents }))}
      modules={modules.map((m) => ({ id: m.id, label: `${m.manufacturer} ${m.model} · ${m.stcWatts} W` }))}
      inverters={inverters.map((i) => ({ id: i.id, label: `${i.manufacturer} ${i.model} · ${i.kind === "micro" ? "micro" : `${(i.acWatts / 1000).toFixed(1)} kW string`}` }))}
      ratePlans={planChoices(ratePlans, room.deal)}
      requests={requests.map((r) => ({ id: r.id, offerId: r.offerId, offerName: r.offerName, amountCents: r.amountCents, reason: r.reason, status: r.status, requestedByName: r.requestedByName, decisionNote: r.decisionNote, createdAt: r.createdAt.toISOString() }))}
      />
    </>
  );
}

/** The household's utility's plans first; other utilities' plans after them, marked (they need a reason). */
function planChoices(plans: RatePlanRow[], deal: { utilityId: string | null; ratePlanId: string | null }) {
  const usable = plans.filter((p) => p.active || p.id === deal.ratePlanId);
  const other = (p: RatePlanRow) => deal.utilityId !== null && p.utilityId !== deal.utilityId;
  return [...usable.filter((p) => !other(p)), ...usable.filter(other)].map((p) => ({
    id: p.id,
    label: other(p) ? `Another utility — ${p.utilityName}: ${p.name}` : deal.utilityId ? p.name : `${p.utilityName}: ${p.name}`,
    otherUtility: other(p),
  }));
}
