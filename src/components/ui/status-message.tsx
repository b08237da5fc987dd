"use client";
import { useEffect, useRef, useState, type ReactNode } from "react";

export type Notice = { tone: "error" | "success" | "info"; text: string };

/** A form-level message (error or notice), read out when it appears. */
export function FormMessage({ tone, children }: { tone: Notice["tone"]; children: ReactNode }) {
  const styles = {
    error: "border-danger/30 bg-danger-light text-danger",
    success: "border-sage/30 bg-sage-light text-graphite",
    info: "border-paper-line bg-paper-deep text-graphite",
  }[tone];
  return (
    <div role={tone === "error" ? "alert" : "status"} aria-live="polite" className={`rounded-md border px-3 py-2 text-sm ${styles}`}>
      {children}
    </div>
  );
}

/**
 * The status message of a save: nothing, or the last outcome. Placed beside the button that
 * saves; inside a <form> (or an element marked `data-edit-scope`) it goes away at the next edit
 * there, so "Saved." never stands beside changes that are not saved, nor beside a new error.
 */
export function StatusMessage({ notice }: { notice: Notice | null }) {
  const ref = useRef<HTMLDivElement>(null);
  const [editedAfter, setEditedAfter] = useState<Notice | null>(null);
  useEffect(() => {
    const scope = ref.current?.closest("form, [data-edit-scope]");
    if (!notice || !scope) return;
    const edited = () => setEditedAfter(notice);
    scope.addEventListener("input", edited);
    scope.addEventListener("change", edited);
    return () => {
      scope.removeEventListener("input", edited);
      scope.removeEventListener("change", edited);
    };
  }, [notice]);
  if (!notice || editedAfter === notice) return null;
  return (
    <div ref={ref} className="contents">
      <FormMessage tone={notice.tone}>{notice.text}</FormMessage>
    </div>
  );
}

type Submit = { label: string; pending: boolean; disabled?: boolean; quiet?: boolean };

/** The buttons of a save (or its one submit button, "Saving…" while pending) with its status message beside them. */
export function SaveRow({ notice, submit, children }: { notice: Notice | null; submit?: Submit; children?: ReactNode }) {
  return (
    <div className="flex flex-wrap items-center gap-3">
      {submit ? (
        <button type="submit" className={submit.quiet ? "btn-quiet" : "btn-primary"} disabled={submit.pending || submit.disabled}>
          {submit.pending ? "Saving…" : submit.label}
        </button>
      ) : null}
      {children}
      <StatusMessage notice={notice} />
    </div>
  );
}
