"use client";
import { zodResolver } from "@hookform/resolvers/zod";
import type { ReactNode } from "react";
import { useForm, type FieldErrors, type UseFormRegister } from "react-hook-form";
import { Field, FieldShell, SaveRow, SelectField } from "@/components/ui/field";
import { useSave } from "@/components/ui/use-save";
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
import { plainError, type FieldLabels } from "@/lib/validation-messages";

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

/** The form's labels, for the messages that name a field. */
const COMPANY_LABELS: FieldLabels = {
  name: "Company name",
  licenseNumber: "Contractor licence number",
  timeZone: "Time zone",
  ...Object.fromEntries(STALL_STAGES.map((s) => [`stallDays.${s}`, `${STAGE_LABELS[s]}: flag after (days)`])),
  ...Object.fromEntries(FINANCE_ROWS.map((r) => [`finance.${r.key}`, r.label])),
};

/** What a part of the form needs from it: its fields' registration and their errors. */
type FormParts = { register: UseFormRegister<CompanySettingsInput>; errors: FieldErrors<CompanySettingsInput> };

export function CompanySettingsClient({ companyId, initial }: { companyId: string; initial: Initial }) {
  const {
    register,
    handleSubmit,
    setValue,
    setError,
    formState: { errors, isDirty },
    reset,
  } = useForm<CompanySettingsInput, unknown, CompanySettingsValues>({
    resolver: zodResolver(companySettingsSchema, { error: plainError(COMPANY_LABELS) }),
    defaultValues: {
      name: initial.name,
      licenseNumber: initial.licenseNumber,
      timeZone: initial.timeZone,
      stallDays: asText(initial.stallDays),
      finance: financeText(initial.finance),
    },
  });

  const { save, invalid, pending, notice } = useSave<CompanySettingsValues, unknown, CompanySettingsInput>({
    request: (json) => ({ url: `/api/companies/${companyId}`, method: "PATCH", json }),
    success: "Company settings saved.",
    setError,
    labels: COMPANY_LABELS,
    onSaved: (_, values) =>
      reset({ ...values, licenseNumber: values.licenseNumber ?? "", stallDays: asText(values.stallDays), finance: values.finance ? financeText(values.finance) : undefined }),
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
    <form onSubmit={handleSubmit(save, invalid)} noValidate className="mt-6 max-w-3xl space-y-8" aria-label="Company settings">

      <IdentitySection register={register} errors={errors} />

      <SettingsSection
        id="company-stall"
        title="Stalled deals"
        defaultsLabel="Use the defaults"
        onDefaults={applyDefaults}
        intro={`Days a deal may sit in a stage before the Board and Today flag it, from ${STALL_DAYS_MIN} to ${STALL_DAYS_MAX}. Leave a stage empty to never flag it.`}
      >
        <StallTable register={register} errors={errors} />
      </SettingsSection>

      <SettingsSection
        id="company-finance"
        title="Savings assumptions"
        defaultsLabel="Use the defaults for the savings assumptions"
        onDefaults={applyFinanceDefaults}
        intro="Every new offer's savings, payback, ROI and NPV are figured with these, and the customer's page and proposal PDF state them. They are assumptions, not forecasts. Proposals already sent keep the figures they were made with; re-save an offer to figure it again."
      >
        <FinanceFields register={register} errors={errors} />
      </SettingsSection>

      <SaveRow notice={notice}>
        <button type="submit" className="btn-primary" disabled={pending}>
          {pending ? "Saving…" : "Save company settings"}
        </button>
        {isDirty ? <span className="text-sm text-graphite-soft">Unsaved changes</span> : null}
      </SaveRow>
    </form>
  );
}

/** A card of the settings form with a button that fills in the defaults. */
function SettingsSection(props: { id: string; title: string; defaultsLabel: string; onDefaults: () => void; intro: string; children: ReactNode }) {
  return (
    <section aria-labelledby={props.id} className="card p-5">
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h2 id={props.id} className="text-lg font-semibold">
          {props.title}
        </h2>
        {/* A longer name starts with the visible words (WCAG 2.5.3 Label in Name). */}
        <button type="button" className="btn-quiet" onClick={props.onDefaults} aria-label={props.defaultsLabel === "Use the defaults" ? undefined : props.defaultsLabel}>
          Use the defaults
        </button>
      </div>
      <p className="mt-1 text-sm text-graphite-soft">{props.intro}</p>
      {props.children}
    </section>
  );
}

/** The company's name, licence number and time zone. */
function IdentitySection({ register, errors }: FormParts) {
  return (
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
      <SelectField
        id="company-timezone"
        label="Time zone"
        options={COMPANY_TIME_ZONES.map((z) => ({ value: z.id, label: `${z.label} (${z.id})` }))}
        hint="Where your working day starts and ends: the crews' jobs for today and this week follow it."
        error={errors.timeZone?.message}
        {...register("timeZone")}
      />
    </section>
  );
}

/** One row a stage: the days before a deal in it is flagged, beside the default. */
function StallTable({ register, errors }: FormParts) {
  return (
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
                {STAGE_LABELS[stage]}
              </th>
              <td className="py-1.5 pr-3">
                <Field
                  id={id}
                  label={STAGE_LABELS[stage]}
                  srLabel
                  type="text"
                  inputMode="numeric"
                  autoComplete="off"
                  placeholder="never"
                  inputClassName="figure w-28"
                  error={error}
                  {...register(`stallDays.${stage}`)}
                />
              </td>
              <td className="py-1.5 text-graphite-soft">
                <span className="figure">{DEFAULT_STALL_SETTINGS[stage] ?? "never"}</span>
              </td>
            </tr>
          );
        })}
      </tbody>
    </table>
  );
}

function FinanceFields({ register, errors }: FormParts) {
  return (
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
  );
}
