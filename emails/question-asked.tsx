import { EmailLayout, Paragraph } from "./components/layout";

export interface QuestionAskedEmailProps {
  householdName: string;
  /** "P-1001 v2" */
  label: string;
  question: string;
  /** Where the customer can be reached (the address the proposal went to). */
  customerEmail: string;
  dealUrl: string;
}

export function QuestionAskedEmail({ householdName, label, question, customerEmail, dealUrl }: QuestionAskedEmailProps) {
  return (
    <EmailLayout
      preview={`The ${householdName} asked about ${label}`}
      heading={`A question from the ${householdName}`}
      action={{ label: "Open the deal's proposal", href: dealUrl }}
      note={<>Reply to this e-mail to answer: it goes to {customerEmail}. If the answer changes an offer, send a new version from the Proposal tab.</>}
    >
      <Paragraph>While reading proposal {label}, they asked:</Paragraph>
      <Paragraph>&ldquo;{question}&rdquo;</Paragraph>
    </EmailLayout>
  );
}

QuestionAskedEmail.PreviewProps = {
  householdName: "Dunmore household",
  label: "P-1002 v1",
  question: "Can the loan be paid off early without a fee?",
  customerEmail: "dunmore@homeowner.example",
  dealUrl: "http://localhost:3000/deals/7a11a55e-0000-4000-8000-000000000304/proposal",
} satisfies QuestionAskedEmailProps;

export default QuestionAskedEmail;
