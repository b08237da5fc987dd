"use client";
import { useState } from "react";
import { StatusMessage } from "@/components/ui/field";
import { useSave } from "@/components/ui/use-save";

/** "Cancel this agreement", with a second step so a stray tap cancels nothing. Shown only inside the window. */
export function CancelForm({ token, deadlineText }: { token: string; deadlineText: string }) {
  const [confirming, setConfirming] = useState(false);
  // On success the page shows the cancelled agreement (router.refresh).
  const cancel = useSave<void>({ request: () => ({ url: `/api/public/proposals/${token}/cancel`, method: "POST" }) });
  const busy = cancel.pending;

  if (!confirming) {
    return (
      <button type="button" className="btn-danger w-full" onClick={() => setConfirming(true)}>
        Cancel this agreement
      </button>
    );
  }
  return (
    <div className="space-y-3 rounded-md border border-danger/30 bg-danger-light p-3" role="group" aria-label="Confirm the cancellation">
      <p className="text-sm">
        This cancels the agreement you signed, without any penalty. Any deposit you paid is returned. You can do this until the end of {deadlineText}.
      </p>
      <div className="flex flex-col gap-2 sm:flex-row">
        <button type="button" className="btn-danger flex-1" onClick={() => cancel.save()} disabled={busy}>
          Yes, cancel the agreement
        </button>
        <button type="button" className="btn-quiet flex-1" onClick={() => setConfirming(false)} disabled={busy}>
          Keep the agreement
        </button>
      </div>
      <StatusMessage notice={cancel.notice} />
    </div>
  );
}
