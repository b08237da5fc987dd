"use client";
import { useRouter } from "next/navigation";
import { startTransition, useCallback, useEffect, useState } from "react";
import { FormMessage } from "@/components/ui/field";
import { useSave } from "@/components/ui/use-save";
import { api, ApiError } from "@/lib/api-client";
import type { CustomerDeposit } from "@/server/payments";

/** States in which the money has reached the company: nothing to wait for any more. */
const SETTLED = ["paid", "partially_refunded", "refunded", "flagged"];
/** How often, and how long, the page asks for the payment's state after the customer comes back. */
const POLL_EVERY_MS = 2_000;
const POLL_FOR_MS = 120_000;
/** After leaving checkout unpaid, a declined card's webhook may still be on its way: ask for a while. */
const POLL_AFTER_CANCEL_MS = 30_000;

/** What the redirect back from checkout said, if the page was opened by it. */
type Returned = "returned" | "cancelled" | null;

/**
 * The redirect back from checkout only says the customer came back: the page shows
 * "confirming" and asks the server until the provider's webhook has booked the payment.
 */
export function DepositPanelClient({ token, initial, companyName }: { token: string; initial: CustomerDeposit; companyName: string }) {
  const [deposit, setDeposit] = useState(initial);
  const [returned, setReturned] = useState<Returned>(null);
  const [paying, setPaying] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const [gaveUp, setGaveUp] = useState(false);
  const [quietDone, setQuietDone] = useState(false);
  // The button works only once this script runs (no dead press before the page is interactive).
  const [ready, setReady] = useState(false);
  const url = `/api/public/proposals/${encodeURIComponent(token)}/deposit`;

  useEffect(() => {
    const said = new URLSearchParams(window.location.search).get("deposit");
    if (said === "returned" || said === "cancelled") setReturned(said);
    setReady(true);
  }, []);

  const settled = SETTLED.includes(deposit.status);
  const waiting = returned === "returned" && !settled && !gaveUp;
  const quiet = returned === "cancelled" && deposit.status === "open" && !quietDone;
  const pollForMs = waiting ? POLL_FOR_MS : quiet ? POLL_AFTER_CANCEL_MS : 0;

  // Once the money is in, the rest of the page (the stage, the next step) follows in the same
  // commit: the new deposit state waits for the server's re-render, so the page never says
  // "Deposit received" beside "Pay your deposit".
  const router = useRouter();
  const apply = useCallback(
    (next: CustomerDeposit) => {
      if (!SETTLED.includes(next.status)) return setDeposit(next);
      startTransition(() => {
        setDeposit(next);
        router.refresh();
      });
    },
    [router],
  );
  usePollDeposit(url, pollForMs, apply, setGaveUp, setQuietDone);

  // Success leaves for the provider's page; "already paid" or "confirming" means wait for the webhook instead.
  const checkout = useSave<void, { url: string }>({
    request: () => ({ url, method: "POST" }),
    refresh: false,
    notify: (n) => setError(n?.tone === "error" ? n.text : null),
    onSaved: ({ url: checkoutUrl }) => {
      setPaying(true);
      window.location.assign(checkoutUrl);
    },
    onError: (err) => {
      if (err instanceof ApiError && (err.code === "already_paid" || err.code === "payment_confirming")) {
        setError(null);
        setReturned("returned");
        setGaveUp(false);
      }
    },
  });
  const pay = () => checkout.save();
  const busy = paying || checkout.pending;

  return (
    <section id="deposit-panel" aria-labelledby="deposit-heading" className="card scroll-mt-4 p-4" data-testid="deposit-panel">
      <h2 id="deposit-heading" className="text-lg font-semibold">
        Deposit
      </h2>
      <div className="mt-2" aria-live="polite" data-testid="deposit-status" data-status={!ready && !settled ? "loading" : waiting ? "confirming" : deposit.status}>
        {!ready && !settled ? (
          // Until the page knows whether the customer just came back from checkout, say nothing that may be stale.
          <p className="text-graphite-soft">Checking the deposit…</p>
        ) : waiting ? (
          <Confirming />
        ) : settled ? (
          <Settled deposit={deposit} companyName={companyName} />
        ) : !deposit.canPay ? null : (
          <PayDeposit deposit={deposit} companyName={companyName} returned={returned} gaveUp={gaveUp} error={error} ready={ready} busy={busy} onPay={pay} />
        )}
      </div>
    </section>
  );
}

function Confirming() {
  return (
    <p className="flex items-center gap-3" role="status">
      <span aria-hidden className="inline-block h-4 w-4 animate-spin rounded-full border-2 border-copper border-t-transparent" />
      Confirming your payment… This takes a few seconds; you can keep this page open.
    </p>
  );
}

function Settled({ deposit, companyName }: { deposit: CustomerDeposit; companyName: string }) {
  if (deposit.status === "flagged") {
    return (
      <FormMessage tone="info">
        <strong>Payment received.</strong> {companyName} is checking the amount ({deposit.paidText}) against the deposit asked ({deposit.amountText}) and will contact you.
      </FormMessage>
    );
  }
  return (
    <div className="rounded-md border border-sage/40 bg-sage-light px-3 py-3">
      <p className="font-semibold">Deposit received</p>
      <p className="mt-1">
        <span className="figure font-semibold">{deposit.paidText}</span>
        {deposit.paidOnText ? <> on {deposit.paidOnText}</> : null}. A receipt was e-mailed to you.
      </p>
      {deposit.refundedCents > 0 ? (
        <p className="mt-1 text-sm">
          {deposit.status === "refunded" ? "Refunded in full" : "Refunded so far"}: <span className="figure">{deposit.refundedText}</span>.
        </p>
      ) : null}
    </div>
  );
}

/** The deposit still to pay: why the last try did not go through, if it did not, and the button to the payment page. */
function PayDeposit({ deposit, companyName, returned, gaveUp, error, ready, busy, onPay: pay }: { deposit: CustomerDeposit; companyName: string; returned: Returned; gaveUp: boolean; error: string | null; ready: boolean; busy: boolean; onPay: () => void }) {
  return (
    <>
      {deposit.status === "failed" ? (
        <FormMessage tone="error">
          <strong>Your payment did not go through.</strong> {deposit.failureMessage} No money was taken. You can try again with the same or another card.
        </FormMessage>
      ) : null}
      {returned === "cancelled" && deposit.status !== "failed" ? (
        <FormMessage tone="info">You left the payment page before paying; nothing was charged. Pay whenever you are ready.</FormMessage>
      ) : null}
      {gaveUp ? (
        <FormMessage tone="info">
          We have not heard from the card processor yet. If you paid, your receipt will arrive by e-mail; reload this page later to see it here.
        </FormMessage>
      ) : null}
      <p className="mt-3">
        {companyName} asks for a deposit of <span className="figure text-xl font-semibold">{deposit.amountText}</span> to start the project. It counts toward the
        contract price.
      </p>
      <button type="button" className="btn-primary mt-3 w-full" onClick={pay} disabled={!ready || busy} aria-busy={busy}>
        {busy ? "Opening the payment page…" : deposit.status === "failed" ? `Try again: pay ${deposit.amountText}` : `Pay the deposit: ${deposit.amountText}`}
      </button>
      <p className="mt-2 text-xs text-graphite-soft">You pay by card on the payment provider&apos;s secure page and come back here afterwards.</p>
      {error ? (
        <div className="mt-3">
          <FormMessage tone="error">{error}</FormMessage>
        </div>
      ) : null}
    </>
  );
}

/**
 * Asks the server for the deposit every POLL_EVERY_MS for pollForMs (0: not at all); when the
 * time is up, gives up on a return from checkout, or stops the quiet watch after a cancel.
 */
function usePollDeposit(url: string, pollForMs: number, setDeposit: (d: CustomerDeposit) => void, setGaveUp: (v: boolean) => void, setQuietDone: (v: boolean) => void) {
  useEffect(() => {
    if (pollForMs === 0) return;
    const started = Date.now();
    let timer: ReturnType<typeof setTimeout> | undefined;
    let stopped = false;
    const tick = async () => {
      try {
        const next = await api<CustomerDeposit>(url, { cache: "no-store" });
        if (!stopped) setDeposit(next);
      } catch {
        // A dropped connection: keep asking until the time is up.
      }
      if (stopped) return;
      if (Date.now() - started <= pollForMs) timer = setTimeout(tick, POLL_EVERY_MS);
      else if (pollForMs === POLL_FOR_MS) setGaveUp(true);
      else setQuietDone(true);
    };
    timer = setTimeout(tick, 500);
    return () => {
      stopped = true;
      if (timer) clearTimeout(timer);
    };
  }, [pollForMs, url, setDeposit, setGaveUp, setQuietDone]);
}
