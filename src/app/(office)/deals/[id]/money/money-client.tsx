"use client";
// The deal's Money tab: the deposit's ledger rows with the provider's ids, refunds with their
// reasons, and the office's actions (refund, re-send the receipt).
import { zodResolver } from "@hookform/resolvers/zod";
import { useMutation } from "@tanstack/react-query";
import Link from "next/link";
import { useRouter } from "next/navigation";
import { useEffect, useState } from "react";
import { useForm } from "react-hook-form";
import type { PaymentStatus } from "@/lib/enums";
import { FormMessage } from "@/components/ui/field";
import { api, ApiError } from "@/lib/api-client";
import { applyFieldErrors } from "@/lib/form-errors";
import { dollarsToCents, refundPaymentSchema, type RefundPaymentInput } from "./refund-schema";

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

const STATUS: Record<PaymentStatus, { label: string; tone: string }> = {
  open: { label: "Checkout open", tone: "bg-paper-deep text-graphite" },
  paid: { label: "Paid", tone: "bg-sage-light text-graphite" },
  failed: { label: "Card failed", tone: "bg-danger-light text-danger" },
  expired: { label: "Checkout expired", tone: "bg-paper-deep text-graphite-soft" },
  flagged: { label: "Flagged: check it", tone: "bg-caution-light text-caution" },
  refunded: { label: "Refunded", tone: "bg-slate-light text-slate-usage" },
  partially_refunded: { label: "Partly refunded", tone: "bg-slate-light text-slate-usage" },
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
        <span className={`rounded-full px-3 py-1 text-sm font-medium ${s.tone}`} data-testid="payment-status">
          {s.label}
        </span>
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
        <div className="mt-4 overflow-x-auto">
          <table className="w-full min-w-[640px] text-left text-sm">
            <caption className="mb-1 text-left font-medium">Refunds</caption>
            <thead className="bg-paper-deep text-xs uppercase tracking-wide text-graphite-soft">
              <tr>
                <th scope="col" className="px-3 py-2">When</th>
                <th scope="col" className="px-3 py-2">Amount</th>
                <th scope="col" className="px-3 py-2">Reason</th>
                <th scope="col" className="px-3 py-2">By</th>
                <th scope="col" className="px-3 py-2">State</th>
                <th scope="col" className="px-3 py-2">Refund id</th>
              </tr>
            </thead>
            <tbody className="divide-y divide-paper-line">
              {p.refunds.map((r) => (
                <tr key={r.id} data-testid={`refund-${r.stripeRefundId}`}>
                  <td className="px-3 py-2">{r.createdAtText}</td>
                  <td className="figure px-3 py-2">{r.amountText}</td>
                  <td className="px-3 py-2">{r.reason}</td>
                  <td className="px-3 py-2">{r.byName ?? "Payment provider"}</td>
                  <td className="px-3 py-2">{r.status}</td>
                  <td className="figure px-3 py-2 text-xs">{r.stripeRefundId}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      ) : null}
      <div className="mt-4 flex flex-wrap items-start gap-4">
        {RECEIPT_STATUSES.includes(p.status) ? <ResendReceipt paymentId={p.id} /> : null}
        {canRefund && p.refundableCents > 0 ? <RefundForm p={p} /> : null}
      </div>
    </section>
  );
}

function ResendReceipt({ paymentId }: { paymentId: string }) {
  const resend = useMutation({ mutationFn: () => api<{ to: string }>(`/api/payments/${paymentId}/receipt`, { method: "POST" }) });
  return (
    <div className="space-y-2">
      <button type="button" className="btn-quiet" onClick={() => resend.mutate()} disabled={resend.isPending}>
        {resend.isPending ? "Sending…" : "Re-send receipt"}
      </button>
      {resend.isSuccess ? <FormMessage tone="success">Receipt sent to {resend.data.to}.</FormMessage> : null}
      {resend.isError ? <FormMessage tone="error">{resend.error.message}</FormMessage> : null}
    </div>
  );
}

function RefundForm({ p }: { p: PaymentView }) {
  const router = useRouter();
  const [open, setOpen] = useState(false);
  const [done, setDone] = useState<string | null>(null);
  const form = useForm<RefundPaymentInput>({ resolver: zodResolver(refundPaymentSchema), defaultValues: { reason: "" } });
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
  const refund = useMutation({
    mutationFn: (input: RefundPaymentInput) => api<{ amountCents: number }>(`/api/payments/${p.id}/refunds`, { method: "POST", json: input }),
    onSuccess: () => {
      setDone("Refund sent to the payment provider and recorded.");
      form.reset({ reason: "" });
      setAmountText("");
      setOpen(false);
      router.refresh();
    },
    onError: (err) => {
      if (err instanceof ApiError) applyFieldErrors(err.fields, form.setError);
    },
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
      onSubmit={form.handleSubmit((input) => refund.mutate(input))}
      noValidate
    >
      <p className="text-sm">
        Up to <span className="figure font-semibold">{p.refundableText}</span> can be refunded. The money goes back to the customer&apos;s card, and they receive an e-mail with the
        reason.
      </p>
      <div>
        <label htmlFor={`refund-amount-${p.id}`} className="field-label">
          Amount (USD)
        </label>
        <div className="flex gap-2">
          <input
            id={`refund-amount-${p.id}`}
            className="field-input figure"
            inputMode="decimal"
            placeholder="250.00"
            aria-invalid={errors.amountCents ? true : undefined}
            aria-describedby={errors.amountCents ? `refund-amount-${p.id}-error` : undefined}
            value={amountText}
            onChange={(e) => setAmount(e.target.value)}
          />
          <button
            type="button"
            className="btn-quiet shrink-0"
            onClick={() => setAmount((p.refundableCents / 100).toFixed(2))}
          >
            All of it
          </button>
        </div>
        {errors.amountCents ? (
          <p id={`refund-amount-${p.id}-error`} className="field-error" role="alert">
            {errors.amountCents.message}
          </p>
        ) : null}
      </div>
      <div>
        <label htmlFor={`refund-reason-${p.id}`} className="field-label">
          Reason (the customer sees it)
        </label>
        <input
          id={`refund-reason-${p.id}`}
          className="field-input"
          aria-invalid={errors.reason ? true : undefined}
          aria-describedby={errors.reason ? `refund-reason-${p.id}-error` : undefined}
          {...form.register("reason")}
        />
        {errors.reason ? (
          <p id={`refund-reason-${p.id}-error`} className="field-error" role="alert">
            {errors.reason.message}
          </p>
        ) : null}
      </div>
      {refund.isError && !(refund.error instanceof ApiError && refund.error.fields) ? <FormMessage tone="error">{refund.error.message}</FormMessage> : null}
      <div className="flex gap-2">
        <button type="submit" className="btn-danger" disabled={refund.isPending}>
          {refund.isPending ? "Refunding…" : "Refund"}
        </button>
        <button type="button" className="btn-quiet" onClick={() => setOpen(false)} disabled={refund.isPending}>
          Don&apos;t refund
        </button>
      </div>
    </form>
  );
}
