import type { Metadata } from "next";
import Link from "next/link";
import { FormMessage } from "@/components/ui/field";
import { TableShell, Td, Th } from "@/components/ui/table";
import { NoAccess } from "@/components/no-access";
import { formatCentsExact, formatDateTime } from "@/lib/format";
import { can } from "@/lib/permissions";
import { HttpError } from "@/server/errors";
import { listPaymentAlerts, reconcileLedger, type PaymentAlertRow, type Reconciliation, type ReconciliationDifference } from "@/server/payments";
import { getCompanySettings } from "@/server/company-settings";
import { getMember } from "@/server/session";

export const metadata: Metadata = { title: "Reconciliation" };
export const dynamic = "force-dynamic";

const KIND_LABELS: Record<ReconciliationDifference["kind"], string> = {
  missing_in_ledger: "At the provider, not in the ledger",
  missing_at_provider: "In the ledger, not at the provider",
  amount: "Amounts differ",
  state: "States differ",
};
const KIND_ORDER: ReconciliationDifference["kind"][] = ["missing_in_ledger", "missing_at_provider", "amount", "state"];

export default async function ReconciliationPage() {
  const member = await getMember();
  if (!member) return null;
  if (!can(member.role, "payments:reconcile")) return <NoAccess section="Money → Reconciliation" />;
  const [alerts, { timeZone }] = await Promise.all([listPaymentAlerts(member), getCompanySettings(member.companyId)]);
  let result: Reconciliation | null = null;
  let problem: string | null = null;
  try {
    result = await reconcileLedger(member);
  } catch (err) {
    if (!(err instanceof HttpError)) throw err;
    problem = err.message;
  }
  return (
    <>
      <p className="text-sm text-graphite-soft">Money</p>
      <h1 className="text-2xl font-semibold">Reconciliation</h1>
      <p className="mt-1 max-w-3xl text-graphite-soft">
        The deposit ledger of {member.companyName} compared with the payment provider&apos;s own list of Checkout Sessions and refunds. A difference usually means a webhook has
        not landed yet, or money moved outside Kilowright; open the deal&apos;s Money tab to see the payment.
      </p>
      <Alerts alerts={alerts} timeZone={timeZone} />
      {problem ? (
        <div className="mt-6">
          <FormMessage tone="error">{problem}</FormMessage>
        </div>
      ) : result ? (
        <Result r={result} timeZone={timeZone} />
      ) : null}
    </>
  );
}

function Result({ r, timeZone }: { r: Reconciliation; timeZone: string }) {
  return (
    <div className="mt-6 space-y-6">
      <div className="flex flex-wrap items-center gap-4">
        <dl className="grid grid-cols-2 gap-x-6 gap-y-1 text-sm sm:grid-cols-4" data-testid="reconciliation-counts">
          <dt className="text-graphite-soft">Ledger payments</dt>
          <dd className="figure">{r.counts.ledgerPayments}</dd>
          <dt className="text-graphite-soft">Provider sessions</dt>
          <dd className="figure">{r.counts.providerSessions}</dd>
          <dt className="text-graphite-soft">Ledger refunds</dt>
          <dd className="figure">{r.counts.ledgerRefunds}</dd>
          <dt className="text-graphite-soft">Provider refunds</dt>
          <dd className="figure">{r.counts.providerRefunds}</dd>
        </dl>
        <Link href="/money/reconciliation" className="btn-quiet" prefetch={false}>
          Check again
        </Link>
      </div>
      <p className="text-sm text-graphite-soft">Checked {formatDateTime(r.checkedAt, timeZone)}.</p>
      {r.demoRowsSkipped > 0 ? (
        <p className="text-sm text-graphite-soft">
          {r.demoRowsSkipped} demo ledger row{r.demoRowsSkipped === 1 ? "" : "s"} written by the demo seed (payments with ids starting cs_test_demo, and their refunds) have
          no provider record and are not compared.
        </p>
      ) : null}
      {r.differences.length === 0 ? (
        <FormMessage tone="success">The ledger and the provider agree: every payment and refund matches in amount and state.</FormMessage>
      ) : (
        KIND_ORDER.map((kind) => {
          const rows = r.differences.filter((d) => d.kind === kind);
          if (rows.length === 0) return null;
          return (
            <section key={kind} aria-labelledby={`diff-${kind}`}>
              <h2 id={`diff-${kind}`} className="text-lg font-semibold">
                {KIND_LABELS[kind]} <span className="figure text-graphite-soft">({rows.length})</span>
              </h2>
              <TableShell
                className="mt-2"
                minWidth={760}
                head={["What", "Provider id", "Difference", "Deal"].map((c) => (
                  <Th key={c}>{c}</Th>
                ))}
              >
                {rows.map((d) => (
                  <tr key={`${d.object}-${d.providerId}-${d.kind}`} data-testid={`difference-${d.providerId}`}>
                    <Td>{d.object === "payment" ? "Payment" : "Refund"}</Td>
                    <Td className="figure text-xs">{d.providerId}</Td>
                    <Td>{d.detail}</Td>
                    <Td>
                      {d.dealId ? (
                        <Link href={`/deals/${d.dealId}/money`} className="link">
                          Money tab
                        </Link>
                      ) : (
                        "—"
                      )}
                    </Td>
                  </tr>
                ))}
              </TableShell>
            </section>
          );
        })
      )}
    </div>
  );
}

/** Refunds (and later other money) the provider reported that the ledger could not place. */
function Alerts({ alerts, timeZone }: { alerts: PaymentAlertRow[]; timeZone: string }) {
  if (alerts.length === 0) return null;
  return (
    <section aria-labelledby="payment-alerts" className="mt-6" data-testid="payment-alerts">
      <h2 id="payment-alerts" className="text-lg font-semibold">
        Refunds of payments the ledger does not know <span className="figure text-graphite-soft">({alerts.length})</span>
      </h2>
      <p className="text-sm text-graphite-soft">Money left the account at the provider for a payment Kilowright has no record of. Check it at the provider.</p>
      <ul className="mt-2 divide-y divide-paper-line rounded-card border border-paper-line bg-white text-sm">
        {alerts.map((a) => (
          <li key={a.id} className="px-3 py-2" data-testid={`payment-alert-${a.id}`}>
            <span className="figure">{a.amountCents === null ? "—" : formatCentsExact(a.amountCents)}</span> · <span className="figure text-xs">{a.chargeId ?? a.paymentIntentId ?? a.webhookEventId}</span> ·{" "}
            {formatDateTime(a.createdAt, timeZone)}
            <p className="text-graphite-soft">{a.detail}</p>
          </li>
        ))}
      </ul>
    </section>
  );
}
