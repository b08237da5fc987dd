import { Text } from "@react-email/components";
import type { Locale } from "@/lib/i18n/locales";
import { translator } from "@/lib/i18n/translator";
import { EmailLayout, Paragraph } from "./components/layout";

export interface SigningCodeEmailProps {
  companyName: string;
  /** "P-1001 v2" */
  label: string;
  /** Six digits. */
  code: string;
  minutes: number;
  /** Wrong tries before the code locks. */
  tries: number;
  proposalUrl: string;
  /** The homeowner's language for this proposal. */
  locale?: Locale;
}

export function SigningCodeEmail({ companyName, label, code, minutes, tries, proposalUrl, locale = "en" }: SigningCodeEmailProps) {
  const t = translator(locale, "email.signingCode");
  return (
    <EmailLayout locale={locale} preview={t("preview", { code })} heading={t("heading")} action={{ label: t("action"), href: proposalUrl }} note={t("note")}>
      <Paragraph>{t("intro", { label, company: companyName })}</Paragraph>
      <Text style={{ fontSize: "32px", lineHeight: "40px", letterSpacing: "0.3em", fontFamily: "'IBM Plex Mono', Menlo, monospace", fontWeight: 600, margin: "0 0 16px" }}>
        {code}
      </Text>
      <Paragraph>{t("validity", { minutes, tries })}</Paragraph>
    </EmailLayout>
  );
}

SigningCodeEmail.PreviewProps = {
  companyName: "Tallgrass Bright Energy",
  label: "P-1001 v1",
  code: "482913",
  minutes: 10,
  tries: 5,
  proposalUrl: "http://localhost:3000/p/preview-token",
} satisfies SigningCodeEmailProps;

export default SigningCodeEmail;
