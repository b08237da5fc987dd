import "server-only";
// Deposits: the ledger of Checkout Sessions, payments and refunds (tables payment, refund).
// Money moves only through the Stripe SDK (src/server/stripe.ts); the ledger changes only in
// transactions, from the customer's Pay button, the signed webhooks (src/server/webhooks.ts)
// and the office's refunds. Amounts are integer cents.
export { type PaymentRow, type PaymentAlertRow, type RefundRow, DEPOSIT_CURRENCY, BOOKED_STATUSES, DEMO_SESSION_PREFIX, proposalLabelOf, depositCentsOf } from "./common";
export { startDepositCheckout, type CustomerDepositStatus, type CustomerDeposit, getDepositForCustomer, depositForProposal } from "./customer";
export { type AfterCommit, type PaymentRef, lockPaymentFor, type Reported, type LedgerOutcome, bookPayment, markPaymentFailed, markPaymentExpired, applyChargeRefunded } from "./ledger-events";
export { getPaymentOrThrow, getRefundOrThrow, type LedgerRefund, type LedgerPayment, listDealPayments } from "./office";
export { refundableCents, refundPayment, refundOnCancellation } from "./refunds";
export { sendDepositReceipt, resendDepositReceipt } from "./receipts";
export { listPaymentAlerts, getPaymentAlertOrThrow, type ReconciliationDifference, type Reconciliation, reconcileLedger } from "./reconciliation";
