import type { Locale } from "@/lib/i18n/locales";
import { translator } from "@/lib/i18n/translator";
import { EmailLayout, Paragraph } from "./components/layout";

export interface DepositReceiptEmailProps {
  customerName: string;
  companyName: string;
  /** Money already formatted with cents in `locale`, e.g. "$1,000.00". */
  amount: string;
  /** The day it was paid, already formatted. */
  paidOn: string;
  /** e.g. "P-1042 version 2". */
  proposalLabel: string;
  /** The chosen offer's name; null when none is recorded. */
  offerName: string | null;
  contractPrice: string;
  /** The provider's reference for the payment (pi_… or ch_…). */
  reference: string;
  /** The last day to cancel under the right to cancel, already formatted; null when none applies. */
  cancelUntil: string | null;
  repName: string;
  repEmail: string;
  /** The homeowner's language for this proposal. */
  locale?: Locale;
}

export function DepositReceiptEmail(props: DepositReceiptEmailProps) {
  const locale = props.locale ?? "en";
  const t = translator(locale, "email.depositReceipt");
  const common = translator(locale, "email.common");
  return (
    <EmailLayout
      locale={locale}
      preview={t("preview", { company: props.companyName, amount: props.amount })}
      heading={t("heading", { amount: props.amount })}
      action={{ label: common("writeTo", { name: props.repName }), href: `mailto:${props.repEmail}` }}
      note={t("note", { reference: props.reference })}
    >
      <Paragraph>
        {t.rich("body", {
          customer: props.customerName,
          company: props.companyName,
          amount: props.amount,
          paidOn: props.paidOn,
          label: props.proposalLabel,
          offer: props.offerName ?? t("offerFallback"),
          b: (chunks) => <strong>{chunks}</strong>,
        })}
      </Paragraph>
      <Paragraph>{t("counts", { price: props.contractPrice })}</Paragraph>
      {props.cancelUntil ? <Paragraph>{t("cancel", { cancelUntil: props.cancelUntil })}</Paragraph> : null}
    </EmailLayout>
  );
}

DepositReceiptEmail.PreviewProps = {
  customerName: "Hollis Esposito",
  companyName: "Tallgrass Bright Energy",
  amount: "$1,000.00",
  paidOn: "Mar 4, 2026",
  proposalLabel: "P-1005 version 1",
  offerName: "Full roof, cash",
  contractPrice: "$19,720.00",
  reference: "pi_demo_0001",
  cancelUntil: "Mar 9, 2026",
  repName: "Tobias Wren",
  repEmail: "rep@tallgrass.example",
} satisfies DepositReceiptEmailProps;

export default DepositReceiptEmail;
