"use client";
// The deal's Money tab: the deposit's ledger rows with the provider's ids, refunds with their
// reasons, and the office's actions (refund, re-send the receipt).
import { zodResolver } from "@hookform/resolvers/zod";
import Link from "next/link";
import { useEffect, useState } from "react";
import { useForm } from "react-hook-form";
import type { PaymentStatus } from "@/lib/enums";
import { Badge, type BadgeTone } from "@/components/ui/badge";
import { Field, FormMessage, SaveRow, StatusMessage } from "@/components/ui/field";
import { TableShell, Td, Th } from "@/components/ui/table";
import { useSave } from "@/components/ui/use-save";
import { dollarsToCents, refundPaymentSchema, type RefundPaymentInput } from "@/lib/schemas/refund";
import { plainError, type FieldLabels } from "@/lib/validation-messages";

const REFUND_COLUMNS = ["When", "Amount", "Reason", "By", "State", "Refund id"];

export type RefundView = { id: string; amountText: string; reason: string; status: string; stripeRefundId: string; byName: string | null; createdAtText: string };
export type PaymentView = {
  id: string;
  status: PaymentStatus;
  proposalLabel: string;
  amountText: string;
  paidText: string | null;
  refundedText: string;
  refundableCents: number;
  refundableText: string;
  paidAtText: string | null;
  createdAtText: string;
  checkoutSessionId: string;
  paymentIntentId: string | null;
  chargeId: string | null;
  flagReason: string | null;
  failureMessage: string | null;
  refunds: RefundView[];
};

const STATUS: Record<PaymentStatus, { label: string; tone: BadgeTone }> = {
  open: { label: "Checkout open", tone: "neutral" },
  paid: { label: "Paid", tone: "success" },
  failed: { label: "Card failed", tone: "danger" },
  expired: { label: "Checkout expired", tone: "neutral" },
  flagged: { label: "Flagged: check it", tone: "caution" },
  refunded: { label: "Refunded", tone: "usage" },
  partially_refunded: { label: "Partly refunded", tone: "usage" },
};
const RECEIPT_STATUSES: PaymentStatus[] = ["paid", "partially_refunded", "refunded"];

export function MoneyClient({ payments, canRefund, canReconcile }: { payments: PaymentView[]; canRefund: boolean; canReconcile: boolean }) {
  return (
    <div className="space-y-6">
      <div className="flex flex-wrap items-baseline justify-between gap-3">
        <h2 className="text-lg font-semibold">Deposit and refunds</h2>
        {canReconcile ? (
          <Link href="/money/reconciliation" className="text-sm text-copper underline-offset-2 hover:underline">
            Compare the ledger with the payment provider →
          </Link>
        ) : null}
      </div>
      {payments.length === 0 ? (
        <p className="text-graphite-soft" data-testid="money-empty">
          No deposit yet. Once the customer signs, their proposal page offers the deposit, and each checkout and payment shows here.
        </p>
      ) : (
        payments.map((p) => <PaymentCard key={p.id} p={p} canRefund={canRefund} />)
      )}
    </div>
  );
}

function Id({ label, value }: { label: string; value: string | null }) {
  return (
    <>
      <dt className="text-graphite-soft">{label}</dt>
      <dd className="figure break-all text-xs leading-6">{value ?? "—"}</dd>
    </>
  );
}

function PaymentCard({ p, canRefund }: { p: PaymentView; canRefund: boolean }) {
  const s = STATUS[p.status];
  return (
    <section className="card p-4" aria-label={`Deposit for proposal ${p.proposalLabel}`} data-testid={`payment-${p.id}`}>
      <header className="flex flex-wrap items-center justify-between gap-2">
        <h3 className="font-semibold">
          Deposit · proposal <span className="figure">{p.proposalLabel}</span>
        </h3>
        <Badge tone={s.tone} size="md" testId="payment-status">
          {s.label}
        </Badge>
      </header>
      {p.flagReason ? (
        <div className="mt-3">
          <FormMessage tone="error">
            <strong>Flagged, not booked.</strong> {p.flagReason}
          </FormMessage>
        </div>
      ) : null}
      {p.status === "failed" && p.failureMessage ? <p className="mt-3 text-sm text-danger">Last card attempt: {p.failureMessage}</p> : null}
      <div className="mt-3 grid gap-4 md:grid-cols-2">
        <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-sm">
          <dt className="text-graphite-soft">Asked</dt>
          <dd className="figure">{p.amountText}</dd>
          <dt className="text-graphite-soft">Paid</dt>
          <dd className="figure" data-testid="payment-paid">
            {p.paidText ? `${p.paidText} · ${p.paidAtText ?? ""}` : "—"}
          </dd>
          <dt className="text-graphite-soft">Refunded</dt>
          <dd className="figure" data-testid="payment-refunded">
            {p.refundedText}
          </dd>
          <dt className="text-graphite-soft">Checkout started</dt>
          <dd>{p.createdAtText}</dd>
        </dl>
        <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-sm">
          <Id label="Checkout Session" value={p.checkoutSessionId} />
          <Id label="PaymentIntent" value={p.paymentIntentId} />
          <Id label="Charge" value={p.chargeId} />
        </dl>
      </div>
      {p.refunds.length > 0 ? (
        <>
          <p className="mb-1 mt-4 font-medium">Refunds</p>
          <TableShell
            label="Refunds"
            minWidth={640}
            head={REFUND_COLUMNS.map((c) => (
              <Th key={c}>{c}</Th>
            ))}
          >
            {p.refunds.map((r) => (
              <tr key={r.id} data-testid={`refund-${r.stripeRefundId}`}>
                <Td>{r.createdAtText}</Td>
                <Td className="figure">{r.amountText}</Td>
                <Td>{r.reason}</Td>
                <Td>{r.byName ?? "Payment provider"}</Td>
                <Td>{r.status}</Td>
                <Td className="figure text-xs">{r.stripeRefundId}</Td>
              </tr>
            ))}
          </TableShell>
        </>
      ) : null}
      <div className="mt-4 flex flex-wrap items-start gap-4">
        {RECEIPT_STATUSES.includes(p.status) ? <ResendReceipt paymentId={p.id} /> : null}
        {canRefund && p.refundableCents > 0 ? <RefundForm p={p} /> : null}
      </div>
    </section>
  );
}

function ResendReceipt({ paymentId }: { paymentId: string }) {
  const resend = useSave<void, { to: string }>({
    request: () => ({ url: `/api/payments/${paymentId}/receipt`, method: "POST" }),
    refresh: false,
    success: ({ to }) => `Receipt sent to ${to}.`,
  });
  return (
    <div className="space-y-2">
      <button type="button" className="btn-quiet" onClick={() => resend.save()} disabled={resend.pending}>
        {resend.pending ? "Sending…" : "Re-send receipt"}
      </button>
      <StatusMessage notice={resend.notice} />
    </div>
  );
}

/** The refund form's labels, for the messages that name a field (src/lib/validation-messages.ts). */
const REFUND_LABELS: FieldLabels = { amountCents: "Amount (USD)", reason: "Reason (the customer sees it)" };

/** The refund form's state: amount typed in dollars, held in cents; closes the form once the refund is recorded. */
function useRefund(p: PaymentView, onRefunded: () => void) {
  const form = useForm<RefundPaymentInput>({ resolver: zodResolver(refundPaymentSchema, { error: plainError(REFUND_LABELS) }), defaultValues: { reason: "" } });
  const { errors } = form.formState;
  // The person types dollars; the form (and the server) hold integer cents.
  const [amountText, setAmountText] = useState("");
  useEffect(() => {
    form.register("amountCents");
  }, [form]);
  const setAmount = (text: string) => {
    setAmountText(text);
    form.setValue("amountCents", dollarsToCents(text), { shouldValidate: form.formState.isSubmitted });
  };
  const refund = useSave<RefundPaymentInput, { amountCents: number }, RefundPaymentInput>({
    request: (json) => ({ url: `/api/payments/${p.id}/refunds`, method: "POST", json }),
    setError: form.setError,
    labels: REFUND_LABELS,
    onSaved: () => {
      form.reset({ reason: "" });
      setAmountText("");
      onRefunded();
    },
  });
  return { form, errors, amountText, setAmount, refund };
}

function RefundForm({ p }: { p: PaymentView }) {
  const [open, setOpen] = useState(false);
  const [done, setDone] = useState<string | null>(null);
  const { form, errors, amountText, setAmount, refund } = useRefund(p, () => {
    setDone("Refund sent to the payment provider and recorded.");
    setOpen(false);
  });

  if (!open) {
    return (
      <div className="space-y-2">
        <button
          type="button"
          className="btn-danger"
          onClick={() => {
            setDone(null);
            setOpen(true);
          }}
        >
          Refund…
        </button>
        {done ? <FormMessage tone="success">{done}</FormMessage> : null}
      </div>
    );
  }
  return (
    <form
      className="w-full max-w-md space-y-3 rounded-md border border-danger/30 p-3"
      aria-label="Refund this deposit"
      onSubmit={form.handleSubmit(refund.saveAndWait, refund.invalid)}
      noValidate
    >
      <p className="text-sm">
        Up to <span className="figure font-semibold">{p.refundableText}</span> can be refunded. The money goes back to the customer&apos;s card, and they receive an e-mail with the
        reason.
      </p>
      <div className="flex items-end gap-2">
        <Field
          id={`refund-amount-${p.id}`}
          label="Amount (USD)"
          className="flex-1"
          inputClassName="figure"
          inputMode="decimal"
          placeholder="250.00"
          error={errors.amountCents?.message}
          value={amountText}
          onChange={(e) => setAmount(e.target.value)}
        />
        <button type="button" className="btn-quiet mb-px shrink-0" onClick={() => setAmount((p.refundableCents / 100).toFixed(2))}>
          All of it
        </button>
      </div>
      <Field id={`refund-reason-${p.id}`} label="Reason (the customer sees it)" error={errors.reason?.message} {...form.register("reason")} />
      <SaveRow notice={refund.notice}>
        <button type="submit" className="btn-danger" disabled={refund.pending}>
          {refund.pending ? "Refunding…" : "Refund"}
        </button>
        <button type="button" className="btn-quiet" onClick={() => setOpen(false)} disabled={refund.pending}>
          Don&apos;t refund
        </button>
      </SaveRow>
    </form>
  );
}
