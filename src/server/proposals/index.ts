import "server-only";
// Proposals: freezing a deal's offers into a numbered, versioned snapshot with its PDF, sending
// the link, revoking and re-sending it, what the customer's page records (opened, viewed,
// questions) and the right to cancel. Signing itself lives in src/server/signing.ts.
export { type ProposalRow, labelOf, tokenSchema, findProposalByToken, getProposalOrThrow, getProposalEventOrThrow, publicView } from "./rows";
export { type ProposalEventKind, insertProposalEvent, type ProposalEventView } from "./events";
export { type ProposalListItem, listProposalsForDeal } from "./list";
export { snapshotSourceFor, proposalUrl, dealProposalUrl, type SentProposal, sendProposal } from "./send";
export { revokeProposal, resendProposal } from "./revoke";
export { pdfFileName, readProposalPdf, pdfResponse } from "./files";
export { VIEW_THROTTLE_MS, recordProposalView, askQuestion } from "./customer-page";
export { type CancelOutcome, cancelSignedProposal, cancelWindowOf } from "./cancel";
export { withProposalToken } from "./public-routes";
// The caller's address comes from the connection (client-address.ts), never from their headers.
export { setProposalLocale } from "./language";
