"use client";
// Whether an offer's figures still match the deal's inputs (usage, design, rate plan, price
// book, incentive rules, savings assumptions), and a button to compute them again from the
// same choices. A proposal can only hold offers whose inputs are all current.
import { useMutation } from "@tanstack/react-query";
import { useRouter } from "next/navigation";
import { api } from "@/lib/api-client";
import { describeStale, type StaleInput } from "@/lib/offer-basis";
import type { OfferInputs } from "@/lib/schemas/offer";

export function OfferInputsStatus({ offer, canEdit }: { offer: { id: string; name: string; inputs: OfferInputs; stale: StaleInput[] }; canEdit: boolean }) {
  const router = useRouter();
  // PUT with the offer's own inputs: the server computes it again from the current inputs.
  const recompute = useMutation({ mutationFn: () => api(`/api/offers/${offer.id}`, { method: "PUT", json: { inputs: offer.inputs } }), onSuccess: () => router.refresh() });
  if (offer.stale.length === 0) return null;
  return (
    <div className="mt-3 rounded bg-caution-light px-2 py-1 text-sm" role="status" data-testid="offer-inputs-status">
      <p>
        Changed since these figures were computed: <strong>{describeStale(offer.stale)}</strong>. Recompute before sending it in a proposal.
      </p>
      {canEdit ? (
        <button type="button" className="btn-quiet mt-1" onClick={() => recompute.mutate()} disabled={recompute.isPending}>
          {recompute.isPending ? "Computing…" : "Recompute"}
        </button>
      ) : null}
      {recompute.error ? <p className="mt-1 text-danger">{recompute.error.message}</p> : null}
    </div>
  );
}
