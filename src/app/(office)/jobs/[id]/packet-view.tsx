import { ElectricalDesignView } from "@/components/electrical-design-view";
import { STAGE_LABELS } from "@/lib/stages";
import { visitLines } from "@/lib/job-packet";
import { MaterialsSections } from "@/components/ui/materials-view";
import type { JobPacket } from "@/server/jobs";
import { longDate } from "../dates";
import { CrewWork } from "./crew-work";

const BADGE = { pass: "bg-sage-light text-graphite", warn: "bg-caution-light text-caution", fail: "bg-danger-light text-danger" } as const;

/** Compass point of an azimuth (degrees clockwise from north), for the crew on the roof. */
function compass(azimuthDeg: number): string {
  const points = ["N", "NE", "E", "SE", "S", "SW", "W", "NW"];
  return points[Math.round((((azimuthDeg % 360) + 360) % 360) / 45) % 8];
}

/**
 * The job packet on screen, phone-first: contact, site, schedule, system, bill of materials,
 * string plan with its checks and cautions, notes, site photos, then the crew's work
 * (checklist, photos, installed).
 */
export function PacketView({ packet, canWork, office, today, timeZone }: { packet: JobPacket; canWork: boolean; office: boolean; today: string; timeZone: string }) {
  const { job } = packet;
  return (
    <div className="space-y-4" data-testid="job-packet">
      <CustomerSection packet={packet} />

      <ScheduleSection packet={packet} />

      {job.notes ? (
        <section className="card p-4" aria-labelledby="notes-heading">
          <h2 id="notes-heading" className="text-lg font-semibold">
            Notes from the office
          </h2>
          <p className="mt-1 whitespace-pre-line">{job.notes}</p>
        </section>
      ) : null}

      <SystemSection packet={packet} />

      {packet.materials ? <MaterialsSections materials={packet.materials} idPrefix="packet" /> : packet.bom.length > 0 ? <BomSection packet={packet} /> : null}

      <StringPlanSection packet={packet} />

      {packet.electrical ? <ElectricalDesignView design={packet.electrical.design} drawing={packet.electrical.drawing} checkedBy={packet.electrical.checkedBy} headingId="electrical-heading" /> : null}

      {packet.sitePhotos.length > 0 ? <SitePhotosSection packet={packet} /> : null}

      <CrewWork
        jobId={job.id}
        canWork={canWork}
        checklist={job.checklist}
        photos={packet.photos.map((p) => ({ id: p.id, caption: p.caption, widthPx: p.widthPx, heightPx: p.heightPx, uploadedByName: p.uploadedByName }))}
        installedAt={job.installedAt ? job.installedAt.toISOString() : null}
        installDate={job.installDate}
        office={office}
        today={today}
        timeZone={timeZone}
      />

      <p>
        <a href={`/api/jobs/${job.id}/packet.pdf`} className="btn-quiet" data-testid="packet-pdf">
          Job packet as PDF
        </a>
      </p>
    </div>
  );
}

/** Who to call and where the site is. */
function CustomerSection({ packet }: { packet: JobPacket }) {
  const { customer, site } = packet;
  const address = `${site.street}, ${site.city}, ${site.region} ${site.postalCode}`;
  return (
    <section className="card p-4" aria-labelledby="contact-heading">
      <h2 id="contact-heading" className="text-lg font-semibold">
        Customer
      </h2>
      <p className="mt-1 font-medium">{customer.contactName ?? customer.name}</p>
      <p className="text-sm text-graphite-soft">{customer.name}</p>
      <div className="mt-3 flex flex-wrap gap-2">
        {customer.phone ? (
          <a href={`tel:${customer.phone.replace(/[^\d+]/g, "")}`} className="btn-quiet" data-testid="customer-phone">
            Call {customer.phone}
          </a>
        ) : null}
        <a href={site.mapUri} className="btn-quiet" data-testid="map-link">
          Open in maps
        </a>
      </div>
      {customer.secondContactName ? (
        <p className="mt-2 text-sm">
          Also: {customer.secondContactName}
          {customer.secondContactPhone ? (
            <>
              {" "}
              · <a href={`tel:${customer.secondContactPhone.replace(/[^\d+]/g, "")}`} className="text-copper underline">{customer.secondContactPhone}</a>
            </>
          ) : null}
        </p>
      ) : null}
      <p className="mt-3" data-testid="site-address">
        {address}
      </p>
      <p className="figure text-xs text-graphite-soft">
        {site.latitude.toFixed(5)}, {site.longitude.toFixed(5)}
        {site.utilityName ? <span className="font-sans"> · Utility: {site.utilityName}</span> : null}
      </p>
    </section>
  );
}

function ScheduleSection({ packet }: { packet: JobPacket }) {
  const { job } = packet;
  const visits = visitLines(job, longDate);
  return (
    <section className="card p-4" aria-labelledby="schedule-heading">
      <h2 id="schedule-heading" className="text-lg font-semibold">
        Schedule
      </h2>
      <dl className="mt-2 grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-sm">
        {visits.map((v) => (
          <div key={v.label} className="contents">
            <dt className="text-graphite-soft">{v.label}</dt>
            <dd>{v.text === "not set" ? "Not set" : v.text}</dd>
          </div>
        ))}
        <dt className="text-graphite-soft">Permit</dt>
        <dd>
          {job.permitNumber ?? "No number yet"}
          {job.permitApprovedOn ? ` · approved ${longDate(job.permitApprovedOn)}` : job.permitSubmittedOn ? ` · submitted ${longDate(job.permitSubmittedOn)}` : ""}
        </dd>
        <dt className="text-graphite-soft">Stage</dt>
        <dd>{STAGE_LABELS[job.stage]}</dd>
        {packet.crewName ? (
          <>
            <dt className="text-graphite-soft">Crew</dt>
            <dd>{packet.crewName}</dd>
          </>
        ) : null}
      </dl>
    </section>
  );
}

/** The system's size and its roof faces. */
function SystemSection({ packet }: { packet: JobPacket }) {
  const { system } = packet;
  return (
    <section className="card p-4" aria-labelledby="system-heading">
      <h2 id="system-heading" className="text-lg font-semibold">
        System
      </h2>
      <p className="text-xs text-graphite-soft">{packet.source.label}</p>
      {system ? (
        <p className="mt-2">
          <span className="figure">{system.moduleCount}</span> modules · <span className="figure">{system.kwDc.toFixed(2)} kW DC</span>
          {system.kwAc !== null ? (
            <>
              {" "}
              · <span className="figure">{system.kwAc.toFixed(2)} kW AC</span>
            </>
          ) : null}
        </p>
      ) : (
        <p className="mt-2 text-graphite-soft">No equipment on record yet: the deal has neither a signed proposal nor a saved design.</p>
      )}
      {packet.faces.length > 0 ? (
        <div className="mt-3 overflow-x-auto">
          <table className="w-full text-left text-sm" data-testid="roof-faces">
            <caption className="sr-only">Roof faces</caption>
            <thead className="text-xs uppercase tracking-wide text-graphite-soft">
              <tr>
                <th scope="col" className="py-1 pr-3">Roof face</th>
                <th scope="col" className="py-1 pr-3 text-right">Tilt</th>
                <th scope="col" className="py-1 pr-3 text-right">Azimuth</th>
                <th scope="col" className="py-1 text-right">Modules</th>
              </tr>
            </thead>
            <tbody className="divide-y divide-paper-line">
              {packet.faces.map((f) => (
                <tr key={f.name}>
                  <td className="py-2 pr-3">{f.name}</td>
                  <td className="figure py-2 pr-3 text-right">{f.tiltDeg}°</td>
                  <td className="figure py-2 pr-3 text-right">
                    {f.azimuthDeg}° {compass(f.azimuthDeg)}
                  </td>
                  <td className="figure py-2 text-right">{f.moduleCount}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      ) : null}
    </section>
  );
}

function BomSection({ packet }: { packet: JobPacket }) {
  return (
    <section className="card p-4" aria-labelledby="bom-heading">
      <h2 id="bom-heading" className="text-lg font-semibold">
        Bill of materials
      </h2>
      <ul className="mt-2 divide-y divide-paper-line" data-testid="bom">
        {packet.bom.map((line) => (
          <li key={line.item} className="flex items-baseline justify-between gap-3 py-2">
            <span>
              <span className="font-medium">{line.item}</span>
              <span className="block text-sm text-graphite-soft">{line.detail}</span>
            </span>
            <span className="figure shrink-0 text-lg">× {line.quantity}</span>
          </li>
        ))}
      </ul>
    </section>
  );
}

/** The string plan with each string's code checks, then the cautions for the crew. */
function StringPlanSection({ packet }: { packet: JobPacket }) {
  const { system } = packet;
  return (
    <section className="card p-4" aria-labelledby="strings-heading">
      <h2 id="strings-heading" className="text-lg font-semibold">
        String plan and code checks
      </h2>
      {packet.stringPlan ? (
        <div className="mt-2 space-y-3" data-testid="string-plan">
          <p className="text-sm">
            Strings: <span className="figure">{packet.stringPlan.stringSizes.join(" + ")}</span> modules · design temperatures{" "}
            <span className="figure">
              {packet.stringPlan.lowestTempC} °C / {packet.stringPlan.highestTempC} °C
            </span>
          </p>
          {[...packet.stringPlan.check.problems, ...packet.stringPlan.notes].map((p) => (
            <p key={p} className="text-sm text-caution">
              {p}
            </p>
          ))}
          {packet.stringPlan.check.results.map(({ modulesInSeries, strings, result }) => (
            <div key={modulesInSeries} className="rounded-md border border-paper-line p-3">
              <p className="font-medium">
                {strings} × {modulesInSeries} in series: <span className={`rounded px-2 py-0.5 text-sm ${BADGE[result.status]}`}>{result.status}</span>
              </p>
              <ul className="mt-2 space-y-2 text-sm">
                {result.checks.map((c) => (
                  <li key={c.id} className="flex gap-2">
                    <span className={`h-fit shrink-0 rounded px-1.5 text-xs uppercase ${BADGE[c.status]}`}>{c.status}</span>
                    <span>
                      <span className="font-medium">{c.rule}</span>: <span className="figure">{c.detail}</span>
                    </span>
                  </li>
                ))}
              </ul>
              {result.notes.map((n) => (
                <p key={n} className="mt-2 text-xs text-graphite-soft">
                  {n}
                </p>
              ))}
            </div>
          ))}
        </div>
      ) : (
        <p className="mt-2 text-sm text-graphite-soft">
          {system ? "Microinverters, or no string plan saved on the design: no series strings to check." : "No design yet."}
        </p>
      )}
      <ul className="mt-3 space-y-1 rounded-md bg-caution-light p-3 text-sm text-graphite" data-testid="cautions">
        {packet.cautions.map((c) => (
          <li key={c}>{c}</li>
        ))}
      </ul>
    </section>
  );
}

function SitePhotosSection({ packet }: { packet: JobPacket }) {
  const { job } = packet;
  return (
    <section className="card p-4" aria-labelledby="site-photos-heading">
      <h2 id="site-photos-heading" className="text-lg font-semibold">
        Site photos from the visit
      </h2>
      <ul className="mt-2 grid grid-cols-2 gap-2 sm:grid-cols-3">
        {packet.sitePhotos.map((p) => (
          <li key={p.id}>
            <a href={`/api/jobs/${job.id}/site-photos/${p.id}`} target="_blank" rel="noreferrer">
              <img src={`/api/jobs/${job.id}/site-photos/${p.id}`} alt={p.fileName} className="aspect-[4/3] w-full rounded-md object-cover" loading="lazy" />
            </a>
          </li>
        ))}
      </ul>
    </section>
  );
}
