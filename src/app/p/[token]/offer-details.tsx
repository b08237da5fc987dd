"use client";
// One offer of the snapshot as the customer reads it: the system, production against their
// usage, the money (price, incentives, net cost, payment, deposit), the savings and the
// cumulative cash flow. Every figure comes from the frozen snapshot.
import { figureDefinitions, figureMeanings } from "@/lib/figure-definitions";
import { formatCents, formatCentsExact, formatSignedCents } from "@/lib/format";
import { formatAprPct } from "@/lib/plain-words";
import type { ProposalSnapshotOffer } from "@/lib/schemas/proposal";
import { CashflowChart, UsageProductionChart } from "./charts";

const kwh = (x: number) => `${Math.round(x).toLocaleString("en-US")} kWh`;
/** Payback in years; none within the years the figures cover says how many years those are. */
export const paybackText = (y: number | null, years: number) => (y === null ? `more than ${years} years` : `${y.toFixed(1)} years`);
export const roiText = (r: number | null) => (r === null ? "—" : `${(r * 100).toFixed(0)} %`);
const sum = (xs: number[]) => xs.reduce((a, b) => a + b, 0);

/** One figure: its label, its value and, where given, a line on what it means. */
function Row({ label, value, strong = false, testId, meaning }: { label: string; value: string; strong?: boolean; testId?: string; meaning?: string }) {
  return (
    <div className={`flex items-baseline justify-between gap-3 py-1.5 ${strong ? "font-semibold" : ""}`}>
      <dt className={strong ? "" : "text-graphite-soft"}>
        {label}
        {meaning ? <span className="block text-xs font-normal text-graphite-soft">{meaning}</span> : null}
      </dt>
      <dd className="figure whitespace-nowrap text-right" data-testid={testId}>
        {value}
      </dd>
    </div>
  );
}

export function paymentText(o: ProposalSnapshotOffer): string {
  const p = o.inputs.payment;
  if (p.kind === "cash") return "Cash";
  return `Loan: ${formatAprPct(p.aprPct)} APR over ${p.termMonths} months${p.dealerFeePct > 0 ? `, ${p.dealerFeePct} % dealer fee` : ""}`;
}

/** What payback and ROI mean for this offer (and why there is no IRR, when there is none). */
function FigureMeanings({ offer }: { offer: ProposalSnapshotOffer }) {
  const d = figureDefinitions(offer.figures, offer.inputs.payment.kind);
  return (
    <ul className="mt-2 space-y-1 text-xs text-graphite-soft" data-testid={`figure-definitions-${offer.position}`}>
      <li>{d.payback}</li>
      <li>{d.roi}</li>
      {d.irr ? <li>{d.irr}</li> : null}
    </ul>
  );
}

export function OfferDetails({ offer, usageKwh }: { offer: ProposalSnapshotOffer; usageKwh: number[] }) {
  const f = offer.figures;
  const s = f.summary;
  const eq = offer.equipment;
  const billBefore = sum(f.monthly.billWithoutSolarCents);
  const billAfter = sum(f.monthly.billWithSolarCents);
  const means = figureMeanings(f.assumptions.years);
  return (
    <div className="space-y-5" data-testid={`offer-details-${offer.position}`}>
      <section aria-label="The system" className="card p-4">
        <h3 className="font-semibold">The system</h3>
        <p className="mt-1 text-sm">
          <span className="figure">{eq.moduleCount}</span> × {eq.module.manufacturer} {eq.module.model} (<span className="figure">{eq.module.stcWatts} W</span>) ={" "}
          <span className="figure font-semibold">{s.kwDc.toFixed(2)} kW DC</span>
        </p>
        <p className="text-sm">
          {eq.inverter.manufacturer} {eq.inverter.model}, {eq.inverter.kind === "micro" ? "microinverters (one per module group)" : `${(eq.inverter.acWatts / 1000).toFixed(1)} kW string inverter`}
        </p>
        <ul className="mt-2 space-y-0.5 text-sm text-graphite-soft">
          {eq.faces.map((face) => (
            <li key={face.name}>
              {face.name}: <span className="figure">{face.moduleCount}</span> modules, tilt <span className="figure">{face.tiltDeg}°</span>, facing{" "}
              <span className="figure">{face.azimuthDeg}°</span>, <span className="figure">{face.solarAccessPct} %</span> sun after shading
            </li>
          ))}
        </ul>
        <dl className="mt-3 divide-y divide-paper-line text-sm">
          <Row label="Estimated production, year 1" value={kwh(s.annualProductionKwh)} meaning={means.production} />
          <Row label="Your usage, a year" value={kwh(sum(usageKwh))} meaning={means.usage} />
          <Row label="Share of your usage covered" value={`${s.offsetPct.toFixed(0)} %`} meaning={means.offset} />
        </dl>
        <div className="mt-3">
          <UsageProductionChart usageKwh={usageKwh} productionKwh={f.monthly.productionKwh} />
        </div>
      </section>

      <section aria-label="The price" className="card p-4">
        <h3 className="font-semibold">The price</h3>
        <dl className="mt-2 divide-y divide-paper-line text-sm">
          {f.price.lines.map((l, i) => (
            <Row key={`${l.kind}-${l.id ?? i}`} label={`${l.label}${l.detail ? ` (${l.detail})` : ""}`} value={formatCents(l.amountCents)} />
          ))}
          <Row label="Price" value={formatCents(s.contractCents)} strong testId={`price-${offer.position}`} meaning={means.price} />
          {f.incentives.applied.map((a) => (
            <Row key={a.id} label={`${a.name} (${a.year === 0 ? "at signing" : `year ${a.year}`})`} value={`−${formatCents(a.amountCents)}`} />
          ))}
          <Row label="Net cost after incentives" value={formatCents(s.netCostCents)} strong meaning={means.netCost} />
          <Row label="Payment" value={paymentText(offer)} />
          {s.monthlyLoanPaymentCents !== null ? <Row label="Monthly loan payment" value={formatCents(s.monthlyLoanPaymentCents)} strong meaning={means.monthlyLoan} /> : null}
          <Row label="Deposit at signing" value={formatCentsExact(offer.depositCents)} meaning={means.deposit} />
        </dl>
      </section>

      <section aria-label="What it saves" className="card p-4">
        <h3 className="font-semibold">What it saves</h3>
        <dl className="mt-2 divide-y divide-paper-line text-sm">
          <Row label="Electricity bills, year 1, without solar" value={formatCents(billBefore)} meaning={means.billWithout} />
          <Row label="Electricity bills, year 1, with solar" value={formatCents(billAfter)} meaning={means.billWith} />
          <Row label="Savings in year 1" value={formatCents(s.year1SavingsCents)} strong meaning={means.year1Savings} />
          <Row label="Payback" value={paybackText(s.paybackYears, f.assumptions.years)} strong />
          <Row label="Simple return on investment" value={roiText(s.simpleRoi)} />
          <Row label={`Bill savings over ${f.assumptions.years} years`} value={formatCents(s.lifetimeSavingsCents)} meaning={means.lifetimeSavings} />
          <Row label={`Ahead after ${f.assumptions.years} years`} value={formatSignedCents(s.lifetimeNetCents)} meaning={means.ahead} />
        </dl>
        <FigureMeanings offer={offer} />
        <div className="mt-3">
          <CashflowChart cumulativeCents={f.rows.map((r) => r.cumulativeCents)} />
        </div>
      </section>
    </div>
  );
}
