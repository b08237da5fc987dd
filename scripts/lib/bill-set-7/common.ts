/**
 * Held-out set 7: helpers shared by its invented bills (scripts/lib/bill-set-7/bills-*.ts).
 * Every dollar line is computed here in cents and every total is the sum of its printed lines,
 * so a bill never prints figures that disagree with each other.
 */
import { readFileSync } from "node:fs";
import path from "node:path";

/** $1,234.56 (negative as −$12.30 or in the style the bill asks for). */
export function usd(cents: number, negative: "minus" | "cr" | "paren" = "minus"): string {
  const abs = (Math.abs(cents) / 100).toLocaleString("en-US", { minimumFractionDigits: 2, maximumFractionDigits: 2 });
  if (cents >= 0) return `$${abs}`;
  return negative === "cr" ? `$${abs} CR` : negative === "paren" ? `($${abs})` : `-$${abs}`;
}

/** kWh × rate in dollars, rounded to the cent as a billing system does (half up). */
export const times = (qty: number, rate: number) => Math.round(Number((qty * rate * 100).toFixed(6)));
export const sum = (...cents: number[]) => cents.reduce((a, b) => a + b, 0);

export type Line = { label: string; cents: number; detail?: string };
/** A charges table: label, optional detail (quantity × rate), amount; a bold total row under a rule. */
export function chargeRows(lines: Line[], total: { label: string; cents: number }, negative: "minus" | "cr" | "paren" = "minus"): string {
  const rows = lines.map((l) => `<tr><td>${l.label}</td><td class="muted">${l.detail ?? ""}</td><td class=r>${usd(l.cents, negative)}</td></tr>`).join("");
  return `${rows}<tr style="border-top:1px solid #333"><td colspan=2><b>${total.label}</b></td><td class=r><b>${usd(total.cents, negative)}</b></td></tr>`;
}

/** A font from node_modules embedded as a data URL (chromium prints from about:blank, off the network). */
function fontFace(family: string, file: string, weight: number): string {
  const data = readFileSync(path.resolve("node_modules", file)).toString("base64");
  return `@font-face{font-family:"${family}";src:url(data:font/woff2;base64,${data}) format("woff2");font-weight:${weight}}`;
}
export const plexSans = () =>
  fontFace("Plex Sans", "@ibm/plex-sans/fonts/complete/woff2/IBMPlexSans-Regular.woff2", 400) + fontFace("Plex Sans", "@ibm/plex-sans/fonts/complete/woff2/IBMPlexSans-Bold.woff2", 700);
export const plexMono = () =>
  fontFace("Plex Mono", "@ibm/plex-mono/fonts/complete/woff2/IBMPlexMono-Regular.woff2", 400) + fontFace("Plex Mono", "@ibm/plex-mono/fonts/complete/woff2/IBMPlexMono-Bold.woff2", 700);

/** 0–11 from "YYYY-MM" (month names: MON in ../bill-set-5/bills). */
export const monthIndex = (ym: string) => Number(ym.slice(5)) - 1;
