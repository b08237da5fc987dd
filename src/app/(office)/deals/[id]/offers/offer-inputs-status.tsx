"use client";
// Whether an offer's figures still match the deal's inputs (usage, design, rate plan, price
// book, incentive rules, savings assumptions), and a button to compute them again from the
// same choices. A proposal can only hold offers whose inputs are all current.
import { useRouter } from "next/navigation";
import { useState } from "react";
import { api } from "@/lib/api-client";
import { describeStale, type StaleInput } from "@/lib/offer-basis";
import type { OfferInputs } from "@/lib/schemas/offer";

export function OfferInputsStatus({ offer, canEdit }: { offer: { id: string; name: string; inputs: OfferInputs; stale: StaleInput[] }; canEdit: boolean }) {
  const router = useRouter();
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  if (offer.stale.length === 0) return null;

  async function recompute() {
    setBusy(true);
    setError(null);
    try {
      await api(`/api/offers/${offer.id}`, { method: "PUT", json: { inputs: offer.inputs } });
      router.refresh();
    } catch (err) {
      setError(err instanceof Error ? err.message : "The offer could not be computed again.");
    } finally {
      setBusy(false);
    }
  }

  return (
    <div className="mt-3 rounded bg-caution-light px-2 py-1 text-sm" role="status" data-testid="offer-inputs-status">
      <p>
        Changed since these figures were computed: <strong>{describeStale(offer.stale)}</strong>. Recompute before sending it in a proposal.
      </p>
      {canEdit ? (
        <button type="button" className="btn-quiet mt-1" onClick={recompute} disabled={busy}>
          {busy ? "Computing…" : "Recompute"}
        </button>
      ) : null}
      {error ? <p className="mt-1 text-danger">{error}</p> : null}
    </div>
  );
}
