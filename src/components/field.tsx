import type { InputHTMLAttributes, ReactNode } from "react";

type FieldProps = {
  id: string;
  label: string;
  error?: string;
  hint?: ReactNode;
} & InputHTMLAttributes<HTMLInputElement>;

/** A labelled input whose error is announced and tied to the input for screen readers. */
export function Field({ id, label, error, hint, ...input }: FieldProps) {
  const describedBy = [error ? `${id}-error` : null, hint ? `${id}-hint` : null].filter(Boolean).join(" ") || undefined;
  return (
    <div>
      <label htmlFor={id} className="field-label">
        {label}
      </label>
      <input id={id} className="field-input" aria-invalid={error ? true : undefined} aria-describedby={describedBy} {...input} />
      {hint ? (
        <p id={`${id}-hint`} className="mt-1 text-sm text-graphite-soft">
          {hint}
        </p>
      ) : null}
      {error ? (
        <p id={`${id}-error`} className="field-error" role="alert">
          {error}
        </p>
      ) : null}
    </div>
  );
}

/** A form-level message (error or notice), read out when it appears. */
export function FormMessage({ tone, children }: { tone: "error" | "success" | "info"; children: ReactNode }) {
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
