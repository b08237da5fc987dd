/**
 * Shared bits of held-out set 8's layouts (scripts/make-bill-set-8.ts): money and kWh as the bills
 * print them, charge lines whose printed total is the sum of their printed (rounded) amounts, month
 * names, and the HTML page shell. Every layout draws its figures from the same numbers its expected
 * JSON is built from, so the two cannot drift apart.
 */
import type { printBills, writeExpected } from "../bill-print";

export type Bill = Parameters<typeof printBills>[1][number];
type Expected = Parameters<typeof writeExpected>[2];

const MONTHS = ["January", "February", "March", "April", "May", "June", "July", "August", "September", "October", "November", "December"];
export const MON = MONTHS.map((m) => m.slice(0, 3));

/** $1,234.56 (negative as -$12.00, or in parentheses when `parens`). */
export function usd(cents: number, parens = false): string {
  const body = `$${(Math.abs(cents) / 100).toFixed(2).replace(/\B(?=(\d{3})+(?!\d))/g, ",")}`;
  if (cents >= 0) return body;
  return parens ? `(${body})` : `-${body}`;
}

/** 1,234.56 without the dollar sign. */
export const amt = (cents: number) => usd(cents).replace("$", "");

export const kwh = (n: number) => n.toLocaleString("en-US");

/** A charge: quantity × rate rounded half-up to cents, or a fixed amount. */
type Line = { label: string; detail?: string; cents: number };
export const rated = (label: string, qty: number, rate: number, unit = "kWh", digits = 5): Line => ({
  label,
  detail: `${kwh(qty)} ${unit} @ ${rate < 0 ? "-" : ""}$${Math.abs(rate).toFixed(digits)}`,
  cents: Math.round(qty * rate * 100 + 1e-9),
});
export const fixed = (label: string, cents: number, detail?: string): Line => ({ label, detail, cents });
export const pct = (label: string, base: number, percent: number): Line => ({ label, detail: `${percent}% of ${usd(base)}`, cents: Math.round((base * percent) / 100 + 1e-9) });
export const sum = (lines: Line[]) => lines.reduce((t, l) => t + l.cents, 0);

/** YYYY-MM of the month `back` months before (year, month 1–12). */
function ym(year: number, month: number, back = 0): { y: number; m: number; key: string } {
  const idx = year * 12 + (month - 1) - back;
  const y = Math.floor(idx / 12);
  const m = (idx % 12) + 1;
  return { y, m, key: `${y}-${String(m).padStart(2, "0")}` };
}

/** History rows oldest first, the last one ending in (year, month). */
export function monthsEnding(year: number, month: number, values: number[]) {
  return values.map((v, i) => ({ ...ym(year, month, values.length - 1 - i), kwh: v }));
}

export function expected(current: Expected["current"], history: { key: string; kwh: number }[]): Expected {
  return { current, history: history.map((h) => ({ month: h.key, kwh: h.kwh })), source: "text", warnings: [] };
}

/** Days between two ISO dates. */
export const daysBetween = (a: string, b: string) => Math.round((Date.parse(b) - Date.parse(a)) / 86_400_000);

/** Rows of charge lines as <tr>s (label, detail, amount). */
export const lineRows = (lines: Line[], money: (c: number) => string = amt) =>
  lines.map((l) => `<tr><td>${l.label}</td><td class="d">${l.detail ?? ""}</td><td class="n">${money(l.cents)}</td></tr>`).join("");

/** The whole document: each page a Letter sheet, broken between pages. */
export function html(bill: Bill): string {
  const pages = bill.pages.map((p, i) => `<section class="sheet"${i < bill.pages.length - 1 ? ' style="break-after: page"' : ""}>${p}</section>`).join("");
  return `<!doctype html><html><head><meta charset="utf-8"><style>@page { size: Letter; margin: 0.45in; } * { box-sizing: border-box; } body { margin: 0; } ${bill.css}</style></head><body>${pages}</body></html>`;
}
