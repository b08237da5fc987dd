// The one translator for text outside React's request (e-mails, PDFs) and for the homeowner's
// page (next-intl's createTranslator, the same ICU messages as useTranslations). Keys are typed
// from the English catalog; the Spanish one must have the same shape (checked here by the type
// of CATALOGS and by catalogs.test.ts for placeholders and empty strings).
import { createTranslator, type NamespaceKeys, type NestedKeyOf } from "next-intl";
import type { Locale } from "./locales";
import en from "./messages/en.json";
import es from "./messages/es.json";

export type Messages = typeof en;
export type Namespace = NamespaceKeys<Messages, NestedKeyOf<Messages>>;

export const CATALOGS: Record<Locale, Messages> = { en, es };

/**
 * A translator for one namespace. A missing message throws rather than printing its key: the
 * catalogs are complete by test, so a miss is a bug to see, not a text to send a homeowner.
 */
export function translator<N extends Namespace>(locale: Locale, namespace: N) {
  return createTranslator({
    locale,
    messages: CATALOGS[locale],
    namespace,
    onError: (error) => {
      throw error;
    },
  });
}
