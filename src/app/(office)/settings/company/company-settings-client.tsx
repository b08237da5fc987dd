"use client";
import { zodResolver } from "@hookform/resolvers/zod";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { Field, FormMessage } from "@/components/field";
import { applyFieldErrors } from "@/lib/form-errors";
import {
  COMPANY_TIME_ZONES,
  companySettingsSchema,
  DEFAULT_STALL_SETTINGS,
  STALL_DAYS_MAX,
  STALL_DAYS_MIN,
  STALL_STAGES,
  type CompanySettingsInput,
  type CompanySettingsValues,
  type CompanyTimeZone,
  type StallDays,
} from "@/lib/schemas/company-settings";
import { STAGE_LABELS } from "@/lib/stages";
import { updateCompanySettingsAction } from "./actions";

type Initial = { name: string; licenseNumber: string; timeZone: CompanyTimeZone; stallDays: StallDays };

const asText = (days: StallDays): Record<string, string> => Object.fromEntries(STALL_STAGES.map((s) => [s, days[s] == null ? "" : String(days[s])]));

export function CompanySettingsClient({ initial }: { initial: Initial }) {
  const router = useRouter();
  const [notice, setNotice] = useState<{ tone: "error" | "success"; text: string } | null>(null);
  const {
    register,
    handleSubmit,
    setValue,
    setError,
    formState: { errors, isSubmitting, isDirty },
    reset,
  } = useForm<CompanySettingsInput, unknown, CompanySettingsValues>({
    resolver: zodResolver(companySettingsSchema),
    defaultValues: { name: initial.name, licenseNumber: initial.licenseNumber, timeZone: initial.timeZone, stallDays: asText(initial.stallDays) },
  });

  const onSubmit = handleSubmit(async (values) => {
    setNotice(null);
    const result = await updateCompanySettingsAction(values);
    if (!result.ok) {
      applyFieldErrors(result.fieldErrors, setError);
      setNotice({ tone: "error", text: result.message });
      return;
    }
    reset({ ...values, licenseNumber: values.licenseNumber ?? "", stallDays: asText(values.stallDays) });
    setNotice({ tone: "success", text: "Company settings saved." });
    router.refresh();
  });

  function applyDefaults() {
    for (const stage of STALL_STAGES) {
      const d = DEFAULT_STALL_SETTINGS[stage];
      setValue(`stallDays.${stage}`, d == null ? "" : String(d), { shouldDirty: true, shouldValidate: true });
    }
  }

  return (
    <form onSubmit={onSubmit} noValidate className="mt-6 max-w-3xl space-y-8" aria-label="Company settings">
      {notice ? <FormMessage tone={notice.tone}>{notice.text}</FormMessage> : null}

      <section aria-labelledby="company-identity" className="card space-y-4 p-5">
        <h2 id="company-identity" className="text-lg font-semibold">
          On proposals
        </h2>
        <Field id="company-name" label="Company name" autoComplete="organization" error={errors.name?.message} {...register("name")} />
        <Field
          id="company-license"
          label="Contractor licence number"
          autoComplete="off"
          hint="Printed on every proposal and its PDF beside the company's name. Leave empty if your state issues none."
          error={errors.licenseNumber?.message}
          {...register("licenseNumber")}
        />
        <div>
          <label htmlFor="company-timezone" className="field-label">
            Time zone
          </label>
          <select
            id="company-timezone"
            className="field-input"
            aria-describedby="company-timezone-hint"
            aria-invalid={errors.timeZone ? true : undefined}
            {...register("timeZone")}
          >
            {COMPANY_TIME_ZONES.map((z) => (
              <option key={z.id} value={z.id}>
                {z.label} ({z.id})
              </option>
            ))}
          </select>
          <p id="company-timezone-hint" className="mt-1 text-sm text-graphite-soft">
            Where your working day starts and ends: the crews&apos; jobs for today and this week follow it.
          </p>
          {errors.timeZone ? <p className="field-error">{errors.timeZone.message}</p> : null}
        </div>
      </section>

      <section aria-labelledby="company-stall" className="card p-5">
        <div className="flex flex-wrap items-baseline justify-between gap-2">
          <h2 id="company-stall" className="text-lg font-semibold">
            Stalled deals
          </h2>
          <button type="button" className="btn-quiet" onClick={applyDefaults}>
            Use the defaults
          </button>
        </div>
        <p className="mt-1 text-sm text-graphite-soft">
          Days a deal may sit in a stage before the Board and Today flag it, from {STALL_DAYS_MIN} to {STALL_DAYS_MAX}. Leave a stage empty to
          never flag it.
        </p>
        <table className="mt-3 w-full text-left text-sm">
          <thead className="text-xs uppercase tracking-wide text-graphite-soft">
            <tr>
              <th scope="col" className="py-1 pr-3">
                Stage
              </th>
              <th scope="col" className="py-1 pr-3">
                Flag after (days)
              </th>
              <th scope="col" className="py-1">
                Default
              </th>
            </tr>
          </thead>
          <tbody className="divide-y divide-paper-line">
            {STALL_STAGES.map((stage) => {
              const error = errors.stallDays?.[stage]?.message;
              const id = `stall-${stage}`;
              return (
                <tr key={stage}>
                  <th scope="row" className="py-1.5 pr-3 font-medium">
                    <label htmlFor={id}>{STAGE_LABELS[stage]}</label>
                  </th>
                  <td className="py-1.5 pr-3">
                    <input
                      id={id}
                      type="text"
                      inputMode="numeric"
                      autoComplete="off"
                      placeholder="never"
                      className="field-input figure w-28"
                      aria-invalid={error ? true : undefined}
                      aria-describedby={error ? `${id}-error` : undefined}
                      {...register(`stallDays.${stage}`)}
                    />
                    {error ? (
                      <p id={`${id}-error`} className="field-error" role="alert">
                        {error}
                      </p>
                    ) : null}
                  </td>
                  <td className="py-1.5 text-graphite-soft">
                    <span className="figure">{DEFAULT_STALL_SETTINGS[stage] ?? "never"}</span>
                  </td>
                </tr>
              );
            })}
          </tbody>
        </table>
      </section>

      <div className="flex gap-2">
        <button type="submit" className="btn-primary" disabled={isSubmitting}>
          {isSubmitting ? "Saving…" : "Save company settings"}
        </button>
        {isDirty ? <span className="self-center text-sm text-graphite-soft">Unsaved changes</span> : null}
      </div>
    </form>
  );
}
