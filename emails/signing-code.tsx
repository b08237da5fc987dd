import { Text } from "@react-email/components";
import { EmailLayout, Paragraph } from "./components/layout";

export interface SigningCodeEmailProps {
  companyName: string;
  /** "P-1001 v2" */
  label: string;
  /** Six digits. */
  code: string;
  minutes: number;
  proposalUrl: string;
}

export function SigningCodeEmail({ companyName, label, code, minutes, proposalUrl }: SigningCodeEmailProps) {
  return (
    <EmailLayout
      preview={`Your signing code is ${code}`}
      heading="Your code to sign"
      action={{ label: "Back to your proposal", href: proposalUrl }}
      note="If you did not ask for a code, someone may have your proposal link: do not share this code, and tell your installer."
    >
      <Paragraph>
        Enter this code on the proposal page to confirm your e-mail address before signing {label} from {companyName}:
      </Paragraph>
      <Text style={{ fontSize: "32px", lineHeight: "40px", letterSpacing: "0.3em", fontFamily: "'IBM Plex Mono', Menlo, monospace", fontWeight: 600, margin: "0 0 16px" }}>
        {code}
      </Text>
      <Paragraph>It works for {minutes} minutes and for 5 tries. After that, ask for a new code on the page.</Paragraph>
    </EmailLayout>
  );
}

SigningCodeEmail.PreviewProps = {
  companyName: "Tallgrass Bright Energy",
  label: "P-1001 v1",
  code: "482913",
  minutes: 10,
  proposalUrl: "http://localhost:3000/p/preview-token",
} satisfies SigningCodeEmailProps;

export default SigningCodeEmail;
