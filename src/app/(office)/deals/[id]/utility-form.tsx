"use client";
import { useState } from "react";
import { SaveRow } from "@/components/ui/field";
import { useSave } from "@/components/ui/use-save";
import { HOUSEHOLD_LABELS as UTILITY_LABELS, UtilityPlanSelects, type UtilityChoices, type UtilityPick } from "../household-fields";

type Utility = UtilityPick;

/** The deal's utility and rate plan: the plan prices every bill before and after solar. */
export function UtilityForm(props: Utility & { dealId: string; choices: UtilityChoices; readOnly: boolean }) {
  const [utility, setUtility] = useState<Utility>({ utilityId: props.utilityId, ratePlanId: props.ratePlanId });
  const [errors, setErrors] = useState<Record<string, string[]>>({});
  const save = useSave<Utility>({
    request: (json) => ({ url: `/api/deals/${props.dealId}/utility`, method: "PUT", json }),
    labels: UTILITY_LABELS,
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
      <fieldset disabled={props.readOnly || save.pending} className="space-y-3">
        <UtilityPlanSelects choices={props.choices} value={utility} onChange={setUtility} errors={{ utilityId: errors.utilityId?.[0], ratePlanId: errors.ratePlanId?.[0] }} />
      </fieldset>
      {props.readOnly ? null : <SaveRow notice={save.notice} submit={{ label: "Save utility and plan", pending: save.pending, quiet: true }} />}
    </form>
  );
}
