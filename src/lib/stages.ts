import type { Stage } from "@/lib/enums";

/** The stage names people read on the board, the deals table and the timeline. */
export const STAGE_LABELS: Record<Stage, string> = {
  lead: "Lead",
  bills_in: "Bills in",
  designing: "Designing",
  proposal_out: "Proposal out",
  signed: "Signed",
  deposit_paid: "Deposit paid",
  survey: "Survey",
  permitting: "Permitting",
  install_booked: "Install booked",
  installed: "Installed",
  inspected: "Inspected",
  live: "Live (PTO)",
  on_hold: "On hold",
  lost: "Lost",
  cancelled: "Cancelled",
};
