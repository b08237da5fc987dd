// The customer's project after signing: where it stands among the stages and what comes next,
// with its date when the office has set one. Phone-first. It shows the company's name only:
// no staff names, permit numbers or internal notes.
import type { Stage } from "@/lib/enums";
import { formatCalendarDate } from "@/lib/format";
import { getProjectProgress, type ProjectProgress } from "@/server/jobs";
import { findProposalByToken } from "@/server/proposals";

const STEPS: { stage: Stage; label: string }[] = [
  { stage: "signed", label: "Signed" },
  { stage: "deposit_paid", label: "Deposit paid" },
  { stage: "survey", label: "Site survey" },
  { stage: "permitting", label: "Permitting" },
  { stage: "install_booked", label: "Install booked" },
  { stage: "installed", label: "Installed" },
  { stage: "inspected", label: "Inspected" },
  { stage: "live", label: "Live" },
];

const day = (iso: string) => formatCalendarDate(iso, "full");

/** The next thing the customer can expect, with its date when there is one. */
export function nextStep(p: ProjectProgress, companyName: string): { title: string; date: string | null; text: string } {
  const j = p.job;
  const ahead = (iso: string | null | undefined): iso is string => !!iso && iso >= p.today;
  const index = STEPS.findIndex((s) => s.stage === p.stage);
  const before = (stage: Stage) => index >= 0 && index < STEPS.findIndex((s) => s.stage === stage);
  if (p.stage === "signed") return { title: "Pay your deposit", date: null, text: `Once the deposit is paid, ${companyName} books a visit to survey your roof.` };
  if (before("permitting") && ahead(j?.surveyDate)) return { title: "Site survey", date: j.surveyDate, text: "Someone from the crew measures the roof and checks the electrical panel. Please make sure they can reach both." };
  if (p.stage === "deposit_paid") return { title: "Site survey", date: null, text: `${companyName} will contact you to pick a day for the site survey.` };
  if (before("installed") && ahead(j?.installDate)) {
    return j.permitApproved
      ? { title: "Installation", date: j.installDate, text: "The crew installs the system; most homes take one to two days." }
      : { title: "Installation (planned)", date: j.installDate, text: "The day is planned; it is confirmed once the permit is approved." };
  }
  if (p.stage === "survey") return { title: "Permit", date: null, text: `${companyName} prepares the plans and applies for your building permit.` };
  if (p.stage === "permitting") return { title: "Permit approval", date: null, text: "The plans are with your local building department. We book the install once they approve them." };
  if (p.stage === "install_booked") return { title: "Installation", date: null, text: "The install is booked; the crew will confirm the day." };
  if (before("inspected") && ahead(j?.inspectionOn)) return { title: "Inspection", date: j.inspectionOn, text: "The local inspector checks the installation. Someone should be home to let them in." };
  if (p.stage === "installed") return { title: "Inspection", date: null, text: `${companyName} books the inspection with your local building department.` };
  if (p.stage === "inspected") return { title: "Permission to operate", date: null, text: "The utility reviews the inspection and gives permission to turn the system on. Please keep it switched off until then." };
  if (p.stage === "live") return { title: "Your system is live", date: j?.ptoOn ?? null, text: "The utility has given permission to operate. Enjoy your solar power." };
  return { title: "On hold", date: null, text: `${companyName} will be in touch about the next step.` };
}

/** Shown on the customer's page under the signed proposal (src/app/p/[token]/page.tsx). */
export async function ProjectPanel({ token }: { token: string }) {
  const p = await findProposalByToken(token);
  if (!p || p.status !== "signed") return null;
  const progress = await getProjectProgress(p.companyId, p.dealId);
  if (!progress) return null;
  const companyName = p.snapshot.company.name;
  // A paused or closed deal shows no stage track.
  const current = STEPS.findIndex((s) => s.stage === progress.stage);
  if (current < 0) {
    return (
      <section className="card p-5" aria-labelledby="project-heading" data-testid="project-panel">
        <h2 id="project-heading" className="text-lg font-semibold">
          Your project
        </h2>
        <p className="mt-1 text-graphite-soft">
          {progress.stage === "on_hold" ? `Your project is paused. ${companyName} will be in touch.` : `${companyName} will be in touch about your project.`}
        </p>
      </section>
    );
  }
  const next = nextStep(progress, companyName);
  return (
    <section className="card p-5" aria-labelledby="project-heading" data-testid="project-panel">
      <h2 id="project-heading" className="text-lg font-semibold">
        Your project
      </h2>
      <div className="mt-3 rounded-md border border-copper/30 bg-copper-light/40 p-4" data-testid="project-next">
        <p className="text-sm text-graphite-soft">Next</p>
        <p className="text-lg font-semibold">{next.title}</p>
        {next.date ? <p className="figure text-copper-dark">{day(next.date)}</p> : null}
        <p className="mt-1 text-sm">{next.text}</p>
      </div>
      <ol className="mt-4 space-y-0" aria-label="Project stages">
        {STEPS.map((s, i) => {
          const state = i < current ? "done" : i === current ? "current" : "next";
          return (
            <li key={s.stage} className="flex min-h-touch items-center gap-3" aria-current={state === "current" ? "step" : undefined} data-state={state}>
              <span
                aria-hidden
                className={`flex h-7 w-7 shrink-0 items-center justify-center rounded-full border-2 text-xs font-semibold ${
                  state === "done" ? "border-sage bg-sage text-white" : state === "current" ? "border-copper bg-white text-copper" : "border-paper-line bg-white text-graphite-faint"
                }`}
              >
                {state === "done" ? "✓" : i + 1}
              </span>
              <span className={state === "next" ? "text-graphite-soft" : state === "current" ? "font-semibold" : ""}>
                {s.label}
                <span className="sr-only">{state === "done" ? " (done)" : state === "current" ? " (where your project is now)" : " (to come)"}</span>
              </span>
            </li>
          );
        })}
      </ol>
    </section>
  );
}
