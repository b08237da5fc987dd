import type { Metadata } from "next";
import { siteTimeZone } from "@/engine/site-time-zone";
import { LOCALE_NAMES } from "@/lib/i18n/locales";
import { sitePositionProblem } from "@/engine/site-position";
import { listUtilityChoices } from "@/server/deals";
import { getDesignForDeal } from "@/server/designs";
import { siteStation, type SiteStation } from "@/server/weather-stations";
import { listSitePhotos } from "@/server/site-photos";
import { dealPageScope } from "./deal-page";
import { HouseholdForm } from "./household-form";
import { ServicePanelForm } from "./service-panel-form";
import { SitePhotos } from "./site-photos";
import { UtilityForm } from "./utility-form";

export const metadata: Metadata = { title: "Household" };

const CONTACT_FIELDS = ["contactName", "email", "phone", "secondContactName", "secondContactEmail", "secondContactPhone"] as const;

export default async function HouseholdTab({ params }: { params: Promise<{ id: string }> }) {
  const scope = await dealPageScope(params);
  if (!scope) return null;
  const { dealId: id, household, deal, rights } = scope;
  const [choices, sitePhotos, design] = await Promise.all([listUtilityChoices(scope.member), listSitePhotos(scope.member, id), getDesignForDeal(scope)]);
  const positionProblem = sitePositionProblem(household.latitude, household.longitude);
  const station = positionProblem ? null : await siteStation(scope.companyId, household, design?.document.weather ?? { kind: "nearest" });
  const readOnly = !rights.edit;
  const { name, street, city, region, postalCode, latitude, longitude, language } = household;
  const site = { name, street, city, region, postalCode, latitude, longitude, language };
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
          <dt className="text-graphite-soft">Language</dt>
          <dd data-testid="household-language">{LOCALE_NAMES[household.language]}</dd>
          <dt className="text-graphite-soft">Coordinates</dt>
          <dd className="figure">
            {household.latitude.toFixed(4)}, {household.longitude.toFixed(4)}
          </dd>
          {positionProblem ? null : (
            <>
              <dt className="text-graphite-soft">Time zone</dt>
              <dd data-testid="site-time-zone">{siteTimeZone(household.latitude, household.longitude)} (from the coordinates)</dd>
              <dt className="text-graphite-soft">Weather</dt>
              <dd data-testid="site-station">{station ? stationText(station) : null}</dd>
            </>
          )}
        </dl>
        {positionProblem ? (
          <p role="alert" className="mt-2 text-sm text-danger">
            {positionProblem}. Nothing can be estimated for this site until it is set.
          </p>
        ) : null}
        <UtilityForm dealId={id} utilityId={deal.utilityId ?? ""} ratePlanId={deal.ratePlanId ?? ""} choices={choices} readOnly={readOnly} />
      </aside>
      <ServicePanelForm dealId={id} readOnly={readOnly} initial={{ serviceBusbarA: household.serviceBusbarA, serviceMainBreakerA: household.serviceMainBreakerA, serviceVoltageV: household.serviceVoltageV }} />
      <SitePhotos dealId={id} canEdit={!readOnly} photos={sitePhotos.map((p) => ({ id: p.id, fileName: p.fileName, uploadedByName: p.uploadedByName }))} />
    </div>
  );
}

function stationText(s: SiteStation): string {
  if (s.kind === "manual") return "A production figure typed on the Design tab (no station)";
  if (s.kind === "none") return `No weather station within ${s.maxDistanceKm} km`;
  const km = s.distanceKm.toLocaleString("en-US", { maximumFractionDigits: 1 });
  return `${s.name}, ${km} km away (${s.how === "chosen" ? "chosen on the design" : "the nearest"})`;
}
