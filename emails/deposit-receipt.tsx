import { EmailLayout, Paragraph } from "./components/layout";

export interface DepositReceiptEmailProps {
  customerName: string;
  companyName: string;
  /** Money already formatted with cents, e.g. "$1,000.00". */
  amount: string;
  /** The day it was paid, already formatted. */
  paidOn: string;
  /** e.g. "P-1042 version 2". */
  proposalLabel: string;
  offerName: string;
  contractPrice: string;
  /** The provider's reference for the payment (pi_… or ch_…). */
  reference: string;
  /** The last day to cancel under the right to cancel, already formatted; null when none applies. */
  cancelUntil: string | null;
  repName: string;
  repEmail: string;
}

export function DepositReceiptEmail(props: DepositReceiptEmailProps) {
  return (
    <EmailLayout
      preview={`${props.companyName} received your deposit of ${props.amount}`}
      heading={`Deposit received: ${props.amount}`}
      action={{ label: `Write to ${props.repName}`, href: `mailto:${props.repEmail}` }}
      note={<>Keep this e-mail as your receipt. Reference: {props.reference}.</>}
    >
      <Paragraph>
        Hello {props.customerName}, {props.companyName} received your deposit of <strong>{props.amount}</strong> on {props.paidOn} for
        proposal {props.proposalLabel}, &ldquo;{props.offerName}&rdquo;.
      </Paragraph>
      <Paragraph>The deposit counts toward the contract price of {props.contractPrice}. The office will be in touch to schedule the site survey.</Paragraph>
      {props.cancelUntil ? (
        <Paragraph>You may still cancel the agreement until the end of {props.cancelUntil}; the deposit would then be refunded in full.</Paragraph>
      ) : null}
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
