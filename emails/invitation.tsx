import { EmailLayout, Paragraph } from "./components/layout";

export interface InvitationEmailProps {
  companyName: string;
  inviterName: string;
  /** The role as people read it, e.g. "Sales rep". */
  roleLabel: string;
  acceptUrl: string;
  expiresAt: Date;
}

const expiryFormat = new Intl.DateTimeFormat("en-US", { dateStyle: "long", timeStyle: "short", timeZone: "UTC" });

export function InvitationEmail({ companyName, inviterName, roleLabel, acceptUrl, expiresAt }: InvitationEmailProps) {
  return (
    <EmailLayout
      preview={`${inviterName} invited you to ${companyName} on Kilowright`}
      heading={`Join ${companyName} on Kilowright`}
      action={{ label: "Accept invitation", href: acceptUrl }}
      note={
        <>
          This invitation works until {expiryFormat.format(expiresAt)} UTC. If you were not expecting it, ignore this
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
  expiresAt: new Date("2030-05-14T17:00:00Z"),
} satisfies InvitationEmailProps;

export default InvitationEmail;
