"use client";
import { zodResolver } from "@hookform/resolvers/zod";
import { useForm } from "react-hook-form";
import { describedBy, Field, FieldShell, SaveRow, SelectField } from "@/components/ui/field";
import { plainError, type FieldLabels } from "@/lib/validation-messages";
import { useSave } from "@/components/ui/use-save";
import type { Stage } from "@/lib/enums";
import { STAGE_LABELS } from "@/lib/stages";
import { longDate } from "../dates";
import { jobFieldsSchema, type JobFields, type JobFieldsInput, type JobFormValues } from "@/lib/schemas/jobs";

/** The install date's help: the buyer's window first, then what the date does to the deal. */
function installHint(firstInstallDay: string | null, waitsForPermit: boolean): string {
  const window = firstInstallDay ? `The buyer's right to cancel ends first: the earliest install day is ${longDate(firstInstallDay)}. ` : "";
  return window + (waitsForPermit ? "Kept; the deal moves to Install booked once the permit is approved." : "With an approved permit, moves the deal to Install booked.");
}

/** The form's labels, for the messages that name a field. */
const JOB_LABELS = {
  crewId: "Crew",
  surveyDate: "Site survey (planned)",
  surveyDoneOn: "Survey done on",
  installDate: "Install",
  permitNumber: "Permit number",
  permitSubmittedOn: "Permit submitted",
  permitApprovedOn: "Permit approved",
  interconnectionNumber: "Application number",
  interconnectionSubmittedOn: "Interconnection submitted",
  interconnectionApprovedOn: "Interconnection approved",
  inspectionOn: "Inspection (planned)",
  inspectionPassedOn: "Inspection passed on",
  ptoOn: "Permission to operate (PTO) received",
  notes: "Notes for the crew",
} satisfies FieldLabels;

type JobFormProps = {
  jobId: string;
  defaults: JobFormValues;
  crews: { id: string; name: string }[];
  /** A cancelled job: shown, never changed. */
  readOnly: boolean;
  /** The day after the buyer's right to cancel ends (null: the sale has no window). */
  firstInstallDay: string | null;
};

/**
 * The office's schedule and records of a job. Planned dates (survey, install, inspection) never
 * move the deal; records of what happened (done, submitted, approved, passed, PTO) do.
 */
export function JobForm({ jobId, defaults, crews, readOnly, firstInstallDay }: JobFormProps) {
  const {
    register,
    handleSubmit,
    setError,
    reset,
    watch,
    formState: { errors, isDirty },
  } = useForm<JobFieldsInput, unknown, JobFields>({ resolver: zodResolver(jobFieldsSchema, { error: plainError(JOB_LABELS) }), defaultValues: defaults });
  const installDate = watch("installDate");
  const permitApprovedOn = watch("permitApprovedOn");

  const { save, invalid, pending, notice } = useSave<JobFields, { moved: { to: string }[] }, JobFieldsInput>({
    request: (json) => ({ url: `/api/jobs/${jobId}`, method: "PATCH", json }),
    setError,
    labels: JOB_LABELS,
    success: (result) => {
      const moved = result.moved.map((m) => STAGE_LABELS[m.to as Stage] ?? m.to);
      return moved.length ? `Saved. The deal moved to ${moved.join(", then ")}.` : "Saved.";
    },
    onSaved: (_, values) => reset(Object.fromEntries(Object.entries(values).map(([k, v]) => [k, v ?? ""])) as JobFormValues),
  });

  const date = (name: keyof JobFormValues & keyof JobFieldsInput, label: string, hint?: string) => (
    <Field id={`job-${name}`} label={label} type="date" hint={hint} error={errors[name]?.message} {...register(name)} />
  );

  return (
    <form onSubmit={handleSubmit(save, invalid)} noValidate className="card p-5" aria-label="Schedule and records">
      <fieldset disabled={readOnly} className="space-y-5">
        <div className="grid gap-4 md:grid-cols-3">
          <SelectField
            id="job-crewId"
            label="Crew"
            options={[{ value: "", label: "No crew yet" }, ...crews.map((c) => ({ value: c.id, label: c.name }))]}
            error={errors.crewId?.message}
            {...register("crewId")}
          />
          {date("surveyDate", "Site survey (planned)", "A plan: it does not move the deal.")}
          {date("surveyDoneOn", "Survey done on", "Moves the deal from Deposit paid to Survey.")}
        </div>
        <div className="grid gap-4 md:grid-cols-3">
          {date("installDate", "Install", installHint(firstInstallDay, !!installDate && !permitApprovedOn))}
        </div>
        <fieldset className="grid gap-4 md:grid-cols-3">
          <legend className="mb-2 text-sm font-semibold">Permit (AHJ)</legend>
          <Field id="job-permitNumber" label="Permit number" autoComplete="off" error={errors.permitNumber?.message} {...register("permitNumber")} />
          {date("permitSubmittedOn", "Submitted", "Moves the deal to Permitting.")}
          {date("permitApprovedOn", "Approved")}
      </fieldset>
      <fieldset className="grid gap-4 md:grid-cols-3">
        <legend className="mb-2 text-sm font-semibold">Utility interconnection</legend>
        <Field id="job-interconnectionNumber" label="Application number" autoComplete="off" error={errors.interconnectionNumber?.message} {...register("interconnectionNumber")} />
        {date("interconnectionSubmittedOn", "Submitted")}
        {date("interconnectionApprovedOn", "Approved")}
      </fieldset>
      <div className="grid gap-4 md:grid-cols-3">
        {date("inspectionOn", "Inspection (planned)", "A plan: it does not move the deal.")}
        {date("inspectionPassedOn", "Inspection passed on", "After the install, moves the deal to Inspected.")}
        {date("ptoOn", "Permission to operate (PTO) received", "After the inspection passed, moves the deal to Live.")}
      </div>
      <FieldShell id="job-notes" label="Notes for the crew" error={errors.notes?.message}>
        <textarea id="job-notes" rows={4} className="field-input py-2" aria-invalid={errors.notes ? true : undefined} aria-describedby={describedBy("job-notes", errors.notes?.message)} {...register("notes")} />
      </FieldShell>
      {readOnly ? null : (
        <SaveRow notice={notice} submit={{ label: "Save job", pending, disabled: !isDirty }} />
      )}
      </fieldset>
    </form>
  );
}
