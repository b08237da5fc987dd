"use client";
import { zodResolver } from "@hookform/resolvers/zod";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { Field, FormMessage } from "@/components/ui/field";
import { applyFieldErrors } from "@/lib/form-errors";
import {
  COMPANY_TIME_ZONES,
  companySettingsSchema,
  DEFAULT_FINANCE,
  DEFAULT_STALL_SETTINGS,
  FINANCE_KEYS,
  FINANCE_LIMITS,
  STALL_DAYS_MAX,
  STALL_DAYS_MIN,
  STALL_STAGES,
  type CompanySettingsInput,
  type CompanySettingsValues,
  type CompanyTimeZone,
  type FinanceAssumptions,
  type StallDays,
} from "@/lib/schemas/company-settings";
import { STAGE_LABELS } from "@/lib/stages";
import { updateCompanySettingsAction } from "./actions";

type Initial = { name: string; licenseNumber: string; timeZone: CompanyTimeZone; stallDays: StallDays; finance: FinanceAssumptions };

const asText = (days: StallDays): Record<string, string> => Object.fromEntries(STALL_STAGES.map((s) => [s, days[s] == null ? "" : String(days[s])]));
const financeText = (f: FinanceAssumptions) => Object.fromEntries(FINANCE_KEYS.map((k) => [k, String(f[k])])) as Record<keyof FinanceAssumptions, string>;

/** The savings assumptions as the form shows them, with where each default comes from. */
const FINANCE_ROWS: { key: keyof FinanceAssumptions; label: string; hint: string }[] = [
  { key: "years", label: "Years the savings run", hint: "The cash-flow table, payback, ROI and lifetime savings stop here. Common practice: the module warranty's term." },
  { key: "degradationPctPerYear", label: "Module output falls (%/yr)", hint: "Default: Jordan & Kurtz (2013), the median of field studies. Use the module's warranty figure if you quote it." },
  { key: "utilityEscalationPctPerYear", label: "Utility prices rise (%/yr)", hint: "Applied to the whole bill, with and without solar. Our default; look at your utility's recent rate cases." },
  { key: "discountRatePct", label: "Discount rate for NPV (%)", hint: "How much less a dollar later is worth than a dollar now, for the NPV and LCOE. Our default." },
];

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
    defaultValues: {
      name: initial.name,
      licenseNumber: initial.licenseNumber,
      timeZone: initial.timeZone,
      stallDays: asText(initial.stallDays),
      finance: financeText(initial.finance),
    },
  });

  const onSubmit = handleSubmit(async (values) => {
    setNotice(null);
    const result = await updateCompanySettingsAction(values);
    if (!result.ok) {
      applyFieldErrors(result.fieldErrors, setError);
      setNotice({ tone: "error", text: result.message });
      return;
    }
    reset({ ...values, licenseNumber: values.licenseNumber ?? "", stallDays: asText(values.stallDays), finance: values.finance ? financeText(values.finance) : undefined });
    setNotice({ tone: "success", text: "Company settings saved." });
    router.refresh();
  });

  function applyDefaults() {
    for (const stage of STALL_STAGES) {
      const d = DEFAULT_STALL_SETTINGS[stage];
      setValue(`stallDays.${stage}`, d == null ? "" : String(d), { shouldDirty: true, shouldValidate: true });
    }
  }

  function applyFinanceDefaults() {
    for (const k of FINANCE_KEYS) setValue(`finance.${k}`, String(DEFAULT_FINANCE[k]), { shouldDirty: true, shouldValidate: true });
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

      <section aria-labelledby="company-finance" className="card p-5">
        <div className="flex flex-wrap items-baseline justify-between gap-2">
          <h2 id="company-finance" className="text-lg font-semibold">
            Savings assumptions
          </h2>
          <button type="button" className="btn-quiet" onClick={applyFinanceDefaults} aria-label="Use the default savings assumptions">
            Use the defaults
          </button>
        </div>
        <p className="mt-1 text-sm text-graphite-soft">
          Every new offer&apos;s savings, payback, ROI and NPV are figured with these, and the customer&apos;s page and proposal PDF state them.
          They are assumptions, not forecasts. Proposals already sent keep the figures they were made with; re-save an offer to figure it again.
        </p>
        <div className="mt-3 grid gap-4 sm:grid-cols-2">
          {FINANCE_ROWS.map((row) => {
            const l = FINANCE_LIMITS[row.key];
            return (
              <Field
                key={row.key}
                id={`finance-${row.key}`}
                label={row.label}
                inputMode="decimal"
                autoComplete="off"
                hint={`${row.hint} Default ${DEFAULT_FINANCE[row.key]}; from ${l.min} to ${l.max}.`}
                error={errors.finance?.[row.key]?.message}
                {...register(`finance.${row.key}`)}
              />
            );
          })}
        </div>
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
