import { EmailLayout, Paragraph } from "./components/layout";

export interface RefundIssuedEmailProps {
  customerName: string;
  companyName: string;
  /** Money already formatted with cents. */
  amount: string;
  /** What was paid, formatted, and what remains after this refund. */
  paid: string;
  remaining: string;
  reason: string;
  proposalLabel: string;
  /** The provider's refund id (re_…). */
  reference: string;
  repName: string;
  repEmail: string;
}

export function RefundIssuedEmail(props: RefundIssuedEmailProps) {
  const full = props.remaining === "$0.00";
  return (
    <EmailLayout
      preview={`${props.companyName} refunded ${props.amount} of your deposit`}
      heading={full ? `Your deposit was refunded: ${props.amount}` : `Part of your deposit was refunded: ${props.amount}`}
      action={{ label: `Write to ${props.repName}`, href: `mailto:${props.repEmail}` }}
      note={<>Card refunds usually appear on your statement within 5–10 business days. Reference: {props.reference}.</>}
    >
      <Paragraph>
        Hello {props.customerName}, {props.companyName} refunded <strong>{props.amount}</strong> of the {props.paid} deposit you paid for proposal{" "}
        {props.proposalLabel}.{full ? "" : ` ${props.remaining} of the deposit remains paid.`}
      </Paragraph>
      <Paragraph>Reason: {props.reason}</Paragraph>
    </EmailLayout>
  );
}

RefundIssuedEmail.PreviewProps = {
  customerName: "Hollis Esposito",
  companyName: "Tallgrass Bright Energy",
  amount: "$250.00",
  paid: "$1,000.00",
  remaining: "$750.00",
  reason: "Smaller system after the site survey",
  proposalLabel: "P-1005 version 1",
  reference: "re_demo_0001",
  repName: "Tobias Wren",
  repEmail: "rep@tallgrass.example",
} satisfies RefundIssuedEmailProps;

export default RefundIssuedEmail;
