import { EmailLayout, Paragraph } from "./components/layout";

export interface InvitationEmailProps {
  companyName: string;
  inviterName: string;
  /** The role as people read it, e.g. "Sales rep". */
  roleLabel: string;
  acceptUrl: string;
  /** When the invitation lapses, on the company's clock with its zone (src/lib/format.ts formatDateTime). */
  validUntil: string;
}

export function InvitationEmail({ companyName, inviterName, roleLabel, acceptUrl, validUntil }: InvitationEmailProps) {
  return (
    <EmailLayout
      preview={`${inviterName} invited you to ${companyName} on Kilowright`}
      heading={`Join ${companyName} on Kilowright`}
      action={{ label: "Accept invitation", href: acceptUrl }}
      note={
        <>
          This invitation works until {validUntil}. If you were not expecting it, ignore this
          e-mail: nothing happens unless you accept.
        </>
      }
    >
      <Paragraph>
        {inviterName} added you to the {companyName} team as <strong>{roleLabel}</strong>.
      </Paragraph>
      <Paragraph>Accept to choose a password and sign in.</Paragraph>
    </EmailLayout>
  );
}

InvitationEmail.PreviewProps = {
  companyName: "Tallgrass Bright Energy",
  inviterName: "Dana Okafor",
  roleLabel: "Sales rep",
  acceptUrl: "http://localhost:3000/invite/preview-token",
  validUntil: "May 14, 2030, 1:00 PM EDT",
} satisfies InvitationEmailProps;

export default InvitationEmail;
