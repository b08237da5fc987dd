import { EmailLayout, Paragraph } from "./components/layout";

export interface ProposalCancelledEmailProps {
  householdName: string;
  /** "P-1001 v2" */
  label: string;
  /** When the buyer cancelled, already formatted (UTC). */
  cancelledAt: string;
  dealUrl: string;
}

export function ProposalCancelledEmail({ householdName, label, cancelledAt, dealUrl }: ProposalCancelledEmailProps) {
  return (
    <EmailLayout
      preview={`The ${householdName} cancelled ${label}`}
      heading={`Cancelled: ${householdName}`}
      action={{ label: "Open the deal's proposal", href: dealUrl }}
      note="The buyer used the right to cancel a sale made in the home (16 CFR Part 429). The deal moved to Cancelled."
    >
      <Paragraph>
        The buyer cancelled the signed agreement {label} on {cancelledAt}, inside the cancellation window. Any deposit paid is refunded in full.
      </Paragraph>
    </EmailLayout>
  );
}

ProposalCancelledEmail.PreviewProps = {
  householdName: "Esposito household",
  label: "P-1003 v1",
  cancelledAt: "Dec 2, 2026, 4:40 AM EST",
  dealUrl: "http://localhost:3000/deals/7a11a55e-0000-4000-8000-000000000305/proposal",
} satisfies ProposalCancelledEmailProps;

export default ProposalCancelledEmail;
