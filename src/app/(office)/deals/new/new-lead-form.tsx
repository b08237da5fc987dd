"use client";
import { zodResolver } from "@hookform/resolvers/zod";
import { useRouter } from "next/navigation";
import { useForm, type UseFormReturn } from "react-hook-form";
import { SaveRow, SelectField } from "@/components/ui/field";
import { useSave } from "@/components/ui/use-save";
import { LEAD_SOURCES, leadSchema, type HouseholdInput, type LeadInput } from "@/lib/schemas/deal";
import { plainError } from "@/lib/validation-messages";
import { HOUSEHOLD_LABELS, HouseholdFields, UtilityPlanSelects, type UtilityChoices } from "../household-fields";

type Site = { name: string; street: string; city: string; region: string; postalCode: string; latitude: number; longitude: number };

const SOURCE_OPTIONS = LEAD_SOURCES.map((s) => ({ value: s, label: s }));

const LEAD_LABELS = { ...HOUSEHOLD_LABELS, source: "Lead source" };

export function NewLeadForm({ choices, sites }: { choices: UtilityChoices; sites: Site[] }) {
  const router = useRouter();
  const form = useForm<LeadInput>({ resolver: zodResolver(leadSchema, { error: plainError(LEAD_LABELS) }), defaultValues: { region: "NC", source: "Referral", utilityId: "", ratePlanId: "", language: "en" } });
  const { register, setValue, formState, watch } = form;
  const errors = formState.errors;
  const save = useSave<LeadInput, { dealId: string }, LeadInput>({
    request: (json) => ({ url: "/api/deals", method: "POST", json }),
    setError: form.setError,
    labels: LEAD_LABELS,
    refresh: false,
    onSaved: ({ dealId }) => router.push(`/deals/${dealId}/energy`),
  });

  function pickSite(index: number) {
    const site = sites[index];
    if (!site) return;
    for (const key of ["city", "region", "postalCode", "latitude", "longitude"] as const) setValue(key, site[key]);
  }

  return (
    <form onSubmit={form.handleSubmit(save.saveAndWait, save.invalid)} noValidate className="card mt-6 space-y-6 p-5">
      <HouseholdFields form={form as unknown as UseFormReturn<HouseholdInput>} />
      {sites.length > 0 ? (
        <SelectField
          id="recent-site"
          label="Or start from a recent site nearby (fills city, ZIP and coordinates)"
          selectClassName="max-w-md"
          defaultValue=""
          onChange={(e) => e.target.value !== "" && pickSite(Number(e.target.value))}
          options={[
            { value: "", label: "Pick a recent site…" },
            ...sites.map((s, i) => ({ value: String(i), label: `${s.street}, ${s.city} (${s.latitude.toFixed(3)}, ${s.longitude.toFixed(3)})` })),
          ]}
        />
      ) : null}
      <fieldset className="grid gap-4 sm:grid-cols-3">
        <legend className="mb-2 text-sm font-semibold uppercase tracking-wide text-graphite-soft">Utility and lead</legend>
        <UtilityPlanSelects
          choices={choices}
          value={{ utilityId: watch("utilityId") ?? "", ratePlanId: watch("ratePlanId") ?? "" }}
          onChange={(next) => {
            setValue("utilityId", next.utilityId);
            setValue("ratePlanId", next.ratePlanId);
          }}
          errors={{ utilityId: errors.utilityId?.message, ratePlanId: errors.ratePlanId?.message }}
        />
        <SelectField id="source" label="Lead source" options={SOURCE_OPTIONS} {...register("source")} />
      </fieldset>
      <SaveRow notice={save.notice} submit={{ label: "Create lead and add bills", pending: formState.isSubmitting }} />
    </form>
  );
}
