"use client";
import { useId, useState, type FormEvent } from "react";
import { Field, optionsOf, SelectField } from "@/components/ui/field";
import { useSave } from "@/components/ui/use-save";
import type { Stage } from "@/lib/enums";
import { BULK_MAX_DEALS, type BulkAnswer, type DealBulkInput } from "@/lib/schemas/deal-table";
import { PIPELINE, SIDE_STAGES } from "@/lib/stage-rules";
import { STAGE_LABELS } from "@/lib/stages";

/** Stages that happen by themselves (e-sign, Stripe, the customer's cancellation) are not offered. */
const AUTOMATIC: readonly Stage[] = ["signed", "deposit_paid", "cancelled"];
const TARGETS = [...PIPELINE, ...SIDE_STAGES].filter((s) => !AUTOMATIC.includes(s));
const PICK = { value: "", label: "Pick…" };

type Mode = "move" | "reassign" | null;

/**
 * Actions on the selected deals: move them to a stage (with a reason when the rules ask for
 * one) or, for the office, hand them to another rep. The server applies the same rules as to
 * one deal at a time and answers per deal; refusals are listed with their reason.
 */
export function BulkBar({
  selectedIds,
  office,
  owners,
  onClear,
  onDone,
}: {
  selectedIds: string[];
  office: boolean;
  owners: Array<{ id: string; name: string }>;
  onClear: () => void;
  onDone: (answer: BulkAnswer) => void;
}) {
  const ids = useId();
  const [mode, setMode] = useState<Mode>(null);
  const [stage, setStage] = useState<Stage | "">("");
  const [reason, setReason] = useState("");
  const [ownerId, setOwnerId] = useState("");
  const [answer, setAnswer] = useState<(BulkAnswer & { kind: "move" | "reassign" }) | null>(null);
  const [error, setError] = useState<string | null>(null);
  const count = selectedIds.length;
  const tooMany = count > BULK_MAX_DEALS;

  // The table reads through useQuery: onDone invalidates it (no page refresh).
  const run = useSave<DealBulkInput, BulkAnswer>({
    request: (json) => ({ url: "/api/deals/bulk", method: "POST", json }),
    refresh: false,
    notify: (n) => setError(n?.tone === "error" ? n.text : null),
    onSaved: (result, input) => {
      setAnswer({ ...result, kind: input.action.kind });
      setMode(null);
      setReason("");
      onDone(result);
    },
  });

  function submit(e: FormEvent) {
    e.preventDefault();
    setError(null);
    setAnswer(null);
    if (mode === "move") {
      if (!stage) return setError("Pick the stage to move the deals to.");
      run.save({ dealIds: selectedIds, action: { kind: "move", to: stage, reason: reason.trim() || null } });
    } else if (mode === "reassign") {
      if (!ownerId) return setError("Pick the rep who takes the deals over.");
      run.save({ dealIds: selectedIds, action: { kind: "reassign", ownerUserId: ownerId } });
    }
  }

  const plural = (n: number) => `${n} deal${n === 1 ? "" : "s"}`;
  const refused = answer?.results.filter((r) => r.outcome === "refused") ?? [];
  const unchanged = answer?.results.filter((r) => r.outcome === "unchanged") ?? [];

  return (
    <div className="mt-3 space-y-2">
      {count > 0 ? (
        <section aria-label="Selected deals" className="card flex flex-wrap items-end gap-3 border-copper/40 p-3">
          <p className="self-center text-sm font-medium" aria-live="polite">
            <span className="figure">{count}</span> selected
          </p>
          {tooMany ? (
            <p role="alert" className="self-center text-sm text-danger">
              Select at most {BULK_MAX_DEALS} deals for one action.
            </p>
          ) : null}
          {mode === null ? (
            <>
              <button type="button" className="btn-quiet" disabled={tooMany} onClick={() => setMode("move")}>
                Move to stage…
              </button>
              {office ? (
                <button type="button" className="btn-quiet" disabled={tooMany} onClick={() => setMode("reassign")}>
                  Reassign to rep…
                </button>
              ) : null}
              <button type="button" className="btn-quiet" onClick={onClear}>
                Clear selection
              </button>
            </>
          ) : (
            <form onSubmit={submit} className="flex flex-1 flex-wrap items-end gap-3" aria-label={mode === "move" ? "Move the selected deals" : "Reassign the selected deals"}>
              {mode === "move" ? (
                <>
                  <SelectField id={`${ids}-to`} label="Move the selected deals to" value={stage} onChange={(e) => setStage(e.target.value as Stage | "")} options={[PICK, ...optionsOf(TARGETS, STAGE_LABELS)]} />
                  <Field
                    id={`${ids}-reason`}
                    className="min-w-64 flex-1"
                    label="Reason (for the Timeline; needed for Lost, On hold, moving back, and booking an install without a permit date)"
                    value={reason}
                    maxLength={300}
                    onChange={(e) => setReason(e.target.value)}
                  />
                </>
              ) : (
                <SelectField id={`${ids}-rep`} label="Reassign to" value={ownerId} onChange={(e) => setOwnerId(e.target.value)} options={[PICK, ...owners.map((o) => ({ value: o.id, label: o.name }))]} />
              )}
              <button type="submit" className="btn-primary" disabled={run.pending || tooMany}>
                {run.pending ? "Working…" : `${mode === "move" ? "Move" : "Reassign"} ${plural(count)}`}
              </button>
              <button
                type="button"
                className="btn-quiet"
                onClick={() => {
                  setMode(null);
                  setError(null);
                }}
              >
                Cancel
              </button>
            </form>
          )}
          {error ? (
            <p role="alert" className="basis-full text-sm text-danger">
              {error}
            </p>
          ) : null}
        </section>
      ) : null}
      {answer ? (
        <section aria-label="Result of the bulk action" data-testid="bulk-result" className="card p-3 text-sm">
          <div className="flex flex-wrap items-center justify-between gap-2">
            <p role="status">
              <span className="figure">{answer.done}</span> {answer.kind === "reassign" ? "reassigned" : "moved"}
              {unchanged.length > 0 ? (
                <>
                  , <span className="figure">{unchanged.length}</span> already theirs
                </>
              ) : null}
              {refused.length > 0 ? (
                <>
                  , <span className="figure">{refused.length}</span> refused
                </>
              ) : null}
              .{refused.length > 0 ? " The refused deals stay selected." : ""}
            </p>
            <button type="button" className="btn-quiet" onClick={() => setAnswer(null)}>
              Dismiss
            </button>
          </div>
          {refused.length > 0 ? (
            <ul className="mt-2 divide-y divide-paper-line" aria-label="Refused deals">
              {refused.map((r) => (
                <li key={r.dealId} className="py-1.5">
                  <span className="font-medium">{r.householdName ?? "A deal"}</span>: {r.message}
                </li>
              ))}
            </ul>
          ) : null}
        </section>
      ) : null}
    </div>
  );
}
