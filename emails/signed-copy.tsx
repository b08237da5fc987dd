import type { Locale } from "@/lib/i18n/locales";
import { translator } from "@/lib/i18n/translator";
import { EmailLayout, Paragraph } from "./components/layout";

export interface SignedCopyEmailProps {
  companyName: string;
  signerName: string;
  /** "P-1001 v2" */
  label: string;
  offerName: string;
  /** The contract price, already formatted in `locale`. */
  price: string;
  /** Signing time, already formatted in `locale`. */
  signedAt: string;
  /** The last day to cancel, already formatted; null when the sale carries no right to cancel. */
  cancelBy: string | null;
  sha256: string;
  /** The customer's page (it always serves the signed PDF). */
  url: string;
  /** The homeowner's language for this proposal. */
  locale?: Locale;
}

/** The homeowner's copy; the rep's news is signed-notice.tsx. */
export function SignedCopyEmail({ companyName, signerName, label, offerName, price, signedAt, cancelBy, sha256, url, locale = "en" }: SignedCopyEmailProps) {
  const t = translator(locale, "email.signedCopy");
  return (
    <EmailLayout locale={locale} preview={t("preview", { company: companyName })} heading={t("heading")} action={{ label: t("action"), href: url }} note={t("note")}>
      <Paragraph>{t("thanks", { signer: signerName, label, company: companyName, signedAt, offer: offerName, price })}</Paragraph>
      {cancelBy ? <Paragraph>{t("cancel", { cancelBy })}</Paragraph> : null}
      <Paragraph>{t("fingerprint", { sha256 })}</Paragraph>
    </EmailLayout>
  );
}

SignedCopyEmail.PreviewProps = {
  companyName: "Tallgrass Bright Energy",
  signerName: "Caspian Esposito",
  label: "P-1003 v1",
  offerName: "Whole roof, cash",
  price: "$21,440",
  signedAt: "Dec 1, 2026, 1:12 PM EST",
  cancelBy: "Friday, December 4, 2026",
  sha256: "3f0c…preview",
  url: "http://localhost:3000/p/preview-token",
} satisfies SignedCopyEmailProps;

export default SignedCopyEmail;
