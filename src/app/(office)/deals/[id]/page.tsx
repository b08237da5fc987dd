import type { Metadata } from "next";
import { openDeal } from "@/server/deal-scope";
import { listRatePlanOptions } from "@/server/deals";
import { getMember } from "@/server/session";
import { listSitePhotos } from "@/server/site-photos";
import { HouseholdForm } from "./household-form";
import { SitePhotos } from "./site-photos";
import { UtilityForm } from "./utility-form";

export const metadata: Metadata = { title: "Household" };

export default async function HouseholdTab({ params }: { params: Promise<{ id: string }> }) {
  const { id } = await params;
  const member = await getMember();
  if (!member) return null;
  const [{ household, deal, rights }, plans, sitePhotos] = await Promise.all([openDeal(member, id), listRatePlanOptions(member), listSitePhotos(member, id)]);
  const readOnly = !rights.edit;
  return (
    <div className="grid gap-6 lg:grid-cols-[2fr_1fr]">
      <HouseholdForm
        dealId={id}
        readOnly={readOnly}
        defaults={{
          name: household.name,
          contactName: household.contactName ?? "",
          email: household.email ?? "",
          phone: household.phone ?? "",
          secondContactName: household.secondContactName ?? "",
          secondContactEmail: household.secondContactEmail ?? "",
          secondContactPhone: household.secondContactPhone ?? "",
          street: household.street,
          city: household.city,
          region: household.region,
          postalCode: household.postalCode,
          latitude: household.latitude,
          longitude: household.longitude,
        }}
      />
      <aside className="card h-fit p-5 text-sm">
        <h2 className="font-semibold">Deal</h2>
        <dl className="mt-2 grid grid-cols-[auto_1fr] gap-x-3 gap-y-1">
          <dt className="text-graphite-soft">Owner</dt>
          <dd>{deal.ownerName ?? "—"}</dd>
          <dt className="text-graphite-soft">Source</dt>
          <dd>{deal.source ?? "—"}</dd>
          <dt className="text-graphite-soft">Coordinates</dt>
          <dd className="figure">
            {household.latitude.toFixed(4)}, {household.longitude.toFixed(4)}
          </dd>
        </dl>
        <UtilityForm dealId={id} utilityName={deal.utilityName ?? ""} ratePlanId={deal.ratePlanId ?? ""} plans={plans} readOnly={readOnly} />
      </aside>
      <SitePhotos dealId={id} canEdit={!readOnly} photos={sitePhotos.map((p) => ({ id: p.id, fileName: p.fileName, uploadedByName: p.uploadedByName }))} />
    </div>
  );
}
