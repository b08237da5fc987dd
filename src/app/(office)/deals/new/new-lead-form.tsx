"use client";
import { zodResolver } from "@hookform/resolvers/zod";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { useForm, type UseFormRegister } from "react-hook-form";
import { Field, FormMessage } from "@/components/ui/field";
import { applyFieldErrors } from "@/lib/form-errors";
import { LEAD_SOURCES, leadSchema, type HouseholdInput, type LeadInput } from "@/lib/schemas/deal";
import { createLeadAction } from "../actions";
import { HouseholdFields } from "../household-fields";

type Site = { name: string; street: string; city: string; region: string; postalCode: string; latitude: number; longitude: number };
type Plan = { id: string; name: string; utilityName: string };

export function NewLeadForm({ plans, sites }: { plans: Plan[]; sites: Site[] }) {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  const {
    register,
    handleSubmit,
    setValue,
    setError: setFieldError,
    formState: { errors, isSubmitting },
  } = useForm<LeadInput>({ resolver: zodResolver(leadSchema), defaultValues: { region: "NC", source: "Referral", ratePlanId: "" } });

  const onSubmit = handleSubmit(async (values) => {
    setError(null);
    const result = await createLeadAction(values);
    if (!result.ok) {
      if (!applyFieldErrors(result.fieldErrors, setFieldError)) setError(result.message);
      return;
    }
    router.push(`/deals/${result.data.dealId}/energy`);
  });

  function pickSite(index: number) {
    const site = sites[index];
    if (!site) return;
    setValue("city", site.city);
    setValue("region", site.region);
    setValue("postalCode", site.postalCode);
    setValue("latitude", site.latitude);
    setValue("longitude", site.longitude);
  }

  return (
    <form onSubmit={onSubmit} noValidate className="card mt-6 space-y-6 p-5">
      {error ? <FormMessage tone="error">{error}</FormMessage> : null}
      <HouseholdFields register={register as unknown as UseFormRegister<HouseholdInput>} errors={errors} />
      {sites.length > 0 ? (
        <div>
          <label htmlFor="recent-site" className="field-label">
            Or start from a recent site nearby (fills city, ZIP and coordinates)
          </label>
          <select id="recent-site" className="field-input max-w-md" defaultValue="" onChange={(e) => pickSite(Number(e.target.value))}>
            <option value="" disabled>
              Pick a recent site…
            </option>
            {sites.map((s, i) => (
              <option key={`${s.street}-${i}`} value={i}>
                {s.street}, {s.city} ({s.latitude.toFixed(3)}, {s.longitude.toFixed(3)})
              </option>
            ))}
          </select>
        </div>
      ) : null}
      <fieldset className="grid gap-4 sm:grid-cols-3">
        <legend className="mb-2 text-sm font-semibold uppercase tracking-wide text-graphite-soft">Utility and lead</legend>
        <Field id="utilityName" label="Utility" error={errors.utilityName?.message} {...register("utilityName")} />
        <div>
          <label htmlFor="ratePlanId" className="field-label">
            Rate plan
          </label>
          <select id="ratePlanId" className="field-input" {...register("ratePlanId")}>
            <option value="">Not known yet</option>
            {plans.map((p) => (
              <option key={p.id} value={p.id}>
                {p.utilityName} — {p.name}
              </option>
            ))}
          </select>
          {errors.ratePlanId ? <p className="field-error">{errors.ratePlanId.message}</p> : null}
        </div>
        <div>
          <label htmlFor="source" className="field-label">
            Lead source
          </label>
          <select id="source" className="field-input" {...register("source")}>
            {LEAD_SOURCES.map((s) => (
              <option key={s} value={s}>
                {s}
              </option>
            ))}
          </select>
        </div>
      </fieldset>
      <button type="submit" className="btn-primary" disabled={isSubmitting}>
        {isSubmitting ? "Saving…" : "Create lead and add bills"}
      </button>
    </form>
  );
}
