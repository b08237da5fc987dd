import type { Metadata } from "next";
import { listRatePlanOptions } from "@/server/deals";
import { listSitePhotos } from "@/server/site-photos";
import { dealPageScope } from "./deal-page";
import { HouseholdForm } from "./household-form";
import { SitePhotos } from "./site-photos";
import { UtilityForm } from "./utility-form";

export const metadata: Metadata = { title: "Household" };

const CONTACT_FIELDS = ["contactName", "email", "phone", "secondContactName", "secondContactEmail", "secondContactPhone"] as const;

export default async function HouseholdTab({ params }: { params: Promise<{ id: string }> }) {
  const scope = await dealPageScope(params);
  if (!scope) return null;
  const { dealId: id, household, deal, rights } = scope;
  const [plans, sitePhotos] = await Promise.all([listRatePlanOptions(scope.member), listSitePhotos(scope.member, id)]);
  const readOnly = !rights.edit;
  const { name, street, city, region, postalCode, latitude, longitude } = household;
  const site = { name, street, city, region, postalCode, latitude, longitude };
  // The form's text fields take "" for a contact detail not given.
  const contacts = Object.fromEntries(CONTACT_FIELDS.map((k) => [k, household[k] ?? ""])) as Record<(typeof CONTACT_FIELDS)[number], string>;
  return (
    <div className="grid gap-6 lg:grid-cols-[2fr_1fr]">
      <HouseholdForm
        dealId={id}
        readOnly={readOnly}
        defaults={{ ...site, ...contacts }}
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
