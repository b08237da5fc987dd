"use client";
import { useEffect, useState, type InputHTMLAttributes } from "react";

type Props = {
  id: string;
  /** Stored value (e.g. cents, watts); null = blank. */
  value: number | null;
  onValue: (value: number | null) => void;
  /** Stored units per shown unit: 100 shows cents as dollars, 1000 shows watts as kW. */
  scale?: number;
  /** Decimals the stored value keeps (0: whole cents or watts). */
  storedDecimals?: number;
  error?: string;
  label: string;
  /** Hide the label visually (tables label their columns). */
  srLabel?: boolean;
} & Omit<InputHTMLAttributes<HTMLInputElement>, "value" | "onChange" | "id">;

const round = (v: number, decimals: number) => Math.round(v * 10 ** decimals) / 10 ** decimals;

/**
 * A number field that shows a value in the unit people think in (dollars, kW) while the
 * document keeps integer cents or watts. Keeps the typed text so "3." or "" can be typed.
 */
export function NumberInput({ id, value, onValue, scale = 1, storedDecimals = 0, error, label, srLabel, className, ...rest }: Props) {
  const shown = (v: number | null) => (v === null ? "" : String(round(v / scale, 6)));
  const [text, setText] = useState(shown(value));
  useEffect(() => {
    const parsed = text.trim() === "" ? null : Number(text);
    const stored = parsed === null || !Number.isFinite(parsed) ? parsed : round(parsed * scale, storedDecimals);
    if (stored !== value) setText(shown(value));
    // Only an outside change of the value (not the typing that produced it) resets the text.
  }, [value]);
  return (
    <div className={className}>
      <label htmlFor={id} className={srLabel ? "sr-only" : "field-label"}>
        {label}
      </label>
      <input
        id={id}
        inputMode="decimal"
        className="field-input figure min-h-9 py-1 text-sm"
        aria-invalid={error ? true : undefined}
        aria-describedby={error ? `${id}-error` : undefined}
        value={text}
        onChange={(e) => {
          setText(e.target.value);
          const t = e.target.value.trim();
          if (t === "") return onValue(null);
          const n = Number(t);
          onValue(Number.isFinite(n) ? round(n * scale, storedDecimals) : Number.NaN);
        }}
        {...rest}
      />
      {error ? (
        <p id={`${id}-error`} className="field-error text-xs" role="alert">
          {error}
        </p>
      ) : null}
    </div>
  );
}

/** Zod issues or server field errors keyed by dotted path ("bands.1.minWatts"). */
export type PathErrors = Record<string, string>;

export function issuesToErrors(issues: { path: PropertyKey[]; message: string }[]): PathErrors {
  const out: PathErrors = {};
  for (const i of issues) {
    const key = i.path.map(String).join(".") || "_";
    out[key] ??= i.message;
  }
  return out;
}

export function fieldErrorsToErrors(fields: Record<string, string[]> | undefined): PathErrors {
  const out: PathErrors = {};
  for (const [k, v] of Object.entries(fields ?? {})) if (v[0]) out[k] = v[0];
  return out;
}
