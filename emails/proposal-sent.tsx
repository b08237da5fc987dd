import { EmailLayout, Paragraph } from "./components/layout";

export interface ProposalSentEmailProps {
  companyName: string;
  repName: string;
  householdName: string;
  /** "P-1001 v2" */
  label: string;
  offerCount: number;
  /** The link's last day, already formatted. */
  validUntil: string;
  proposalUrl: string;
  /** The rep's own words, if any. */
  message: string;
  /** True when this is a new link for a proposal already sent (the earlier link stops working). */
  resent?: boolean;
}

export function ProposalSentEmail({ companyName, repName, householdName, label, offerCount, validUntil, proposalUrl, message, resent = false }: ProposalSentEmailProps) {
  const options = offerCount === 1 ? "one option" : `${offerCount} options to compare`;
  return (
    <EmailLayout
      preview={`${companyName} sent your solar proposal (${label})`}
      heading={`Your solar proposal from ${companyName}`}
      action={{ label: "Open your proposal", href: proposalUrl }}
      note={
        <>
          This link is personal to the {householdName} and works until {validUntil}. {resent ? "It replaces the link we sent before, which no longer opens. " : ""}If you did not expect this e-mail,
          you can ignore it.
        </>
      }
    >
      <Paragraph>
        {repName} prepared proposal {label} for the {householdName}: {options}, with the system, the price, the incentives, your estimated savings and every assumption behind them.
      </Paragraph>
      {message ? <Paragraph>&ldquo;{message}&rdquo; — {repName}</Paragraph> : null}
      <Paragraph>You can read it on your phone, ask {repName} a question, download it as a PDF, and sign it online when you are ready.</Paragraph>
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
