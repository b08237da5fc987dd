"use client";
// The Offers tab: 1–3 offers side by side, each priced from the price book and computed by the
// server (never from figures typed here), the cumulative cash-flow chart, and discount requests.
import Link from "next/link";
import { useEffect, useState } from "react";
import { ConfirmButton } from "@/components/ui/dialog";
import { Field, FormMessage, SelectField, StatusMessage } from "@/components/ui/field";
import { MoneyInput } from "@/components/ui/number-input";
import { FitTable } from "@/components/ui/table";
import { useSave } from "@/components/ui/use-save";
import { fieldErrorsToErrors } from "@/lib/form-errors";
import { api, ApiError } from "@/lib/api-client";
import { formatCents } from "@/lib/format";
import { figureDefinitions, type FigureDefinitions } from "@/lib/figure-definitions";
import { describeExpectedInstall, OFFER_CAUTION, type OfferFigures } from "@/lib/offer-figures";
import { MAX_OFFERS_PER_DEAL, type OfferInputs, type OfferInputsInput } from "@/lib/schemas/offer";
import type { StaleInput } from "@/lib/offer-basis";
import { CashflowChart, OFFER_COLORS } from "./cashflow-chart";
import { OfferInputsStatus } from "./offer-inputs-status";

type DiscountStatus = "none" | "within_limit" | "pending" | "approved" | "declined";
/** The server's figures for the form's inputs before saving (POST /api/offers/preview). */
type Preview = Pick<OfferFigures, "summary" | "discountNeedsApproval" | "discountLimitCents" | "assumptions">;
/** How long typing must pause before the preview is figured again. */
const PREVIEW_DELAY_MS = 400;
type OfferView = { id: string; position: number; name: string; inputs: OfferInputs; results: OfferFigures; discountStatus: DiscountStatus; stale: StaleInput[] };
type DesignView = { faces: { id: string; name: string; usableSlots: number; moduleCount: number }[]; moduleId: string; inverterId: string };
type Option = { id: string; label: string };
/** A rate plan; `otherUtility` when it is not of the household's utility (needs a reason). */
type PlanOption = Option & { otherUtility: boolean };
type RequestView = { id: string; offerId: string; offerName: string; amountCents: number; reason: string; status: "pending" | "approved" | "declined"; requestedByName: string | null; decisionNote: string | null; createdAt: string };

type Props = {
  dealId: string;
  canEdit: boolean;
  canApprove: boolean;
  dealRatePlanId: string | null;
  offers: OfferView[];
  design: DesignView | null;
  adders: { id: string; name: string }[];
  lineItems: { id: string; name: string; amountCents: number }[];
  modules: Option[];
  inverters: Option[];
  ratePlans: PlanOption[];
  requests: RequestView[];
};

const STATUS_TEXT: Record<DiscountStatus, string> = {
  none: "",
  within_limit: "Discount within your limit",
  pending: "Discount waiting for the office's approval",
  approved: "Discount approved",
  declined: "Discount declined; priced without it",
};

const years = (y: number | null, horizon: number) => (y === null ? `not within ${horizon} years` : `${y.toFixed(1)} years`);
const optionsOf = (list: Option[]) => list.map((o) => ({ value: o.id, label: o.label }));
const pct = (r: number | null) => (r === null ? "—" : `${(r * 100).toFixed(0)} %`);

export function OffersClient(props: Props) {
  const { dealId, canEdit, canApprove, offers, design } = props;
  const [editing, setEditing] = useState<string | "new" | null>(null);

  if (!design) {
    return (
      <FormMessage tone="info">
        Offers are built on the deal&apos;s design. Lay out the roof on the{" "}
        <Link href={`/deals/${dealId}/design`} className="text-copper underline">
          Design tab
        </Link>{" "}
        and save it first.
      </FormMessage>
    );
  }

  const pending = props.requests.filter((r) => r.status === "pending");
  return (
    <div className="space-y-6">
      {!props.dealRatePlanId ? (
        <FormMessage tone="info">This deal has no rate plan yet, so bills cannot be estimated. Pick the household&apos;s rate plan in the offer form; it becomes the deal&apos;s.</FormMessage>
      ) : null}

      {pending.length > 0 ? (
        <section className="card p-4" aria-labelledby="requests-heading">
          <h2 id="requests-heading" className="text-lg font-semibold">
            Discounts waiting for approval
          </h2>
          <ul className="mt-3 space-y-3">
            {pending.map((r) => (
              <DiscountRequestItem key={r.id} request={r} canApprove={canApprove} />
            ))}
          </ul>
        </section>
      ) : null}

      {offers.length > 0 ? (
        <section className="card p-4" aria-labelledby="compare-heading">
          <h2 id="compare-heading" className="text-lg font-semibold">
            Side by side
          </h2>
          <Comparison offers={offers} />
          <div className="mt-6">
            <CashflowChart series={offers.map((o) => ({ name: o.name, cumulativeCents: o.results.rows.map((r) => r.cumulativeCents) }))} />
          </div>
          <p className="mt-3 rounded-md bg-caution-light px-3 py-2 text-sm">{OFFER_CAUTION}</p>
        </section>
      ) : (
        <p className="text-graphite-soft">No offers yet. Add up to {MAX_OFFERS_PER_DEAL} to compare them side by side.</p>
      )}

      <div className="grid gap-4 lg:grid-cols-3">
        {offers.map((o, i) =>
          editing === o.id ? (
            <OfferForm key={o.id} {...props} existing={o} onClose={() => setEditing(null)} />
          ) : (
            <OfferCard key={o.id} offer={o} color={OFFER_COLORS[i % OFFER_COLORS.length]} canEdit={canEdit} onEdit={() => setEditing(o.id)} />
          ),
        )}
        {editing === "new" ? <OfferForm {...props} existing={null} onClose={() => setEditing(null)} /> : null}
      </div>
      {canEdit && editing === null && offers.length < MAX_OFFERS_PER_DEAL ? (
        <button type="button" className="btn-primary" onClick={() => setEditing("new")}>
          Add an offer
        </button>
      ) : null}
    </div>
  );
}

function Comparison({ offers }: { offers: OfferView[] }) {
  const rows: { label: string; value: (o: OfferView) => string }[] = [
    { label: "System size", value: (o) => `${o.results.summary.kwDc.toFixed(2)} kW DC` },
    { label: "Year-1 production", value: (o) => `${Math.round(o.results.summary.annualProductionKwh).toLocaleString("en-US")} kWh (${o.results.summary.offsetPct.toFixed(0)} % offset)` },
    { label: "Price", value: (o) => formatCents(o.results.summary.contractCents) },
    { label: "Incentives", value: (o) => formatCents(o.results.summary.incentivesCents) },
    { label: "Net cost", value: (o) => formatCents(o.results.summary.netCostCents) },
    { label: "Down payment (year 0)", value: (o) => (o.results.summary.downPaymentCents == null ? "cash" : formatCents(o.results.summary.downPaymentCents)) },
    { label: "Loan amount", value: (o) => (o.results.summary.loanAmountCents == null ? "cash" : formatCents(o.results.summary.loanAmountCents)) },
    { label: "Monthly loan payment", value: (o) => (o.results.summary.monthlyLoanPaymentCents === null ? "cash" : formatCents(o.results.summary.monthlyLoanPaymentCents)) },
    { label: "Year-1 savings", value: (o) => formatCents(o.results.summary.year1SavingsCents) },
    { label: "Payback", value: (o) => years(o.results.summary.paybackYears, o.results.assumptions.years) },
    { label: "Simple ROI", value: (o) => pct(o.results.summary.simpleRoi) },
    { label: "Bill savings over the period", value: (o) => `${formatCents(o.results.summary.lifetimeSavingsCents)} in ${o.results.assumptions.years} years` },
  ];
  return (
    // Under 32rem the offers side by side are too squeezed: each figure becomes a card.
    <FitTable minWidth={512} frameClassName="mt-3" className="text-left text-sm" data-testid="offer-comparison">
      <thead>
        <tr className="border-b border-paper-line">
          <th scope="col" className="py-2 pr-3 font-medium text-graphite-soft">
            Figure
          </th>
          {offers.map((o, i) => (
            <th key={o.id} scope="col" className="py-2 pr-3 font-semibold">
              <span className="mr-1 inline-block h-3 w-3 rounded-sm align-middle" style={{ backgroundColor: OFFER_COLORS[i % OFFER_COLORS.length] }} aria-hidden />
              {o.name}
            </th>
          ))}
        </tr>
      </thead>
      <tbody>
        {rows.map((r) => (
          <tr key={r.label} className="border-b border-paper-line/60">
            <th scope="row" className="py-2 pr-3 font-normal text-graphite-soft">
              {r.label}
            </th>
            {offers.map((o) => (
              <td key={o.id} className="figure py-2 pr-3">
                {r.value(o)}
              </td>
            ))}
          </tr>
        ))}
      </tbody>
    </FitTable>
  );
}

function OfferCard({ offer, color, canEdit, onEdit }: { offer: OfferView; color: string; canEdit: boolean; onEdit: () => void }) {
  const remove = useSave<void>({ request: () => ({ url: `/api/offers/${offer.id}`, method: "DELETE" }) });
  const r = offer.results;
  const definitions = figureDefinitions(r, offer.inputs.payment.kind);
  return (
    <article className="card p-4" style={{ borderTop: `4px solid ${color}` }} aria-label={`Offer ${offer.name}`}>
      <h3 className="text-lg font-semibold">{offer.name}</h3>
      <p className="text-sm text-graphite-soft">
        {r.summary.moduleCount} modules · {r.summary.kwDc.toFixed(2)} kW DC · {offer.inputs.payment.kind === "cash" ? "cash" : `loan ${offer.inputs.payment.aprPct} % APR, ${offer.inputs.payment.termMonths} months`}
      </p>
      {r.summary.loanAmountCents != null ? (
        <p className="text-sm" data-testid="loan-terms">
          {formatCents(r.summary.downPaymentCents)} down at signing (year 0), {formatCents(r.summary.loanAmountCents)} borrowed
        </p>
      ) : null}
      <ul className="mt-3 space-y-1 text-sm">
        {r.price.lines.map((l, i) => (
          <li key={i} className="flex justify-between gap-2">
            <span>
              {l.label} <span className="text-xs text-graphite-soft">{l.detail}</span>
            </span>
            <span className="figure">{formatCents(l.amountCents)}</span>
          </li>
        ))}
        {r.incentives.applied.map((a) => (
          <li key={a.id} className="flex justify-between gap-2 text-sage">
            <span>
              {a.name} <span className="text-xs">{a.year === 0 ? "at signing" : `year ${a.year}`}</span>
            </span>
            <span className="figure">−{formatCents(a.amountCents)}</span>
          </li>
        ))}
      </ul>
      {r.assumptions.installDate ? (
        <p className="mt-2 text-xs text-graphite-soft" data-testid="install-date">
          Credits that count at installation assume it on {describeExpectedInstall(r.assumptions.installDate)}.
        </p>
      ) : null}
      {offer.discountStatus !== "none" ? (
        <p className={`mt-3 rounded px-2 py-1 text-sm ${offer.discountStatus === "pending" ? "bg-caution-light" : offer.discountStatus === "declined" ? "bg-danger-light" : "bg-sage-light"}`} data-testid="discount-status">
          {STATUS_TEXT[offer.discountStatus]}
        </p>
      ) : null}
      <OfferInputsStatus offer={offer} canEdit={canEdit} />
      <FigureMeanings figures={r} d={definitions} />
      <details className="mt-3 text-xs text-graphite-soft">
        <summary className="cursor-pointer">Assumptions and notes</summary>
        <ul className="mt-1 list-disc pl-4">
          <li>
            Rate plan {r.assumptions.ratePlanName}; bills rise {r.assumptions.utilityEscalationPctPerYear} %/yr; output falls {r.assumptions.degradationPctPerYear} %/yr; priced {r.asOf}.
          </li>
          {definitions.simplePayback ? <li>{definitions.simplePayback}</li> : null}
          {r.notes.map((n) => (
            <li key={n}>{n}</li>
          ))}
        </ul>
      </details>
      {canEdit ? (
        <div className="mt-4 flex gap-2">
          <button type="button" className="btn-quiet" onClick={onEdit}>
            Change
          </button>
          <ConfirmButton danger label="Delete" title={`Delete the offer “${offer.name}”?`} message="Its figures are gone; a proposal already sent keeps its own copy." confirmLabel="Delete the offer" disabled={remove.pending} onConfirm={() => remove.save()} />
        </div>
      ) : null}
      <StatusMessage notice={remove.notice} />
    </article>
  );
}

/** Payback, ROI and (when it has none) IRR beside what each means. */
function FigureMeanings({ figures: r, d }: { figures: OfferFigures; d: FigureDefinitions }) {
  const items: [string, string, string][] = [
    ["Payback", years(r.summary.paybackYears, r.assumptions.years), d.payback],
    ["Simple ROI", pct(r.summary.simpleRoi), d.roi],
    ...(d.irr ? ([["IRR", "—", d.irr]] as [string, string, string][]) : []),
  ];
  return (
    <dl className="mt-3 space-y-2 text-sm" data-testid="figure-definitions">
      {items.map(([label, value, meaning]) => (
        <div key={label}>
          <dt className="flex justify-between gap-2">
            <span>{label}</span>
            <span className="figure">{value}</span>
          </dt>
          <dd className="text-xs text-graphite-soft">{meaning}</dd>
        </div>
      ))}
    </dl>
  );
}

type FormState = {
  name: string;
  counts: Record<string, string>;
  moduleId: string;
  inverterId: string;
  adderIds: string[];
  lineItemIds: string[];
  discountDollars: string;
  discountReason: string;
  paymentKind: "cash" | "loan";
  aprPct: string;
  termMonths: string;
  dealerFeePct: string;
  /** Cents; null = the deposit asked at signing; NaN = not a number. */
  downPaymentCents: number | null;
  ratePlanId: string;
  ratePlanOverrideReason: string;
};

const toNumber = (s: string) => (s.trim() === "" ? Number.NaN : Number(s));

/** The form as it opens: the offer's saved inputs, or the design as laid out for a new one. */
function initialFormState(props: Props & { existing: OfferView | null }, faces: DesignView["faces"]): FormState {
  const { existing, design } = props;
  const i = existing?.inputs;
  return {
    name: i?.name ?? (props.offers.length === 0 ? "Design as laid out" : `Option ${props.offers.length + 1}`),
    counts: Object.fromEntries(faces.map((f) => [f.id, String(i?.faceCounts?.find((c) => c.faceId === f.id)?.moduleCount ?? f.moduleCount)])),
    moduleId: i?.moduleId ?? design?.moduleId ?? "",
    inverterId: i?.inverterId ?? design?.inverterId ?? "",
    adderIds: i?.adderIds ?? [],
    lineItemIds: i?.lineItemIds ?? [],
    discountDollars: i && i.discountCents > 0 ? String(i.discountCents / 100) : "",
    discountReason: i?.discountReason ?? "",
    paymentKind: i?.payment.kind ?? "cash",
    aprPct: i?.payment.kind === "loan" ? String(i.payment.aprPct) : "6.99",
    termMonths: i?.payment.kind === "loan" ? String(i.payment.termMonths) : "240",
    dealerFeePct: i?.payment.kind === "loan" ? String(i.payment.dealerFeePct) : "0",
    downPaymentCents: i?.payment.kind === "loan" ? i.payment.downPaymentCents : null,
    ratePlanId: i?.ratePlanId ?? props.dealRatePlanId ?? props.ratePlans.find((p) => !p.otherUtility)?.id ?? "",
    ratePlanOverrideReason: i?.ratePlanOverrideReason ?? "",
  };
}

/** The form's text as the inputs the server checks; what matches the design or the deal is sent as null. */
function formInputs(state: FormState, faces: DesignView["faces"], design: DesignView | null, dealRatePlanId: string | null): OfferInputsInput {
  const sameCounts = faces.every((f) => toNumber(state.counts[f.id] ?? "") === f.moduleCount);
  const dollars = state.discountDollars.trim() === "" ? 0 : toNumber(state.discountDollars);
  return {
    name: state.name,
    faceCounts: sameCounts ? null : faces.map((f) => ({ faceId: f.id, moduleCount: toNumber(state.counts[f.id] ?? "") })),
    moduleId: state.moduleId === design?.moduleId ? null : state.moduleId,
    inverterId: state.inverterId === design?.inverterId ? null : state.inverterId,
    adderIds: state.adderIds,
    lineItemIds: state.lineItemIds,
    discountCents: Math.round(dollars * 100),
    discountReason: state.discountReason,
    payment: state.paymentKind === "cash" ? { kind: "cash" } : { kind: "loan", aprPct: toNumber(state.aprPct), termMonths: toNumber(state.termMonths), dealerFeePct: toNumber(state.dealerFeePct), downPaymentCents: state.downPaymentCents },
    ratePlanId: state.ratePlanId === dealRatePlanId || state.ratePlanId === "" ? null : state.ratePlanId,
    ratePlanOverrideReason: state.ratePlanOverrideReason,
  };
}

/** The live preview: the same computation as a save, asked again whenever the inputs settle. */
function useOfferPreview(dealId: string, state: FormState, inputs: () => OfferInputsInput) {
  const [preview, setPreview] = useState<Preview | null>(null);
  const [previewError, setPreviewError] = useState<string | null>(null);
  const [previewBusy, setPreviewBusy] = useState(false);
  useEffect(() => {
    const controller = new AbortController();
    const timer = setTimeout(async () => {
      setPreviewBusy(true);
      try {
        const figures = await api<Preview>("/api/offers/preview", { method: "POST", json: { dealId, inputs: inputs() }, signal: controller.signal });
        if (controller.signal.aborted) return;
        setPreview(figures);
        setPreviewError(null);
      } catch (err) {
        if (controller.signal.aborted) return;
        setPreviewError(err instanceof ApiError ? err.message : "The preview could not be figured.");
      } finally {
        if (!controller.signal.aborted) setPreviewBusy(false);
      }
    }, PREVIEW_DELAY_MS);
    return () => {
      clearTimeout(timer);
      controller.abort();
    };
    // inputs() reads only `state` (and props that do not change while the form is open).
  }, [state]);
  return { preview, previewError, previewBusy };
}

function OfferForm(props: Props & { existing: OfferView | null; onClose: () => void }) {
  const { existing, design, dealId } = props;
  const faces = design?.faces ?? [];
  const [state, setState] = useState<FormState>(() => initialFormState(props, faces));
  const [fields, setFields] = useState<Record<string, string>>({});
  const save = useSave<OfferInputsInput>({
    request: (inputs) => (existing ? { url: `/api/offers/${existing.id}`, method: "PUT", json: { inputs } } : { url: "/api/offers", method: "POST", json: { dealId, inputs } }),
    fieldPrefix: "inputs.",
    onFieldErrors: (f) => setFields(fieldErrorsToErrors(f)),
    onSaved: () => props.onClose(),
  });
  const busy = save.pending;
  const set = (patch: Partial<FormState>) => setState((s) => ({ ...s, ...patch }));
  const inputs = () => formInputs(state, faces, design, props.dealRatePlanId);
  const { preview, previewError, previewBusy } = useOfferPreview(dealId, state, inputs);

  function submit(e: React.FormEvent) {
    e.preventDefault();
    // JSON has no NaN (it would arrive as "empty", the deposit): say so here.
    if (state.paymentKind === "loan" && Number.isNaN(state.downPaymentCents)) return setFields({ "payment.downPaymentCents": "Down payment must be a number" });
    setFields({});
    save.save(inputs());
  }

  const err = (k: string) => fields[k];
  return (
    <form className="card space-y-4 p-4 lg:col-span-3" onSubmit={submit} aria-label={existing ? `Change offer ${existing.name}` : "New offer"} noValidate>
      <h3 className="text-lg font-semibold">{existing ? `Change “${existing.name}”` : "New offer"}</h3>
      <div className="grid gap-4 sm:grid-cols-2 lg:grid-cols-3">
        <Field id="offer-name" label="Offer name" value={state.name} error={err("name")} onChange={(e) => set({ name: e.target.value })} />
        <SelectField id="offer-module" label="Module" value={state.moduleId} error={err("moduleId")} options={optionsOf(props.modules)} onChange={(e) => set({ moduleId: e.target.value })} />
        <SelectField id="offer-inverter" label="Inverter" value={state.inverterId} error={err("inverterId")} options={optionsOf(props.inverters)} onChange={(e) => set({ inverterId: e.target.value })} />
      </div>

      <FaceCountsFields faces={faces} state={state} set={set} err={err} />

      <ExtrasFields adders={props.adders} lineItems={props.lineItems} state={state} set={set} />

      <div className="grid gap-4 sm:grid-cols-2">
        <Field id="offer-discount" label="Discount ($)" value={state.discountDollars} error={err("discountCents")} inputMode="decimal" onChange={(e) => set({ discountDollars: e.target.value })} hint="Beyond your limit it goes to the office for approval." />
        <Field id="offer-discount-reason" label="Reason for the discount" value={state.discountReason} error={err("discountReason")} onChange={(e) => set({ discountReason: e.target.value })} />
      </div>

      <PaymentFields state={state} set={set} err={err} />

      <SelectField
        id="offer-rate-plan"
        className="max-w-md"
        label={`Rate plan ${props.dealRatePlanId ? "" : "(the deal has none yet)"}`}
        value={state.ratePlanId}
        error={err("ratePlanId")}
        options={[...(props.dealRatePlanId ? [] : [{ value: "", label: "Pick the household's rate plan" }]), ...optionsOf(props.ratePlans)]}
        onChange={(e) => set({ ratePlanId: e.target.value, ratePlanOverrideReason: "" })}
      />
      {props.ratePlans.find((p) => p.id === state.ratePlanId)?.otherUtility ? (
        <Field
          id="offer-rate-plan-reason"
          className="max-w-md"
          label="Why another utility's plan (kept on the Timeline)"
          value={state.ratePlanOverrideReason}
          error={err("ratePlanOverrideReason")}
          onChange={(e) => set({ ratePlanOverrideReason: e.target.value })}
        />
      ) : null}

      <OfferPreviewPanel preview={preview} error={previewError} busy={previewBusy} />

      <StatusMessage notice={save.notice} />
      <div className="flex gap-2">
        <button type="submit" className="btn-primary" disabled={busy}>
          {busy ? "Computing…" : existing ? "Save and compute" : "Create and compute"}
        </button>
        <button type="button" className="btn-quiet" onClick={props.onClose} disabled={busy}>
          Cancel
        </button>
      </div>
    </form>
  );
}

type FormParts = { state: FormState; set: (patch: Partial<FormState>) => void; err: (key: string) => string | undefined };

function FaceCountsFields({ faces, state, set, err }: FormParts & { faces: DesignView["faces"] }) {
  return (
    <fieldset>
      <legend className="field-label">Modules per roof face</legend>
      <div className="grid gap-3 sm:grid-cols-3">
        {faces.map((f, i) => (
          <Field
            key={f.id}
            id={`offer-face-${i + 1}`}
            label={`${f.name} (of ${f.usableSlots} slots)`}
            value={state.counts[f.id] ?? ""}
            error={err(`faceCounts.${i}.moduleCount`)}
            inputMode="numeric"
            onChange={(e) => set({ counts: { ...state.counts, [f.id]: e.target.value } })}
          />
        ))}
      </div>
      {err("faceCounts") ? <p className="field-error">{err("faceCounts")}</p> : null}
    </fieldset>
  );
}

const toggle = (list: string[], id: string) => (list.includes(id) ? list.filter((x) => x !== id) : [...list, id]);

function ExtrasFields({ adders, lineItems, state, set }: Omit<FormParts, "err"> & Pick<Props, "adders" | "lineItems">) {
  if (adders.length + lineItems.length === 0) return null;
  return (
    <fieldset>
      <legend className="field-label">Adders and line items</legend>
      <div className="grid gap-1 sm:grid-cols-2">
        {adders.map((a) => (
          <label key={a.id} className="flex min-h-touch items-center gap-2">
            <input type="checkbox" checked={state.adderIds.includes(a.id)} onChange={() => set({ adderIds: toggle(state.adderIds, a.id) })} />
            {a.name}
          </label>
        ))}
        {lineItems.map((l) => (
          <label key={l.id} className="flex min-h-touch items-center gap-2">
            <input type="checkbox" checked={state.lineItemIds.includes(l.id)} onChange={() => set({ lineItemIds: toggle(state.lineItemIds, l.id) })} />
            {l.name} <span className="figure text-sm text-graphite-soft">{formatCents(l.amountCents)}</span>
          </label>
        ))}
      </div>
    </fieldset>
  );
}

function PaymentFields({ state, set, err }: FormParts) {
  return (
    <fieldset>
      <legend className="field-label">Payment</legend>
      <div className="flex flex-wrap gap-4">
        <label className="flex min-h-touch items-center gap-2">
          <input type="radio" name="payment" checked={state.paymentKind === "cash"} onChange={() => set({ paymentKind: "cash" })} /> Cash
        </label>
        <label className="flex min-h-touch items-center gap-2">
          <input type="radio" name="payment" checked={state.paymentKind === "loan"} onChange={() => set({ paymentKind: "loan" })} /> Loan
        </label>
      </div>
      {state.paymentKind === "loan" ? (
        <div className="mt-2 grid gap-4 sm:grid-cols-2 lg:grid-cols-4">
          <Field id="offer-apr" label="APR (%)" value={state.aprPct} error={err("payment.aprPct")} inputMode="decimal" onChange={(e) => set({ aprPct: e.target.value })} />
          <Field id="offer-term" label="Term (months)" value={state.termMonths} error={err("payment.termMonths")} inputMode="numeric" onChange={(e) => set({ termMonths: e.target.value })} />
          <Field id="offer-dealer-fee" label="Dealer fee (%)" value={state.dealerFeePct} error={err("payment.dealerFeePct")} inputMode="decimal" onChange={(e) => set({ dealerFeePct: e.target.value })} />
          <MoneyInput
            id="offer-down-payment"
            label="Down payment ($; empty: the deposit)"
            value={state.downPaymentCents}
            error={err("payment.downPaymentCents")}
            onValue={(v) => set({ downPaymentCents: v })}
          />
        </div>
      ) : null}
    </fieldset>
  );
}

/** The figures of the inputs as they stand, before saving; nothing here is stored. */
function OfferPreviewPanel({ preview, error, busy }: { preview: Preview | null; error: string | null; busy: boolean }) {
  const f = preview?.summary;
  const items: [string, string][] = f
    ? [
        ["System", `${f.kwDc.toFixed(2)} kW · ${f.offsetPct.toFixed(0)} % offset`],
        ["Price", formatCents(f.contractCents)],
        ["Net cost", formatCents(f.netCostCents)],
        ["Year-1 savings", formatCents(f.year1SavingsCents)],
        ["Payback", years(f.paybackYears, preview.assumptions.years)],
        ...(f.monthlyLoanPaymentCents === null
          ? []
          : ([
              ["Down payment", formatCents(f.downPaymentCents)],
              ["Loan amount", formatCents(f.loanAmountCents)],
              ["Monthly loan payment", formatCents(f.monthlyLoanPaymentCents)],
            ] as [string, string][])),
      ]
    : [];
  return (
    <section aria-labelledby="offer-preview-heading" className="rounded-md border border-paper-line bg-paper-deep p-3 text-sm" data-testid="offer-preview">
      <h4 id="offer-preview-heading" className="font-semibold">
        Before saving{busy ? <span className="font-normal text-graphite-soft"> · figuring…</span> : null}
      </h4>
      <div aria-live="polite">
        {error ? (
          <p className="mt-1 text-graphite-soft">Not figured yet: {error}</p>
        ) : f ? (
          <>
            <dl className="mt-1 grid grid-cols-2 gap-x-4 gap-y-1 sm:grid-cols-3">
              {items.map(([label, value]) => (
                <div key={label}>
                  <dt className="text-graphite-soft">{label}</dt>
                  <dd className="figure font-medium" data-testid={`preview-${label.toLowerCase().replace(/[^a-z0-9]+/g, "-")}`}>
                    {value}
                  </dd>
                </div>
              ))}
            </dl>
            {preview.discountNeedsApproval ? (
              <p className="mt-2 text-danger">
                This discount is beyond your limit{preview.discountLimitCents === null ? "" : ` of ${formatCents(preview.discountLimitCents)}`}: saving sends it to the office for approval.
              </p>
            ) : null}
          </>
        ) : (
          <p className="mt-1 text-graphite-soft">Figuring the offer…</p>
        )}
      </div>
    </section>
  );
}

function DiscountRequestItem({ request, canApprove }: { request: RequestView; canApprove: boolean }) {
  const [note, setNote] = useState("");
  const decision = useSave<"approve" | "decline">({
    request: (kind) => ({ url: `/api/discount-requests/${request.id}/decision`, method: "POST", json: { decision: kind, note } }),
  });
  const busy = decision.pending;
  const decide = decision.save;
  return (
    <li className="rounded-md border border-paper-line p-3" data-testid="discount-request">
      <p>
        <span className="figure font-semibold">{formatCents(request.amountCents)}</span> on “{request.offerName}”, asked by {request.requestedByName ?? "a former member"}. Reason: {request.reason || "none given"}
      </p>
      {canApprove ? (
        <div className="mt-2 flex flex-wrap items-end gap-2">
          <div className="min-w-64 flex-1">
            <Field id={`note-${request.id}`} label="Note to the rep" value={note} onChange={(e) => setNote(e.target.value)} />
          </div>
          <button type="button" className="btn-primary" disabled={busy} onClick={() => decide("approve")}>
            Approve discount
          </button>
          <button type="button" className="btn-danger" disabled={busy} onClick={() => decide("decline")}>
            Decline discount
          </button>
        </div>
      ) : (
        <p className="mt-1 text-sm text-graphite-soft">Waiting for an office manager.</p>
      )}
      <StatusMessage notice={decision.notice} />
    </li>
  );
}
