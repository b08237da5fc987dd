/** The tabs of a deal room, in the order a deal moves through them. */
export const DEAL_TABS = [
  { segment: "", label: "Household" },
  { segment: "energy", label: "Energy" },
  { segment: "design", label: "Design" },
  { segment: "offers", label: "Offers" },
  { segment: "proposal", label: "Proposal" },
  { segment: "money", label: "Money" },
  { segment: "timeline", label: "Timeline" },
] as const;
