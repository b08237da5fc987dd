import type { Locale } from "@/lib/i18n/locales";
import { translator } from "@/lib/i18n/translator";
import { EmailLayout, Paragraph } from "./components/layout";

export interface RefundIssuedEmailProps {
  customerName: string;
  companyName: string;
  /** Money already formatted with cents in `locale`. */
  amount: string;
  /** What was paid, formatted, and what remains after this refund. */
  paid: string;
  remaining: string;
  /** True when nothing of the deposit remains paid. */
  fullyRefunded: boolean;
  reason: string;
  proposalLabel: string;
  /** The provider's refund id (re_…). */
  reference: string;
  repName: string;
  repEmail: string;
  /** The homeowner's language for this proposal. */
  locale?: Locale;
}

export function RefundIssuedEmail(props: RefundIssuedEmailProps) {
  const locale = props.locale ?? "en";
  const t = translator(locale, "email.refundIssued");
  const common = translator(locale, "email.common");
  return (
    <EmailLayout
      locale={locale}
      preview={t("preview", { company: props.companyName, amount: props.amount })}
      heading={props.fullyRefunded ? t("headingFull", { amount: props.amount }) : t("headingPart", { amount: props.amount })}
      action={{ label: common("writeTo", { name: props.repName }), href: `mailto:${props.repEmail}` }}
      note={t("note", { reference: props.reference })}
    >
      <Paragraph>
        {t.rich("body", {
          customer: props.customerName,
          company: props.companyName,
          amount: props.amount,
          paid: props.paid,
          label: props.proposalLabel,
          b: (chunks) => <strong>{chunks}</strong>,
        })}
        {props.fullyRefunded ? null : ` ${t("remaining", { remaining: props.remaining })}`}
      </Paragraph>
      <Paragraph>{t("reason", { reason: props.reason })}</Paragraph>
    </EmailLayout>
  );
}

RefundIssuedEmail.PreviewProps = {
  customerName: "Hollis Esposito",
  companyName: "Tallgrass Bright Energy",
  amount: "$250.00",
  paid: "$1,000.00",
  remaining: "$750.00",
  fullyRefunded: false,
  reason: "Smaller system after the site survey",
  proposalLabel: "P-1005 version 1",
  reference: "re_demo_0001",
  repName: "Tobias Wren",
  repEmail: "rep@tallgrass.example",
} satisfies RefundIssuedEmailProps;

export default RefundIssuedEmail;
