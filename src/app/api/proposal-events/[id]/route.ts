import { getProposalEventOrThrow } from "@/server/proposals";
import { readById } from "@/server/route";

/** One event of a proposal (sent, opened, code sent, question…); reps only on their own deals. */
export const GET = readById("proposals:send", "Proposal event", getProposalEventOrThrow);
