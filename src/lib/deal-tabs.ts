/** The tabs of a deal room (PRODUCT.md, "Names"); Proposal and Money arrive with their features. */
export const DEAL_TABS = [
  { segment: "", label: "Household" },
  { segment: "energy", label: "Energy" },
  { segment: "design", label: "Design" },
  { segment: "offers", label: "Offers" },
  { segment: "timeline", label: "Timeline" },
] as const;
