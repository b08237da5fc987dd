// Display formatting. Money is stored and passed in integer cents; only here does it become text.
const usd = new Intl.NumberFormat("en-US", { style: "currency", currency: "USD", maximumFractionDigits: 0 });

export function formatCents(cents: number | null | undefined): string {
  return cents == null ? "—" : usd.format(Math.round(cents) / 100);
}

const usdExact = new Intl.NumberFormat("en-US", { style: "currency", currency: "USD", minimumFractionDigits: 2, maximumFractionDigits: 2 });
/** Money to the cent ("$1,234.50"), for deposits, refunds and receipts; another currency as "12.34 EUR". */
export function formatCentsExact(cents: number | null | undefined, currency = "usd"): string {
  if (cents == null) return "—";
  return currency.toLowerCase() === "usd" ? usdExact.format(cents / 100) : `${(cents / 100).toFixed(2)} ${currency.toUpperCase()}`;
}

export function formatKwFromWatts(watts: number | null | undefined): string {
  return watts == null ? "—" : `${(watts / 1000).toFixed(2)} kW`;
}

export function daysSince(date: Date, now = new Date()): number {
  return Math.max(0, Math.floor((now.getTime() - date.getTime()) / 86_400_000));
}

const dateFmt = new Intl.DateTimeFormat("en-US", { dateStyle: "medium", timeZone: "UTC" });
const dateTimeFmt = new Intl.DateTimeFormat("en-US", { dateStyle: "medium", timeStyle: "short", timeZone: "UTC" });
export const formatDate = (d: Date) => dateFmt.format(d);
export const formatDateTime = (d: Date) => `${dateTimeFmt.format(d)} UTC`;
