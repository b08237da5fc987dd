import { EmailLayout, Paragraph } from "./components/layout";

export interface DiscountRequestEmailProps {
  repName: string;
  householdName: string;
  offerName: string;
  /** Money already formatted, e.g. "$1,500". */
  discount: string;
  limit: string;
  contractBefore: string;
  reason: string;
  reviewUrl: string;
}

export function DiscountRequestEmail({ repName, householdName, offerName, discount, limit, contractBefore, reason, reviewUrl }: DiscountRequestEmailProps) {
  return (
    <EmailLayout
      preview={`${repName} asks for a ${discount} discount for the ${householdName}`}
      heading={`Discount to review: ${discount} for the ${householdName}`}
      action={{ label: "Review the discount", href: reviewUrl }}
      note={<>Grant or decline it on the deal&apos;s Offers tab. The offer keeps showing the discount as pending until you decide.</>}
    >
      <Paragraph>
        {repName} offered a discount of <strong>{discount}</strong> on &ldquo;{offerName}&rdquo; (price before discount {contractBefore}). Their limit without approval is {limit}.
      </Paragraph>
      <Paragraph>Reason given: {reason || "none"}</Paragraph>
    </EmailLayout>
  );
}

DiscountRequestEmail.PreviewProps = {
  repName: "Tobias Wren",
  householdName: "Calloway household",
  offerName: "Full roof, cash",
  discount: "$1,500",
  limit: "$500",
  contractBefore: "$24,180",
  reason: "Neighbour referral; matching a competing offer",
  reviewUrl: "http://localhost:3000/deals/7a11a55e-0000-4000-8000-000000000303/offers",
} satisfies DiscountRequestEmailProps;

export default DiscountRequestEmail;
