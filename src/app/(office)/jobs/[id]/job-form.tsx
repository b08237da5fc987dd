"use client";
import { zodResolver } from "@hookform/resolvers/zod";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { Field, FormMessage } from "@/components/ui/field";
import { api, ApiError } from "@/lib/api-client";
import { applyFieldErrors } from "@/lib/form-errors";
import { jobFieldsSchema, type JobFields, type JobFieldsInput, type JobFormValues } from "@/lib/schemas/jobs";

const STAGE_NAMES: Record<string, string> = {
  survey: "Survey",
  permitting: "Permitting",
  install_booked: "Install booked",
  installed: "Installed",
  inspected: "Inspected",
  live: "Live (PTO)",
};

/** The office's schedule and records of a job. Each saved date may move the deal by itself. */
export function JobForm({ jobId, defaults, crews }: { jobId: string; defaults: JobFormValues; crews: { id: string; name: string }[] }) {
  const router = useRouter();
  const [notice, setNotice] = useState<{ tone: "error" | "success"; text: string } | null>(null);
  const {
    register,
    handleSubmit,
    setError,
    reset,
    watch,
    formState: { errors, isSubmitting, isDirty },
  } = useForm<JobFieldsInput, unknown, JobFields>({ resolver: zodResolver(jobFieldsSchema), defaultValues: defaults });
  const installDate = watch("installDate");
  const permitApprovedOn = watch("permitApprovedOn");

  const onSubmit = handleSubmit(async (values) => {
    setNotice(null);
    try {
      const result = await api<{ moved: { to: string }[] }>(`/api/jobs/${jobId}`, { method: "PATCH", json: values });
      const formValues = Object.fromEntries(Object.entries(values).map(([k, v]) => [k, v ?? ""])) as JobFormValues;
      reset(formValues);
      const moved = result.moved.map((m) => STAGE_NAMES[m.to] ?? m.to);
      setNotice({ tone: "success", text: moved.length ? `Saved. The deal moved to ${moved.join(", then ")}.` : "Saved." });
      router.refresh();
    } catch (err) {
      if (err instanceof ApiError && applyFieldErrors(err.fields, setError)) return;
      setNotice({ tone: "error", text: err instanceof ApiError ? err.message : "Not saved. Try again." });
    }
  });

  const date = (name: keyof JobFormValues & keyof JobFieldsInput, label: string, hint?: string) => (
    <Field id={`job-${name}`} label={label} type="date" hint={hint} error={errors[name]?.message} {...register(name)} />
  );

  return (
    <form onSubmit={onSubmit} noValidate className="card space-y-5 p-5" aria-label="Schedule and records">
      {notice ? <FormMessage tone={notice.tone}>{notice.text}</FormMessage> : null}
      <div className="grid gap-4 md:grid-cols-3">
        <div>
          <label htmlFor="job-crewId" className="field-label">
            Crew
          </label>
          <select id="job-crewId" className="field-input" aria-invalid={errors.crewId ? true : undefined} {...register("crewId")}>
            <option value="">No crew yet</option>
            {crews.map((c) => (
              <option key={c.id} value={c.id}>
                {c.name}
              </option>
            ))}
          </select>
          {errors.crewId ? <p className="field-error">{errors.crewId.message}</p> : null}
        </div>
        {date("surveyDate", "Site survey", "Setting it moves a deal from Deposit paid to Survey.")}
        {date(
          "installDate",
          "Install",
          installDate && !permitApprovedOn ? "Kept; the deal moves to Install booked once the permit is approved." : "With an approved permit, moves the deal to Install booked.",
        )}
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
        {date("inspectionOn", "Inspection", "After the install, moves the deal to Inspected.")}
        {date("ptoOn", "Permission to operate (PTO)", "After the inspection, moves the deal to Live.")}
      </div>
      <div>
        <label htmlFor="job-notes" className="field-label">
          Notes for the crew
        </label>
        <textarea id="job-notes" rows={4} className="field-input py-2" aria-invalid={errors.notes ? true : undefined} {...register("notes")} />
        {errors.notes ? <p className="field-error">{errors.notes.message}</p> : null}
      </div>
      <button type="submit" className="btn-primary" disabled={isSubmitting || !isDirty}>
        {isSubmitting ? "Saving…" : "Save job"}
      </button>
    </form>
  );
}
