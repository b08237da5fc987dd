// Display formatting. Money is stored and passed in integer cents; only here does it become text.
const usd = new Intl.NumberFormat("en-US", { style: "currency", currency: "USD", maximumFractionDigits: 0 });

export function formatCents(cents: number | null | undefined): string {
  return cents == null ? "—" : usd.format(Math.round(cents) / 100);
}

/** Money that may be below zero, with a minus sign (U+2212) before the dollar sign: "−$1,250", never "-$1,250" or "$-1,250". */
export function formatSignedCents(cents: number | null | undefined): string {
  if (cents == null) return "—";
  return cents < 0 && Math.round(-cents / 100) !== 0 ? `−${usd.format(Math.round(-cents) / 100)}` : usd.format(Math.round(Math.abs(cents)) / 100);
}

const usdExact = new Intl.NumberFormat("en-US", { style: "currency", currency: "USD", minimumFractionDigits: 2, maximumFractionDigits: 2 });
/** Money to the cent ("$1,234.50"), for deposits, refunds and receipts; another currency as "12.34 EUR". */
export function formatCentsExact(cents: number | null | undefined, currency = "usd"): string {
  if (cents == null) return "—";
  return currency.toLowerCase() === "usd" ? usdExact.format(cents / 100) : `${(cents / 100).toFixed(2)} ${currency.toUpperCase()}`;
}

/**
 * Money in thousands for chart axes: "$15k", "−$15k" (a minus sign, U+2212, before the dollar
 * sign, never "$-15k"); under $10k with one decimal ("$0.4k").
 */
export function formatCentsCompact(cents: number): string {
  const k = Math.abs(cents) / 100_000;
  const digits = k < 10 ? 1 : 0;
  const text = k.toLocaleString("en-US", { maximumFractionDigits: digits, useGrouping: true });
  return `${cents < 0 && text !== "0" ? "−" : ""}$${text}k`;
}

export function formatKwFromWatts(watts: number | null | undefined): string {
  return watts == null ? "—" : `${(watts / 1000).toFixed(2)} kW`;
}

export function daysSince(date: Date, now = new Date()): number {
  return Math.max(0, Math.floor((now.getTime() - date.getTime()) / 86_400_000));
}

// ── Dates and times people read ─────────────────────────────────────────────────────────────
// Every instant is shown on the company's clock (Settings → Company time zone), so an e-mail, a
// PDF and a page say the same day; a time names its zone ("HST", "EDT"). Calendar dates
// (YYYY-MM-DD, no zone: install dates, deadlines) are shown as they are.

const formats = new Map<string, Intl.DateTimeFormat>();
function formatter(key: string, options: Intl.DateTimeFormatOptions): Intl.DateTimeFormat {
  let f = formats.get(key);
  if (!f) formats.set(key, (f = new Intl.DateTimeFormat("en-US", options)));
  return f;
}

/** The day an instant falls on in the zone: "Dec 5, 2026". */
export const formatDate = (at: Date, timeZone: string) => formatter(`d|${timeZone}`, { dateStyle: "medium", timeZone }).format(at);

/** An instant on the zone's clock, the zone named: "Dec 5, 2026, 7:30 PM HST" (with seconds: "7:30:12 PM HST"). */
export const formatDateTime = (at: Date, timeZone: string, precision: "minutes" | "seconds" = "minutes") =>
  formatter(`dt|${precision}|${timeZone}`, {
    year: "numeric",
    month: "short",
    day: "numeric",
    hour: "numeric",
    minute: "2-digit",
    ...(precision === "seconds" ? { second: "2-digit" } : {}),
    timeZone,
    timeZoneName: "short",
  }).format(at);

/** The zone's short name at that instant ("HST", "EDT"; "GMT+9" where English has none). */
export function zoneName(at: Date, timeZone: string): string {
  return formatter(`z|${timeZone}`, { timeZone, timeZoneName: "short" }).formatToParts(at).find((p) => p.type === "timeZoneName")?.value ?? timeZone;
}

export type CalendarDateStyle = "medium" | "full" | "weekday-day" | "weekday-date";
const CALENDAR_STYLES: Record<CalendarDateStyle, Intl.DateTimeFormatOptions> = {
  medium: { dateStyle: "medium" }, // Dec 5, 2026
  full: { dateStyle: "full" }, // Saturday, December 5, 2026
  "weekday-day": { weekday: "short", month: "short", day: "numeric" }, // Sat, Dec 5
  "weekday-date": { weekday: "short", month: "long", day: "numeric", year: "numeric" }, // Sat, December 5, 2026
};

/** A calendar date (YYYY-MM-DD, already the company's day) as people read it; no zone shift. */
export function formatCalendarDate(isoDate: string, style: CalendarDateStyle = "medium"): string {
  return formatter(`c|${style}`, { ...CALENDAR_STYLES[style], timeZone: "UTC" }).format(new Date(`${isoDate}T00:00:00Z`));
}
