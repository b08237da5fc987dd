"use client";
import { StatusMessage } from "@/components/ui/field";
import { useSave } from "@/components/ui/use-save";

/** For a job created before any checklist was active: copy the company's active one into it. */
export function AddChecklistButton({ jobId }: { jobId: string }) {
  const add = useSave<void>({ request: () => ({ url: `/api/jobs/${jobId}/checklist`, method: "POST" }) });
  return (
    <div className="card space-y-2 p-4">
      <p className="text-sm">This job has no install checklist.</p>
      <StatusMessage notice={add.notice} />
      <button type="button" className="btn-quiet" disabled={add.pending} onClick={() => add.save()}>
        Add the company&apos;s active checklist
      </button>
    </div>
  );
}
