import type { Metadata } from "next";
import Link from "next/link";
import { NoAccess } from "@/components/no-access";
import { SelectField } from "@/components/ui/field";
import { TableShell, Td, Th } from "@/components/ui/table";
import { can } from "@/lib/permissions";
import { STAGE_LABELS } from "@/lib/stages";
import { getOwnCrew, listCrewOptions } from "@/server/crews";
import { companyToday, JOB_DATE_LABELS, listJobs, type JobListRow } from "@/server/jobs";
import { getMember } from "@/server/session";
import { FeedLink } from "../feed-link";
import { shortDate, weekdayDate } from "../dates";

export const metadata: Metadata = { title: "Jobs" };

export default async function JobsPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const member = await getMember();
  if (!member) return null;
  if (!can(member.role, "jobs:read")) return <NoAccess section="Jobs" />;
  if (member.role === "crew") return <CrewJobs />;

  const raw = await searchParams;
  const crewFilter = typeof raw.crew === "string" ? raw.crew : "";
  const [jobs, crews, today] = await Promise.all([listJobs(member), listCrewOptions(member.companyId), companyToday(member.companyId)]);
  const shown = jobs.filter((j) => (crewFilter === "none" ? !j.crewId : crewFilter ? j.crewId === crewFilter : true));

  return (
    <>
      <div className="flex flex-wrap items-end justify-between gap-3">
        <div>
          <h1 className="text-2xl font-semibold">Jobs</h1>
          <p className="mt-1 text-sm text-graphite-soft">
            A job starts when the customer pays the deposit. Set its dates and crew; each date moves the deal on the board.
          </p>
        </div>
        {can(member.role, "crews:manage") ? (
          <Link href="/jobs/crews" className="btn-quiet">
            Crews and calendars
          </Link>
        ) : null}
      </div>
      <form action="/jobs" className="mt-4 flex flex-wrap items-end gap-3" aria-label="Filter jobs">
        <SelectField
          id="jobs-crew"
          name="crew"
          label="Crew"
          className="w-52"
          defaultValue={crewFilter}
          options={[{ value: "", label: "Every crew" }, { value: "none", label: "No crew yet" }, ...crews.map((c) => ({ value: c.id, label: c.name }))]}
        />
        <button type="submit" className="btn-quiet">
          Show
        </button>
      </form>
      <JobsTable jobs={jobs} shown={shown} today={today} />
    </>
  );
}

function dateCell(iso: string | null, today: string) {
  if (!iso) return "—";
  return iso === today ? <strong>Today</strong> : shortDate(iso);
}

const BUCKET_TITLES: Record<JobListRow["bucket"], string> = {
  today: "Today",
  week: "This week",
  later: "Later",
  none: "Nothing scheduled ahead",
};

/** The installer's phone view: their crew's jobs, today's first. */
async function CrewJobs() {
  const member = await getMember();
  if (!member) return null;
  const [crew, jobs] = await Promise.all([getOwnCrew(member), listJobs(member)]);
  const groups = (["today", "week", "later", "none"] as const).map((b) => ({ bucket: b, jobs: jobs.filter((j) => j.bucket === b) })).filter((g) => g.jobs.length > 0);
  return (
    <div className="mx-auto max-w-xl">
      <h1 className="text-2xl font-semibold">Your jobs</h1>
      {crew ? (
        <p className="mt-1 text-graphite-soft">
          {crew.name} · <span className="figure">{jobs.length}</span> job{jobs.length === 1 ? "" : "s"}
        </p>
      ) : (
        <p className="mt-2 text-graphite-soft">You are not in a crew yet. The office adds you to one; then your jobs show here.</p>
      )}
      {groups.map((g) => (
        <section key={g.bucket} className="mt-6" aria-labelledby={`bucket-${g.bucket}`}>
          <h2 id={`bucket-${g.bucket}`} className="text-sm font-semibold uppercase tracking-wide text-graphite-soft">
            {BUCKET_TITLES[g.bucket]}
          </h2>
          <ul className="mt-2 space-y-2" data-testid={`crew-jobs-${g.bucket}`}>
            {g.jobs.map((j) => (
              <li key={j.id}>
                <Link href={`/jobs/${j.id}`} className="card block min-h-touch p-4 active:bg-paper-deep" data-testid="crew-job">
                  <span className="flex items-baseline justify-between gap-3">
                    <span className="text-lg font-semibold">{j.householdName}</span>
                    {j.next ? <span className="figure shrink-0 text-sm text-copper-dark">{weekdayDate(j.next.date)}</span> : null}
                  </span>
                  <span className="mt-1 block text-graphite-soft">
                    {j.street}, {j.city}
                  </span>
                  <span className="mt-1 block text-sm">
                    {j.installedAt ? "Installed" : j.next ? JOB_DATE_LABELS[j.next.kind] : STAGE_LABELS[j.stage]}
                    {j.checklistTotal ? (
                      <span className="figure text-graphite-soft">
                        {" "}
                        · checklist {j.checklistDone}/{j.checklistTotal}
                      </span>
                    ) : null}
                  </span>
                </Link>
              </li>
            ))}
          </ul>
        </section>
      ))}
      {crew && jobs.length === 0 ? <p className="mt-6 text-graphite-soft">No jobs are assigned to {crew.name} right now.</p> : null}
      {crew ? <FeedLink feedUrl={crew.feedUrl} crewName={crew.name} /> : null}
    </div>
  );
}

/** The office's jobs table: one row a job, its dates against the company's today. */
function JobsTable({ jobs, shown, today }: { jobs: JobListRow[]; shown: JobListRow[]; today: string }) {
  return (
    <TableShell
      className="mt-4"
      minWidth={900}
      testId="jobs-table"
      head={
        <>
          <Th>Household</Th>
          <Th>Stage</Th>
          <Th>Crew</Th>
          <Th>Survey</Th>
          <Th>Permit</Th>
          <Th>Install</Th>
          <Th>Inspection</Th>
          <Th>PTO</Th>
          <Th>Checklist</Th>
        </>
      }
    >
      {shown.map((j) => (
        <tr key={j.id} data-testid={`job-row-${j.id}`}>
          <Td>
            <Link href={`/jobs/${j.id}`} className="font-medium text-copper underline-offset-2 hover:underline">
              {j.householdName}
            </Link>
            <span className="block text-xs text-graphite-soft">{j.city}</span>
          </Td>
          <Td className="whitespace-nowrap">{STAGE_LABELS[j.stage]}</Td>
          <Td className="whitespace-nowrap">{j.crewName ?? <span className="text-caution">Not assigned</span>}</Td>
          <Td className="figure whitespace-nowrap">{dateCell(j.surveyDate, today)}</Td>
          <Td className="whitespace-nowrap">
            {j.permitApprovedOn ? (
              <span className="text-sage">Approved {shortDate(j.permitApprovedOn)}</span>
            ) : j.permitSubmittedOn ? (
              `Submitted ${shortDate(j.permitSubmittedOn)}`
            ) : (
              "—"
            )}
          </Td>
          <Td className="figure whitespace-nowrap">{j.installedAt ? <span className="text-sage">Installed</span> : dateCell(j.installDate, today)}</Td>
          <Td className="figure whitespace-nowrap">{dateCell(j.inspectionOn, today)}</Td>
          <Td className="figure whitespace-nowrap">{dateCell(j.ptoOn, today)}</Td>
          <Td className="figure whitespace-nowrap">{j.checklistTotal ? `${j.checklistDone}/${j.checklistTotal}` : "—"}</Td>
        </tr>
      ))}
      {shown.length === 0 ? (
        <tr>
          <Td colSpan={9} className="py-6 text-center text-graphite-soft">
            {jobs.length === 0 ? "No jobs yet. A job appears here when a customer pays their deposit." : "No job matches this filter."}
          </Td>
        </tr>
      ) : null}
    </TableShell>
  );
}
