import { EmailLayout, Paragraph } from "./components/layout";

export interface ResetPasswordEmailProps {
  name: string;
  resetUrl: string;
  expiresInMinutes: number;
}

export function ResetPasswordEmail({ name, resetUrl, expiresInMinutes }: ResetPasswordEmailProps) {
  return (
    <EmailLayout
      preview="A link to choose a new Kilowright password"
      heading="Choose a new password"
      action={{ label: "Set a new password", href: resetUrl }}
      note={`The link works once, for ${expiresInMinutes} minutes. If you did not ask for it, ignore this e-mail: your password stays as it is.`}
    >
      <Paragraph>Hi {name},</Paragraph>
      <Paragraph>We got a request to reset the password of your Kilowright account.</Paragraph>
    </EmailLayout>
  );
}

ResetPasswordEmail.PreviewProps = {
  name: "Dana Okafor",
  resetUrl: "http://localhost:3000/reset-password/preview-token",
  expiresInMinutes: 60,
} satisfies ResetPasswordEmailProps;

export default ResetPasswordEmail;
