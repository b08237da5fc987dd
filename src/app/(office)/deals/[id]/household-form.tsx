"use client";
import { zodResolver } from "@hookform/resolvers/zod";
import { useForm } from "react-hook-form";
import { SaveRow } from "@/components/ui/field";
import { useSave } from "@/components/ui/use-save";
import { householdSchema, type HouseholdInput } from "@/lib/schemas/deal";
import { plainError } from "@/lib/validation-messages";
import { HOUSEHOLD_LABELS, HouseholdFields } from "../household-fields";

export function HouseholdForm({ dealId, defaults, readOnly }: { dealId: string; defaults: HouseholdInput; readOnly: boolean }) {
  const form = useForm<HouseholdInput>({ resolver: zodResolver(householdSchema, { error: plainError(HOUSEHOLD_LABELS) }), defaultValues: defaults });
  const save = useSave<HouseholdInput, { dealId: string }, HouseholdInput>({
    request: (json) => ({ url: `/api/deals/${dealId}/household`, method: "PUT", json }),
    setError: form.setError,
    labels: HOUSEHOLD_LABELS,
    success: "Saved.",
    onSaved: (_data, values) => form.reset(values),
  });
  const { isSubmitting, isDirty } = form.formState;

  return (
    <form onSubmit={form.handleSubmit(save.saveAndWait, save.invalid)} noValidate className="card space-y-6 p-5">
      <fieldset disabled={readOnly} className="space-y-6">
        <HouseholdFields form={form} />
      </fieldset>
      {readOnly ? null : (
        <SaveRow notice={save.notice} submit={{ label: "Save household", pending: isSubmitting, disabled: !isDirty }} />
      )}
    </form>
  );
}
