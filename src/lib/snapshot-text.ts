// Homeowner text that a proposal snapshot carries (assumption sentences, cautions, notes on the
// figures, incentive details): stored as a catalog key and its values, so the page, the PDF and
// the signed copy print it in the reader's language (issue #18). Snapshots made before this
// stored plain English sentences: a plain string is printed as stored. Names the company typed
// (price-book lines, rate plans, roof faces, weather places) travel as values, kept as typed.
import type { NamespaceKeys, NestedKeyOf } from "next-intl";
import { formatCents } from "@/lib/format";
import { INTL_LOCALE, type Locale } from "@/lib/i18n/locales";
import { translator, type Messages } from "@/lib/i18n/translator";

export type SnapshotKey = NamespaceKeys<Messages["snapshot"], NestedKeyOf<Messages["snapshot"]>> | NestedKeyOf<Messages["snapshot"]>;

/** A value of a stored message: text or a number as is, money in cents, or another message. */
export type SnapshotValue = string | number | { cents: number } | SnapshotMessage;
export type SnapshotMessage = { key: SnapshotKey; values?: Record<string, SnapshotValue> };
/** A stored message, or (older snapshots, and notes we have no message for) the English text. */
export type SnapshotText = string | SnapshotMessage;

export const msg = (key: SnapshotKey, values?: Record<string, SnapshotValue>): SnapshotMessage => (values ? { key, values } : { key });

/** Numbers as the rest of the homeowner's page writes them (US conventions in both languages: "11,650", "0.5"). */
const numberText = (n: number, locale: Locale) => new Intl.NumberFormat(INTL_LOCALE[locale], { maximumFractionDigits: 2 }).format(n);

function valueText(v: SnapshotValue, locale: Locale): string {
  if (typeof v === "string") return v;
  if (typeof v === "number") return numberText(v, locale);
  if ("cents" in v) return formatCents(v.cents, locale);
  return snapshotText(v, locale);
}

/** One stored text in the reader's language. */
export function snapshotText(item: SnapshotText, locale: Locale): string {
  if (typeof item === "string") return item;
  const t = translator(locale, "snapshot");
  const values = Object.fromEntries(Object.entries(item.values ?? {}).map(([k, v]) => [k, valueText(v, locale)]));
  return t(item.key as Parameters<typeof t>[0], values);
}

/** Stored texts in the reader's language, each once. */
export const snapshotTexts = (items: readonly SnapshotText[], locale: Locale): string[] => [...new Set(items.map((i) => snapshotText(i, locale)))];
