"use client";
import { zodResolver } from "@hookform/resolvers/zod";
import { useForm } from "react-hook-form";
import { StatusMessage } from "@/components/ui/field";
import { useSave } from "@/components/ui/use-save";
import { householdSchema, type HouseholdInput } from "@/lib/schemas/deal";
import { HouseholdFields } from "../household-fields";

export function HouseholdForm({ dealId, defaults, readOnly }: { dealId: string; defaults: HouseholdInput; readOnly: boolean }) {
  const form = useForm<HouseholdInput>({ resolver: zodResolver(householdSchema), defaultValues: defaults });
  const save = useSave<HouseholdInput, { dealId: string }, HouseholdInput>({
    request: (json) => ({ url: `/api/deals/${dealId}/household`, method: "PUT", json }),
    setError: form.setError,
    success: "Saved.",
    onSaved: (_data, values) => form.reset(values),
  });
  const { isSubmitting, isDirty } = form.formState;

  return (
    <form onSubmit={form.handleSubmit(save.saveAndWait)} noValidate className="card space-y-6 p-5">
      <StatusMessage notice={save.notice} />
      <fieldset disabled={readOnly} className="space-y-6">
        <HouseholdFields form={form} />
      </fieldset>
      {readOnly ? null : (
        <button type="submit" className="btn-primary" disabled={isSubmitting || !isDirty}>
          {isSubmitting ? "Saving…" : "Save household"}
        </button>
      )}
    </form>
  );
}
