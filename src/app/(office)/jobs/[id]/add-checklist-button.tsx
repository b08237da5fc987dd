"use client";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { FormMessage } from "@/components/ui/field";
import { api, ApiError } from "@/lib/api-client";

/** For a job created before any checklist was active: copy the company's active one into it. */
export function AddChecklistButton({ jobId }: { jobId: string }) {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  return (
    <div className="card space-y-2 p-4">
      <p className="text-sm">This job has no install checklist.</p>
      {error ? <FormMessage tone="error">{error}</FormMessage> : null}
      <button
        type="button"
        className="btn-quiet"
        disabled={busy}
        onClick={async () => {
          setBusy(true);
          setError(null);
          try {
            await api(`/api/jobs/${jobId}/checklist`, { method: "POST" });
            router.refresh();
          } catch (err) {
            setError(err instanceof ApiError ? err.message : "Not added. Try again.");
          } finally {
            setBusy(false);
          }
        }}
      >
        Add the company&apos;s active checklist
      </button>
    </div>
  );
}
