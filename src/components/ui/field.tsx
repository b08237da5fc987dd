import type { InputHTMLAttributes, ReactNode, SelectHTMLAttributes } from "react";

type ShellProps = {
  id: string;
  label: string;
  error?: string;
  hint?: ReactNode;
  /** Hide the label visually (a table labels its columns). */
  srLabel?: boolean;
  className?: string;
};

/** The ids a control names in aria-describedby: its error and its hint. */
export function describedBy(id: string, error?: string, hint?: ReactNode): string | undefined {
  return [error ? `${id}-error` : null, hint ? `${id}-hint` : null].filter(Boolean).join(" ") || undefined;
}

/**
 * Label, help and error around any control (input, select, textarea): the error is announced
 * and tied to the control for screen readers. The control passes `describedBy(id, …)`.
 */
export function FieldShell({ id, label, error, hint, srLabel, className, children }: ShellProps & { children: ReactNode }) {
  return (
    <div className={className}>
      <label htmlFor={id} className={srLabel ? "sr-only" : "field-label"}>
        {label}
      </label>
      {children}
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

type FieldProps = ShellProps & Omit<InputHTMLAttributes<HTMLInputElement>, "id" | "className"> & { inputClassName?: string };

/** A labelled input (`{...register("name")}` spreads onto it). */
export function Field({ id, label, error, hint, srLabel, className, inputClassName, ...input }: FieldProps) {
  return (
    <FieldShell id={id} label={label} error={error} hint={hint} srLabel={srLabel} className={className}>
      <input
        id={id}
        className={`field-input ${inputClassName ?? ""}`}
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy(id, error, hint)}
        {...input}
      />
    </FieldShell>
  );
}

type SelectProps = ShellProps &
  Omit<SelectHTMLAttributes<HTMLSelectElement>, "id" | "className"> & {
    options: readonly { value: string; label: string }[];
    selectClassName?: string;
  };

/** A labelled select over value/label pairs (`{...register("name")}` spreads onto it). */
export function SelectField({ id, label, error, hint, srLabel, className, selectClassName, options, ...select }: SelectProps) {
  return (
    <FieldShell id={id} label={label} error={error} hint={hint} srLabel={srLabel} className={className}>
      <select
        id={id}
        className={`field-input ${selectClassName ?? ""}`}
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy(id, error, hint)}
        {...select}
      >
        {options.map((o) => (
          <option key={o.value} value={o.value}>
            {o.label}
          </option>
        ))}
      </select>
    </FieldShell>
  );
}

/** Value/label pairs from an enum list and its labels. */
export function optionsOf<T extends string>(values: readonly T[], labels: Record<T, string>): { value: T; label: string }[] {
  return values.map((value) => ({ value, label: labels[value] }));
}

// The status line of a save lives in its own (client) module; forms import it from here too.
export { FormMessage, SaveRow, StatusMessage, type Notice } from "./status-message";
