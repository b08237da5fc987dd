"use client";
import { zodResolver } from "@hookform/resolvers/zod";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { FormMessage } from "@/components/ui/field";
import { applyFieldErrors } from "@/lib/form-errors";
import { householdSchema, type HouseholdInput } from "@/lib/schemas/deal";
import { updateHouseholdAction } from "../actions";
import { HouseholdFields } from "../household-fields";

export function HouseholdForm({ dealId, defaults, readOnly }: { dealId: string; defaults: HouseholdInput; readOnly: boolean }) {
  const [notice, setNotice] = useState<{ tone: "error" | "success"; text: string } | null>(null);
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors, isSubmitting, isDirty },
    reset,
  } = useForm<HouseholdInput>({ resolver: zodResolver(householdSchema), defaultValues: defaults });

  const onSubmit = handleSubmit(async (values) => {
    setNotice(null);
    const result = await updateHouseholdAction({ dealId, household: values });
    if (!result.ok) {
      const mapped: Record<string, string[]> = {};
      for (const [k, v] of Object.entries(result.fieldErrors ?? {})) mapped[k.replace(/^household\./, "")] = v;
      if (!applyFieldErrors(mapped, setError)) setNotice({ tone: "error", text: result.message });
      return;
    }
    reset(values);
    setNotice({ tone: "success", text: "Saved." });
  });

  return (
    <form onSubmit={onSubmit} noValidate className="card space-y-6 p-5">
      {notice ? <FormMessage tone={notice.tone}>{notice.text}</FormMessage> : null}
      <fieldset disabled={readOnly} className="space-y-6">
        <HouseholdFields register={register} errors={errors} />
      </fieldset>
      {readOnly ? null : (
        <button type="submit" className="btn-primary" disabled={isSubmitting || !isDirty}>
          {isSubmitting ? "Saving…" : "Save household"}
        </button>
      )}
    </form>
  );
}
