import type { Locale } from "@/lib/i18n/locales";
import { translator } from "@/lib/i18n/translator";
import { EmailLayout, Paragraph } from "./components/layout";

export interface ProposalSentEmailProps {
  companyName: string;
  repName: string;
  householdName: string;
  /** "P-1001 v2" */
  label: string;
  offerCount: number;
  /** The link's last day, already formatted in `locale`. */
  validUntil: string;
  proposalUrl: string;
  /** The rep's own words, if any. */
  message: string;
  /** True when this is a new link for a proposal already sent (the earlier link stops working). */
  resent?: boolean;
  /** The household's language. */
  locale?: Locale;
}

export function ProposalSentEmail({ companyName, repName, householdName, label, offerCount, validUntil, proposalUrl, message, resent = false, locale = "en" }: ProposalSentEmailProps) {
  const t = translator(locale, "email.proposalSent");
  const common = translator(locale, "email.common");
  return (
    <EmailLayout
      locale={locale}
      preview={t("preview", { company: companyName, label })}
      heading={t("heading", { company: companyName })}
      action={{ label: t("action"), href: proposalUrl }}
      note={[t("noteLink", { household: householdName, validUntil }), resent ? t("noteResent") : null, t("noteIgnore")].filter(Boolean).join(" ")}
    >
      <Paragraph>{t("body", { rep: repName, label, household: householdName, count: offerCount })}</Paragraph>
      {message ? <Paragraph>{common("quote", { message, name: repName })}</Paragraph> : null}
      <Paragraph>{t("closing", { rep: repName })}</Paragraph>
    </EmailLayout>
  );
}

ProposalSentEmail.PreviewProps = {
  companyName: "Tallgrass Bright Energy",
  repName: "Tobias Wren",
  householdName: "Calloway household",
  label: "P-1001 v1",
  offerCount: 2,
  validUntil: "January 1, 2027",
  proposalUrl: "http://localhost:3000/p/preview-token",
  message: "Thank you for the coffee — here are the two options we talked about.",
} satisfies ProposalSentEmailProps;

export default ProposalSentEmail;
