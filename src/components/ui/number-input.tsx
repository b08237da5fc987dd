"use client";
import { useEffect, useState, type InputHTMLAttributes } from "react";
import { describedBy, FieldShell } from "./field";

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
  /** The longest text the field is expected to show (FIGURE_CHARS); it never gets narrower than that. */
  chars?: number;
} & Omit<InputHTMLAttributes<HTMLInputElement>, "value" | "onChange" | "id">;

/**
 * The longest text each kind of figure is expected to show, in characters (our choice): a month's
 * kWh "12345.6" and up to "99,999.9" with a separator; money to "1234567.89"; a percent "12.375".
 */
export const FIGURE_CHARS = { kwh: 8, money: 10, percent: 6, number: 8 } as const;

/** A figure field's least width: its longest text in the figures' monospace (1ch a digit), plus the field's padding and border. */
export const figureWidth = (chars: number) => ({ minWidth: `calc(${chars}ch + 1.5rem + 2px)` });

const round = (v: number, decimals: number) => Math.round(v * 10 ** decimals) / 10 ** decimals;

/**
 * A number field that shows a value in the unit people think in (dollars, kW) while the
 * document keeps integer cents or watts. Keeps the typed text so "3." or "" can be typed.
 */
export function NumberInput({ id, value, onValue, scale = 1, storedDecimals = 0, error, label, srLabel, className, chars = FIGURE_CHARS.number, style, ...rest }: Props) {
  const shown = (v: number | null) => (v === null ? "" : String(round(v / scale, 6)));
  const [text, setText] = useState(shown(value));
  useEffect(() => {
    const parsed = text.trim() === "" ? null : Number(text);
    const stored = parsed === null || !Number.isFinite(parsed) ? parsed : round(parsed * scale, storedDecimals);
    if (stored !== value) setText(shown(value));
    // Only an outside change of the value (not the typing that produced it) resets the text.
  }, [value]);
  return (
    <FieldShell id={id} label={label} error={error} srLabel={srLabel} className={className}>
      <input
        id={id}
        inputMode="decimal"
        className="field-input figure min-h-9 py-1 text-sm"
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy(id, error)}
        value={text}
        style={{ ...figureWidth(chars), ...style }}
        onChange={(e) => {
          setText(e.target.value);
          const t = e.target.value.trim();
          if (t === "") return onValue(null);
          const n = Number(t);
          onValue(Number.isFinite(n) ? round(n * scale, storedDecimals) : Number.NaN);
        }}
        {...rest}
      />
    </FieldShell>
  );
}

/** Money typed in dollars, kept as integer cents. */
export function MoneyInput(props: Omit<Props, "scale" | "storedDecimals">) {
  return <NumberInput chars={FIGURE_CHARS.money} {...props} scale={100} storedDecimals={0} />;
}

/**
 * A percent typed as people say it ("7.5") and kept as the stored unit: `fraction` keeps
 * 0.075, otherwise the percent itself (with `storedDecimals` places).
 */
export function PercentInput({ fraction, ...props }: Omit<Props, "scale"> & { fraction?: boolean }) {
  return <NumberInput chars={FIGURE_CHARS.percent} {...props} scale={fraction ? 0.01 : 1} storedDecimals={props.storedDecimals ?? (fraction ? 6 : 2)} />;
}
