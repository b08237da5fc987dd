"use client";
import { useState } from "react";
import { StatusMessage } from "@/components/ui/field";
import { useSave } from "@/components/ui/use-save";
import { UtilityPlanSelects, type UtilityChoices, type UtilityPick } from "../household-fields";

type Utility = UtilityPick;

/** The deal's utility and rate plan: the plan prices every bill before and after solar. */
export function UtilityForm(props: Utility & { dealId: string; choices: UtilityChoices; readOnly: boolean }) {
  const [utility, setUtility] = useState<Utility>({ utilityId: props.utilityId, ratePlanId: props.ratePlanId });
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
        <UtilityPlanSelects choices={props.choices} value={utility} onChange={setUtility} errors={{ utilityId: errors.utilityId?.[0], ratePlanId: errors.ratePlanId?.[0] }} />
      </fieldset>
      {props.readOnly ? null : (
        <button type="submit" className="btn-quiet" disabled={save.pending}>
          {save.pending ? "Saving…" : "Save utility and plan"}
        </button>
      )}
    </form>
  );
}
