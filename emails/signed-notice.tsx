import { EmailLayout, Paragraph } from "./components/layout";

/** The rep's news that a proposal was signed (staff mail: English). */
export interface SignedNoticeEmailProps {
  householdName: string;
  signerName: string;
  /** "P-1001 v2" */
  label: string;
  offerName: string;
  price: string;
  signedAt: string;
  cancelBy: string | null;
  sha256: string;
  /** The deal's Proposal tab. */
  url: string;
}

export function SignedNoticeEmail({ householdName, signerName, label, offerName, price, signedAt, cancelBy, sha256, url }: SignedNoticeEmailProps) {
  return (
    <EmailLayout
      preview={`${signerName} signed ${label}`}
      heading={`Signed: ${householdName}`}
      action={{ label: "Open the deal's proposal", href: url }}
      note={cancelBy ? `This sale was made in the home: the buyer may cancel until the end of ${cancelBy}.` : undefined}
    >
      <Paragraph>
        {signerName} signed proposal {label} on {signedAt}, choosing &ldquo;{offerName}&rdquo; at {price}. The deal moved to Signed.
      </Paragraph>
      <Paragraph>The signed PDF (with its certificate page) is on the deal&apos;s Proposal tab. SHA-256: {sha256}</Paragraph>
    </EmailLayout>
  );
}

SignedNoticeEmail.PreviewProps = {
  householdName: "Esposito household",
  signerName: "Caspian Esposito",
  label: "P-1003 v1",
  offerName: "Whole roof, cash",
  price: "$21,440",
  signedAt: "Dec 1, 2026, 1:12 PM EST",
  cancelBy: "Friday, December 4, 2026",
  sha256: "3f0c…preview",
  url: "http://localhost:3000/deals/7a11a55e-0000-4000-8000-000000000305/proposal",
} satisfies SignedNoticeEmailProps;

export default SignedNoticeEmail;
