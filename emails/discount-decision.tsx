import { EmailLayout, Paragraph } from "./components/layout";

export interface DiscountDecisionEmailProps {
  deciderName: string;
  householdName: string;
  offerName: string;
  discount: string;
  approved: boolean;
  note: string;
  offersUrl: string;
}

export function DiscountDecisionEmail({ deciderName, householdName, offerName, discount, approved, note, offersUrl }: DiscountDecisionEmailProps) {
  const verdict = approved ? "approved" : "declined";
  return (
    <EmailLayout
      preview={`Your ${discount} discount for the ${householdName} was ${verdict}`}
      heading={`Discount ${verdict}: ${discount} for the ${householdName}`}
      action={{ label: "Open the offers", href: offersUrl }}
    >
      <Paragraph>
        {deciderName} {verdict} the {discount} discount on &ldquo;{offerName}&rdquo;.
        {approved ? " The offer can go into a proposal with it." : " The offer is priced again without the discount."}
      </Paragraph>
      {note ? <Paragraph>Note: {note}</Paragraph> : null}
    </EmailLayout>
  );
}

DiscountDecisionEmail.PreviewProps = {
  deciderName: "Priya Castellanos",
  householdName: "Calloway household",
  offerName: "Full roof, cash",
  discount: "$1,500",
  approved: true,
  note: "Fine for a referral this month.",
  offersUrl: "http://localhost:3000/deals/7a11a55e-0000-4000-8000-000000000303/offers",
} satisfies DiscountDecisionEmailProps;

export default DiscountDecisionEmail;
