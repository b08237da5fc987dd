import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { can } from "@/lib/permissions";
import { STAGE_LABELS } from "@/lib/stages";
import { todayInZone } from "@/lib/zoned-time";
import { getCompanySettings } from "@/server/company-settings";
import { listCrewOptions } from "@/server/crews";
import { HttpError } from "@/server/errors";
import { cancelWindowEndOf, firstInstallDay, getJobPacket, type JobPacket } from "@/server/jobs";
import { FormMessage } from "@/components/ui/field";
import { idSchema } from "@/server/route";
import { getMember } from "@/server/session";
import { AddChecklistButton } from "./add-checklist-button";
import { JobForm } from "./job-form";
import { PacketView } from "./packet-view";

export const metadata: Metadata = { title: "Job" };

export default async function JobPage({ params }: { params: Promise<{ id: string }> }) {
  const { id } = await params;
  const member = await getMember();
  if (!member || !can(member.role, "jobs:read") || !idSchema.safeParse(id).success) notFound();
  // Another company's job, or another crew's for an installer: simply not found.
  const packet = await getJobPacket(member, id).catch((err: unknown) => {
    if (err instanceof HttpError && err.status === 404) notFound();
    throw err;
  });
  const { job } = packet;
  const office = can(member.role, "jobs:manage");
  const canWork = can(member.role, "jobs:work");
  // Times the crew records are shown on the company's clock, the same on the server and in the browser.
  const { timeZone } = await getCompanySettings(member.companyId);
  const today = todayInZone(timeZone);

  const header = (
    <>
      <JobHeader packet={packet} />
      {job.cancelledAt ? (
        <div data-testid="job-cancelled">
          <FormMessage tone="error">
            Job cancelled: {job.cancelReason ?? "its deal was cancelled"}. It is read only and has left the crew&apos;s calendar, Today and the Jobs list.
          </FormMessage>
        </div>
      ) : null}
    </>
  );
  const open = !job.cancelledAt;

  if (!office) {
    return (
      <div className="mx-auto max-w-xl space-y-4">
        {header}
        <PacketView packet={packet} canWork={canWork && open} office={office} today={today} timeZone={timeZone} />
      </div>
    );
  }

  const crews = await listCrewOptions(member.companyId);
  const windowEnd = await cancelWindowEndOf(member.companyId, job);
  return (
    <div className="space-y-6">
      {header}
      <p className="text-sm">
        <Link href={`/deals/${job.dealId}`} className="link">
          Open the deal
        </Link>{" "}
        · its Timeline shows every change below.
      </p>
      <JobForm jobId={job.id} crews={crews} defaults={jobFormDefaults(job)} readOnly={!open} firstInstallDay={firstInstallDay(windowEnd)} />
      {open && job.checklist.length === 0 ? <AddChecklistButton jobId={job.id} /> : null}
      <div>
        <h2 className="text-xl font-semibold">Job packet</h2>
        <p className="text-sm text-graphite-soft">What the crew sees on their phone.</p>
        <div className="mt-3 max-w-2xl">
          <PacketView packet={packet} canWork={canWork && open} office={office} today={today} timeZone={timeZone} />
        </div>
      </div>
    </div>
  );
}

function JobHeader({ packet }: { packet: JobPacket }) {
  const { job } = packet;
  return (
    <header className="flex flex-wrap items-start justify-between gap-3">
      <div>
        <Link href="/jobs" className="inline-flex min-h-touch items-center text-sm text-copper underline-offset-2 hover:underline">
          ← Jobs
        </Link>
        <h1 className="text-2xl font-semibold">{packet.customer.name}</h1>
        <p className="text-graphite-soft">
          {packet.site.street}, {packet.site.city}
        </p>
      </div>
      <p className="rounded-full bg-copper-light px-3 py-1 text-sm font-medium text-copper-dark" data-testid="job-stage">
        {job.cancelledAt ? "Cancelled" : job.installedAt && job.stage === "install_booked" ? "Installed" : STAGE_LABELS[job.stage]}
      </p>
    </header>
  );
}

/** The job form's starting values: the job's own, empty where it has none yet. */
function jobFormDefaults(job: JobPacket["job"]) {
  const v = (x: string | null) => x ?? "";
  return {
    crewId: v(job.crewId),
    surveyDate: v(job.surveyDate),
    surveyDoneOn: v(job.surveyDoneOn),
    installDate: v(job.installDate),
    permitNumber: v(job.permitNumber),
    permitSubmittedOn: v(job.permitSubmittedOn),
    permitApprovedOn: v(job.permitApprovedOn),
    interconnectionNumber: v(job.interconnectionNumber),
    interconnectionSubmittedOn: v(job.interconnectionSubmittedOn),
    interconnectionApprovedOn: v(job.interconnectionApprovedOn),
    inspectionOn: v(job.inspectionOn),
    inspectionPassedOn: v(job.inspectionPassedOn),
    ptoOn: v(job.ptoOn),
    notes: v(job.notes),
  };
}
