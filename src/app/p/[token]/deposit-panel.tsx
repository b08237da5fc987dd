// The deposit on the customer's page, after signing: what is due, the Pay button, and the
// payment's state as the provider's webhook set it (src/server/payments/).
import { depositForProposal } from "@/server/payments";
import { findProposalByToken } from "@/server/proposals";
import { DepositPanelClient } from "./deposit-panel-client";

export async function DepositPanel({ token }: { token: string }) {
  const p = await findProposalByToken(token);
  if (!p) return null;
  const deposit = await depositForProposal(p);
  if (!deposit) return null;
  return <DepositPanelClient token={token} initial={deposit} companyName={p.snapshot.company.name} />;
}
