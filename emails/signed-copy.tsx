import { EmailLayout, Paragraph } from "./components/layout";

export interface SignedCopyEmailProps {
  /** The customer gets their copy; the rep gets the news. */
  audience: "customer" | "rep";
  companyName: string;
  householdName: string;
  signerName: string;
  /** "P-1001 v2" */
  label: string;
  offerName: string;
  /** The contract price, already formatted. */
  price: string;
  /** Signing time, already formatted (UTC). */
  signedAt: string;
  /** The last day to cancel, already formatted; null when the sale carries no right to cancel. */
  cancelBy: string | null;
  sha256: string;
  /** The customer's page (download the signed PDF) or the deal's Proposal tab. */
  url: string;
}

export function SignedCopyEmail({ audience, companyName, householdName, signerName, label, offerName, price, signedAt, cancelBy, sha256, url }: SignedCopyEmailProps) {
  if (audience === "rep") {
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
  return (
    <EmailLayout
      preview={`Your signed agreement with ${companyName}`}
      heading="Your signed agreement"
      action={{ label: "Download your signed copy", href: url }}
      note="Keep this e-mail: the page it opens always has your signed PDF. Anyone can check a copy is genuine on the verify page linked from it."
    >
      <Paragraph>
        Thank you, {signerName}. You signed proposal {label} with {companyName} on {signedAt}, choosing &ldquo;{offerName}&rdquo; at {price}.
      </Paragraph>
      {cancelBy ? (
        <Paragraph>
          You may cancel this agreement without any penalty or obligation until the end of {cancelBy}. The cancellation notice and form are on the same page.
        </Paragraph>
      ) : null}
      <Paragraph>Fingerprint (SHA-256) of your signed document: {sha256}</Paragraph>
    </EmailLayout>
  );
}

SignedCopyEmail.PreviewProps = {
  audience: "customer",
  companyName: "Tallgrass Bright Energy",
  householdName: "Esposito household",
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
