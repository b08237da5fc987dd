import { EmailLayout, Paragraph } from "./components/layout";

export interface AccountExistsEmailProps {
  name: string;
  signInUrl: string;
  resetUrl: string;
}

/** Sent instead of an error when someone signs up with an address that already has an account. */
export function AccountExistsEmail({ name, signInUrl, resetUrl }: AccountExistsEmailProps) {
  return (
    <EmailLayout
      preview="You already have a Kilowright account"
      heading="You already have an account"
      action={{ label: "Sign in", href: signInUrl }}
      note={`Forgot your password? Choose a new one at ${resetUrl}. If you did not try to sign up, ignore this e-mail: nothing changed.`}
    >
      <Paragraph>Hi {name},</Paragraph>
      <Paragraph>Someone, probably you, tried to create a new Kilowright company with this e-mail address. It already has an account, so no new company was made.</Paragraph>
    </EmailLayout>
  );
}

AccountExistsEmail.PreviewProps = {
  name: "Dana Okafor",
  signInUrl: "http://localhost:3000/sign-in",
  resetUrl: "http://localhost:3000/forgot-password",
} satisfies AccountExistsEmailProps;

export default AccountExistsEmail;
