"use client";
import { useState } from "react";
import { Field, SelectField, StatusMessage } from "@/components/ui/field";
import { useSave } from "@/components/ui/use-save";
import { ratePlanOptions, type RatePlanOption } from "../household-fields";

type Utility = { utilityName: string; ratePlanId: string };

/** The deal's utility and rate plan: the plan prices every bill before and after solar. */
export function UtilityForm(props: Utility & { dealId: string; plans: RatePlanOption[]; readOnly: boolean }) {
  const [utility, setUtility] = useState<Utility>({ utilityName: props.utilityName, ratePlanId: props.ratePlanId });
  const [errors, setErrors] = useState<Record<string, string[]>>({});
  const save = useSave<Utility>({
    request: (json) => ({ url: `/api/deals/${props.dealId}/utility`, method: "PUT", json }),
    success: "Saved.",
    onFieldErrors: setErrors,
    onSaved: () => setErrors({}),
  });

  return (
    <form
      className="mt-4 space-y-3"
      onSubmit={(e) => {
        e.preventDefault();
        save.save(utility);
      }}
    >
      <StatusMessage notice={save.notice} />
      <fieldset disabled={props.readOnly || save.pending} className="space-y-3">
        <Field id="deal-utility" label="Utility" error={errors.utilityName?.[0]} value={utility.utilityName} onChange={(e) => setUtility({ ...utility, utilityName: e.target.value })} />
        <SelectField
          id="deal-rate-plan"
          label="Rate plan"
          error={errors.ratePlanId?.[0]}
          options={ratePlanOptions(props.plans)}
          value={utility.ratePlanId}
          onChange={(e) => setUtility({ ...utility, ratePlanId: e.target.value })}
        />
      </fieldset>
      {props.readOnly ? null : (
        <button type="submit" className="btn-quiet" disabled={save.pending}>
          {save.pending ? "Saving…" : "Save utility and plan"}
        </button>
      )}
    </form>
  );
}
