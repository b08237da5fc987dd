// next-intl's typed keys and locales (its AppConfig): useTranslations / getTranslations check
// keys against the English catalog.
import type { Locale } from "./locales";
import type en from "./messages/en.json";

declare module "next-intl" {
  interface AppConfig {
    Locale: Locale;
    Messages: typeof en;
  }
}
