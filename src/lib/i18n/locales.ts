// The homeowner's languages (issue #18 item 6). The rep chooses one per household; the homeowner
// may switch on their proposal page. Staff screens stay in English.
export const LOCALES = ["en", "es"] as const;
export type Locale = (typeof LOCALES)[number];
export const DEFAULT_LOCALE: Locale = "en";

/** Each language's name in itself, for the rep's choice and the homeowner's switch. */
export const LOCALE_NAMES: Record<Locale, string> = { en: "English", es: "Español" };

/** The Intl locale for money, numbers and dates: US conventions in both languages ("$1,000", "5 dic 2026"). */
export const INTL_LOCALE: Record<Locale, string> = { en: "en-US", es: "es-US" };
