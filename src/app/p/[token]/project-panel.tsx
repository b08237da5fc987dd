// The customer's project after signing: where it stands among the stages and what comes next,
// with its date when the office has set one. Phone-first. It shows the company's name only:
// no staff names, permit numbers or internal notes.
import type { Stage } from "@/lib/enums";
import { formatCalendarDate } from "@/lib/format";
import type { Locale } from "@/lib/i18n/locales";
import { translator } from "@/lib/i18n/translator";
import { getProjectProgress, type ProjectProgress } from "@/server/jobs";
import { findProposalByToken } from "@/server/proposals";

/** The stages the homeowner sees, in order (their names: page.project.stage in the catalogs). */
const STEPS = ["signed", "deposit_paid", "survey", "permitting", "install_booked", "installed", "inspected", "live"] as const satisfies readonly Stage[];

type Step = { title: string; date: string | null; text: string };

/** The next thing the customer can expect, with its date when there is one, in their language. */
export function nextStep(p: ProjectProgress, companyName: string, locale: Locale = "en"): Step {
  const t = translator(locale, "page.project.steps");
  const company = { company: companyName };
  const step = (key: StepKey, date: string | null = null): Step => ({ title: t(`${key}Title`), date, text: t(`${key}Text`, company) });
  const j = p.job;
  const ahead = (iso: string | null | undefined): iso is string => !!iso && iso >= p.today;
  const index = STEPS.findIndex((s) => s === p.stage);
  const before = (stage: Stage) => index >= 0 && index < STEPS.findIndex((s) => s === stage);
  if (p.stage === "signed") return step("payDeposit");
  if (before("permitting") && ahead(j?.surveyDate)) return step("surveyDated", j.surveyDate);
  if (p.stage === "deposit_paid") return step("survey");
  if (before("installed") && ahead(j?.installDate)) return j.permitApproved ? step("install", j.installDate) : step("installPlanned", j.installDate);
  if (p.stage === "survey") return step("permit");
  if (p.stage === "permitting") return step("permitApproval");
  if (p.stage === "install_booked") return step("installBooked");
  if (before("inspected") && ahead(j?.inspectionOn)) return step("inspectionDated", j.inspectionOn);
  if (p.stage === "installed") return step("inspection");
  if (p.stage === "inspected") return step("pto");
  if (p.stage === "live") return step("live", j?.ptoOn ?? null);
  return step("onHold");
}

type StepKey = "payDeposit" | "surveyDated" | "survey" | "install" | "installPlanned" | "permit" | "permitApproval" | "installBooked" | "inspectionDated" | "inspection" | "pto" | "live" | "onHold";

/** Shown on the customer's page under the signed proposal (src/app/p/[token]/page.tsx). */
export async function ProjectPanel({ token }: { token: string }) {
  const p = await findProposalByToken(token);
  if (!p || p.status !== "signed") return null;
  const progress = await getProjectProgress(p.companyId, p.dealId);
  if (!progress) return null;
  const companyName = p.snapshot.company.name;
  const locale = p.locale;
  const t = translator(locale, "page.project");
  // A paused or closed deal shows no stage track.
  const current = STEPS.findIndex((s) => s === progress.stage);
  if (current < 0) {
    return (
      <section className="card p-5" aria-labelledby="project-heading" data-testid="project-panel">
        <h2 id="project-heading" className="text-lg font-semibold">
          {t("heading")}
        </h2>
        <p className="mt-1 text-graphite-soft">{progress.stage === "on_hold" ? t("paused", { company: companyName }) : t("inTouch", { company: companyName })}</p>
      </section>
    );
  }
  const next = nextStep(progress, companyName, locale);
  return (
    <section className="card p-5" aria-labelledby="project-heading" data-testid="project-panel">
      <h2 id="project-heading" className="text-lg font-semibold">
        {t("heading")}
      </h2>
      <div className="mt-3 rounded-md border border-copper/30 bg-copper-light/40 p-4" data-testid="project-next">
        <p className="text-sm text-graphite-soft">{t("next")}</p>
        <p className="text-lg font-semibold">{next.title}</p>
        {next.date ? <p className="figure text-copper-dark">{formatCalendarDate(next.date, "full", locale)}</p> : null}
        <p className="mt-1 text-sm">{next.text}</p>
      </div>
      <ol className="mt-4 space-y-0" aria-label={t("stages")}>
        {STEPS.map((s, i) => {
          const state = i < current ? "done" : i === current ? "current" : "next";
          return (
            <li key={s} className="flex min-h-touch items-center gap-3" aria-current={state === "current" ? "step" : undefined} data-state={state}>
              <span
                aria-hidden
                className={`flex h-7 w-7 shrink-0 items-center justify-center rounded-full border-2 text-xs font-semibold ${
                  state === "done" ? "border-sage bg-sage text-white" : state === "current" ? "border-copper bg-white text-copper" : "border-paper-line bg-white text-graphite-faint"
                }`}
              >
                {state === "done" ? "✓" : i + 1}
              </span>
              <span className={state === "next" ? "text-graphite-soft" : state === "current" ? "font-semibold" : ""}>
                {t(`stage.${s}`)}
                <span className="sr-only">{state === "done" ? t("done") : state === "current" ? t("current") : t("toCome")}</span>
              </span>
            </li>
          );
        })}
      </ol>
    </section>
  );
}
