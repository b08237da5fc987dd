"use client";
import { useRouter } from "next/navigation";
import { useState, useTransition } from "react";
import { FormMessage } from "@/components/ui/field";
import { updateDealUtilityAction } from "../actions";

type Plan = { id: string; name: string; utilityName: string };

/** The deal's utility and rate plan: the plan prices every bill before and after solar. */
export function UtilityForm(props: { dealId: string; utilityName: string; ratePlanId: string; plans: Plan[]; readOnly: boolean }) {
  const router = useRouter();
  const [utilityName, setUtilityName] = useState(props.utilityName);
  const [ratePlanId, setRatePlanId] = useState(props.ratePlanId);
  const [notice, setNotice] = useState<{ tone: "error" | "success"; text: string } | null>(null);
  const [pending, start] = useTransition();

  return (
    <form
      className="mt-4 space-y-3"
      onSubmit={(e) => {
        e.preventDefault();
        start(async () => {
          const result = await updateDealUtilityAction({ dealId: props.dealId, utility: { utilityName, ratePlanId } });
          setNotice(result.ok ? { tone: "success", text: "Saved." } : { tone: "error", text: result.message });
          if (result.ok) router.refresh();
        });
      }}
    >
      {notice ? <FormMessage tone={notice.tone}>{notice.text}</FormMessage> : null}
      <fieldset disabled={props.readOnly || pending} className="space-y-3">
        <div>
          <label htmlFor="deal-utility" className="field-label">
            Utility
          </label>
          <input id="deal-utility" className="field-input" value={utilityName} onChange={(e) => setUtilityName(e.target.value)} />
        </div>
        <div>
          <label htmlFor="deal-rate-plan" className="field-label">
            Rate plan
          </label>
          <select id="deal-rate-plan" className="field-input" value={ratePlanId} onChange={(e) => setRatePlanId(e.target.value)}>
            <option value="">Not known yet</option>
            {props.plans.map((p) => (
              <option key={p.id} value={p.id}>
                {p.utilityName} — {p.name}
              </option>
            ))}
          </select>
        </div>
      </fieldset>
      {props.readOnly ? null : (
        <button type="submit" className="btn-quiet" disabled={pending}>
          {pending ? "Saving…" : "Save utility and plan"}
        </button>
      )}
    </form>
  );
}
