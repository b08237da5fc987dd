import { EmailLayout, Paragraph } from "./components/layout";

export interface VerifyEmailProps {
  name: string;
  verifyUrl: string;
}

export function VerifyEmail({ name, verifyUrl }: VerifyEmailProps) {
  return (
    <EmailLayout
      preview="Confirm your e-mail address for Kilowright"
      heading="Confirm your e-mail address"
      action={{ label: "Confirm e-mail", href: verifyUrl }}
      note="If you did not sign up for Kilowright, ignore this e-mail and no account will be activated."
    >
      <Paragraph>Hi {name},</Paragraph>
      <Paragraph>Confirm that this address is yours, and you can sign in to Kilowright.</Paragraph>
    </EmailLayout>
  );
}

VerifyEmail.PreviewProps = {
  name: "Dana Okafor",
  verifyUrl: "http://localhost:3000/api/auth/verify-email?token=preview-token",
} satisfies VerifyEmailProps;

export default VerifyEmail;
