"use client";
import { useMemo, useState, type ReactNode } from "react";
import type { Role } from "@/lib/enums";
import { FormMessage, SaveRow, SelectField, type Notice } from "@/components/ui/field";
import { RadioGroup } from "@/components/ui/radio-group";
import { useSave } from "@/components/ui/use-save";
import { formatDateTime } from "@/lib/format";
import { ROLE_LABELS } from "@/lib/permissions";
import { priceOffer, PricingInputError, type OfferPrice } from "@/lib/pricing";
import {
  ADDER_KINDS,
  INCENTIVE_SOURCE_LABELS,
  INCENTIVE_SOURCES,
  LIMITED_ROLES,
  priceBookSchema,
  type Adder,
  type AdderKind,
  type PriceBook,
  type PriceBookIncentive,
} from "@/lib/schemas/price-book";
import { MoneyInput, NumberInput, PercentInput } from "@/components/ui/number-input";
import { FitTable } from "@/components/ui/table";
import { fieldErrorsToErrors, refusedIssues, type PathErrors } from "@/lib/form-errors";
import type { FieldLabels } from "@/lib/validation-messages";

const ADDER_KIND_LABELS: Record<AdderKind, string> = { per_watt: "per watt DC", per_module: "per module", fixed: "per job" };
type Amount = PriceBookIncentive["amount"];

const money = (cents: number) => `$${(cents / 100).toLocaleString("en-US", { minimumFractionDigits: 2, maximumFractionDigits: 2 })}`;
const nn = (v: number | null) => v ?? Number.NaN;

/** A lower-case id from a name, unique among `taken`. */
function newId(name: string, taken: string[]): string {
  const base = name.toLowerCase().replace(/[^a-z0-9]+/g, "-").replace(/^-+|-+$/g, "").slice(0, 40) || "item";
  let id = base;
  for (let n = 2; taken.includes(id); n++) id = `${base}-${n}`;
  return id;
}

function incentiveStatus(rule: PriceBookIncentive, today: string): { label: string; tone: string } {
  if (today < rule.startDate) return { label: `starts ${rule.startDate}`, tone: "bg-caution-light text-caution" };
  if (today > rule.endDate) return { label: `ended ${rule.endDate}: never offered`, tone: "bg-paper-deep text-graphite-soft" };
  return { label: "in effect today", tone: "bg-sage-light text-sage" };
}

/** What each section of the editor needs: the book on screen, whether it may change, its errors, and the ways to change it. */
type BookEditor = {
  doc: PriceBook;
  edit: boolean;
  err: (path: string) => string | undefined;
  update: (change: (draft: PriceBook) => void) => void;
  rename: <T extends { id: string; name: string }>(list: T[], i: number, name: string) => void;
};

type UtilityOption = { id: string; name: string };

/** The editor's labels by the book's paths, for the messages that name a field. */
const PRICE_BOOK_LABELS: FieldLabels = {
  "bands.#.minWatts": "Band {n} start, kW DC",
  "bands.#.maxWatts": "Band {n} up to, kW DC",
  "bands.#.centsPerWattDc": "Band {n} price, $ per watt",
  "adders.#": "Adder {n}",
  "adders.#.id": "name",
  "adders.#.name": "name",
  "adders.#.centsPerWattDc": "$ per watt",
  "adders.#.centsPerModule": "$ per module",
  "adders.#.amountCents": "$ per job",
  "lineItems.#": "Line item {n}",
  "lineItems.#.id": "name",
  "lineItems.#.name": "name",
  "lineItems.#.amountCents": "price ($)",
  ...Object.fromEntries(LIMITED_ROLES.flatMap((role) => [
    [`discountLimits.${role}.maxCents`, `${ROLE_LABELS[role]} discount up to ($)`],
    [`discountLimits.${role}.maxPct`, `${ROLE_LABELS[role]} discount up to (%)`],
  ])),
  "incentives.#": "Incentive {n}",
  "incentives.#.id": "name",
  "incentives.#.name": "name",
  "incentives.#.startDate": "from",
  "incentives.#.endDate": "until",
  "incentives.#.timing.year": "in year",
  "incentives.#.eligibility.minKwDc": "min size (kW DC)",
  "incentives.#.eligibility.maxKwDc": "max size (kW DC)",
  "incentives.#.amount.centsPerWattDc": "$ per watt",
  "incentives.#.amount.capCents": "cap ($)",
  "incentives.#.amount.pct": "percent (%)",
  "incentives.#.amount.amountCents": "amount ($)",
  "deposit.amountCents": "Deposit ($)",
  "deposit.pct": "Deposit percent (%)",
  "deposit.minCents": "Deposit at least ($)",
  "deposit.maxCents": "Deposit at most ($)",
};

export function PriceBookClient(props: { initial: PriceBook; canEdit: boolean; role: Role; savedAt: string | null; savedBy: string | null; today: string; timeZone: string; utilities: UtilityOption[] }) {
  const [doc, setDoc] = useState<PriceBook>(props.initial);
  const [errors, setErrors] = useState<PathErrors>({});
  const [saved, setSaved] = useState({ at: props.savedAt, by: props.savedBy });
  const [dirty, setDirty] = useState(false);
  const { save: send, pending, notice, setNotice } = useSave<PriceBook, { updatedAt: string; updatedByName: string | null }>({
    request: (json) => ({ url: "/api/price-books", method: "POST", json }),
    success: "Price book saved.",
    labels: PRICE_BOOK_LABELS,
    onFieldErrors: (fields) => setErrors(fieldErrorsToErrors(fields)),
    onSaved: (record) => {
      setErrors({});
      setDirty(false);
      setSaved({ at: record.updatedAt, by: record.updatedByName });
    },
  });
  const edit = props.canEdit;
  // Items already saved keep their id (offers refer to it); a new item's id follows its name.
  const savedIds = useMemo(
    () => new Set([...props.initial.adders, ...props.initial.lineItems, ...props.initial.incentives].map((x) => x.id)),
    [props.initial],
  );
  function rename<T extends { id: string; name: string }>(list: T[], i: number, name: string) {
    list[i].name = name;
    if (!savedIds.has(list[i].id)) list[i].id = newId(name, list.filter((_, j) => j !== i).map((x) => x.id));
  }

  function update(change: (draft: PriceBook) => void) {
    setDoc((prev) => {
      const next = structuredClone(prev);
      change(next);
      // Bands stay contiguous: each starts where the one before ends.
      next.bands.forEach((b, i) => {
        b.minWatts = i === 0 ? 0 : (next.bands[i - 1].maxWatts ?? b.minWatts);
      });
      return next;
    });
    setDirty(true);
  }
  const err = (path: string) => errors[path];
  const book: BookEditor = { doc, edit, err, update, rename };

  function save() {
    setNotice(null);
    const parsed = priceBookSchema.safeParse(doc);
    if (!parsed.success) {
      const refused = refusedIssues(parsed.error.issues, PRICE_BOOK_LABELS);
      setErrors(refused.errors);
      setNotice({ tone: "error", text: refused.text });
      return;
    }
    send(parsed.data);
  }

  return (
    <div className="mt-6 space-y-6" data-edit-scope>
      <SaveBar saved={saved} timeZone={props.timeZone} edit={edit} pending={pending} dirty={dirty} onSave={save} notice={notice} />
      {errors._ ? <FormMessage tone="error">{errors._}</FormMessage> : null}

      <fieldset disabled={!edit || pending} className="space-y-6">
        <legend className="sr-only">Price book</legend>

        <BandsSection {...book} />

        <AddersSection {...book} />

        <LineItemsSection {...book} />

        <DiscountsSection {...book} />

        <IncentivesSection {...book} today={props.today} utilities={props.utilities} />

        <DepositSection {...book} />
      </fieldset>

      <PriceCheck book={doc} role={props.role} />
    </div>
  );
}

function adderOfKind(kind: AdderKind, from: Adder): Adder {
  const base = { id: from.id, name: from.name };
  if (kind === "per_watt") return { ...base, kind, centsPerWattDc: 0 };
  if (kind === "per_module") return { ...base, kind, centsPerModule: 0 };
  return { ...base, kind, amountCents: 0 };
}

function amountOfKind(kind: Amount["kind"]): Amount {
  if (kind === "per-watt") return { kind, centsPerWattDc: 0 };
  if (kind === "percent") return { kind, pct: 0, basis: "gross-price" };
  return { kind, amountCents: 0 };
}

/** Whose customers a rule is for: everyone, or one utility's (its own rebates). */
function IncentiveUtility({ rule, i, err, onChange, utilities }: IncentiveFieldProps & { utilities: UtilityOption[] }) {
  return (
    <SelectField
      id={`inc-${i}-utility`}
      className="mt-2 max-w-md"
      selectClassName="min-h-9 py-1 text-sm"
      label="For customers of"
      value={rule.utilityId ?? ""}
      error={err("utilityId")}
      hint={rule.source === "utility" && !rule.utilityId ? "A utility's rebate: pick the utility, or every household will get it." : undefined}
      options={[{ value: "", label: "Every utility" }, ...utilities.map((u) => ({ value: u.id, label: u.name }))]}
      onChange={(e) => onChange((r) => void (r.utilityId = e.target.value || null))}
    />
  );
}

type IncentiveFieldProps = { rule: PriceBookIncentive; i: number; err: (path: string) => string | undefined; onChange: (change: (rule: PriceBookIncentive) => void) => void };

function IncentiveEditor(props: {
  index: number;
  rule: PriceBookIncentive;
  today: string;
  utilities: UtilityOption[];
  edit: boolean;
  err: (path: string) => string | undefined;
  onChange: (change: (rule: PriceBookIncentive) => void) => void;
  onRename: (name: string) => void;
  onRemove: () => void;
}) {
  const { rule, index: i, err, onChange } = props;
  const status = incentiveStatus(rule, props.today);
  return (
    <div className="rounded-md border border-paper-line p-3" data-testid={`incentive-${rule.id}`}>
      <div className="flex flex-wrap items-center justify-between gap-2">
        <span className={`rounded px-2 py-0.5 text-xs ${status.tone}`}>{status.label}</span>
        {props.edit ? <RemoveButton label={`Remove incentive ${rule.name}`} onClick={props.onRemove} /> : null}
      </div>
      <div className="mt-2 grid gap-2 md:grid-cols-[2fr_1fr_1fr_1fr]">
        <TextInput id={`inc-${i}-name`} label="Name" value={rule.name} error={err("name") ?? err("id")} onText={props.onRename} hint={`id: ${rule.id}`} />
        <div>
          <label htmlFor={`inc-${i}-source`} className="field-label">
            Paid by
          </label>
          <select id={`inc-${i}-source`} className="field-input min-h-9 py-1 text-sm" value={rule.source} onChange={(e) => onChange((r) => void (r.source = e.target.value as PriceBookIncentive["source"]))}>
            {INCENTIVE_SOURCES.map((s) => (
              <option key={s} value={s}>
                {INCENTIVE_SOURCE_LABELS[s]}
              </option>
            ))}
          </select>
        </div>
        <TextInput id={`inc-${i}-start`} type="date" label="From" value={rule.startDate} error={err("startDate")} onText={(t) => onChange((r) => void (r.startDate = t))} />
        <TextInput id={`inc-${i}-end`} type="date" label="Until (inclusive)" value={rule.endDate} error={err("endDate")} onText={(t) => onChange((r) => void (r.endDate = t))} />
      </div>
      <IncentiveUtility rule={rule} i={i} err={err} onChange={onChange} utilities={props.utilities} />
      <IncentiveAmountFields rule={rule} i={i} err={err} onChange={onChange} />
      <div className="mt-2 grid gap-2 md:grid-cols-4">
        <div>
          <label htmlFor={`inc-${i}-timing`} className="field-label">
            Paid
          </label>
          <select
            id={`inc-${i}-timing`}
            className="field-input min-h-9 py-1 text-sm"
            value={rule.timing === "upfront" ? "upfront" : "year"}
            onChange={(e) => onChange((r) => void (r.timing = e.target.value === "upfront" ? "upfront" : { year: 1 }))}
          >
            <option value="upfront">at signing (lowers the price)</option>
            <option value="year">later, in a year of ownership</option>
          </select>
        </div>
        {rule.timing !== "upfront" ? (
          <NumberInput id={`inc-${i}-year`} label="In year" value={rule.timing.year} error={err("timing.year")} onValue={(v) => onChange((r) => void (r.timing = { year: nn(v) }))} />
        ) : null}
        <NumberInput id={`inc-${i}-minkw`} label="Min size (kW DC, optional)" storedDecimals={3} value={rule.eligibility.minKwDc ?? null} error={err("eligibility.minKwDc")} onValue={(v) => onChange((r) => void (r.eligibility.minKwDc = v ?? undefined))} />
        <NumberInput id={`inc-${i}-maxkw`} label="Max size (kW DC, optional)" storedDecimals={3} value={rule.eligibility.maxKwDc ?? null} error={err("eligibility.maxKwDc")} onValue={(v) => onChange((r) => void (r.eligibility.maxKwDc = v ?? undefined))} />
      </div>
      <PaymentTypesField rule={rule} i={i} err={err} onChange={onChange} />
    </div>
  );
}

/** Prices a sample offer with the book as it stands on screen (saved or not). */
function PriceCheck({ book, role }: { book: PriceBook; role: Role }) {
  const [kw, setKw] = useState<number | null>(7_200);
  const [modules, setModules] = useState<number | null>(18);
  const [discount, setDiscount] = useState<number | null>(0);
  const [asRole, setAsRole] = useState<Role>(role === "owner" || role === "admin" ? "sales_rep" : role);
  const [adderIds, setAdderIds] = useState<string[]>([]);
  const [lineItemIds, setLineItemIds] = useState<string[]>([]);

  const result = useMemo((): { price: OfferPrice } | { error: string } => {
    const valid = priceBookSchema.safeParse(book);
    if (!valid.success) return { error: "Fix the fields marked above to price a sample offer." };
    try {
      return {
        price: priceOffer(valid.data, {
          dcWatts: kw ?? 0,
          moduleCount: modules ?? 0,
          adderIds: adderIds.filter((id) => valid.data.adders.some((a) => a.id === id)),
          lineItemIds: lineItemIds.filter((id) => valid.data.lineItems.some((l) => l.id === id)),
          discountCents: discount ?? 0,
          role: asRole,
        }),
      };
    } catch (e) {
      return { error: e instanceof PricingInputError ? e.message : "This sample cannot be priced." };
    }
  }, [book, kw, modules, discount, asRole, adderIds, lineItemIds]);

  const toggle = (list: string[], id: string, on: boolean) => (on ? [...list, id] : list.filter((x) => x !== id));

  return (
    <Section id="price-check" title="Price check" hint="Try the book on a sample system before reps use it. Nothing here is saved.">
      <div className="grid gap-2 md:grid-cols-4">
        <NumberInput id="check-kw" label="Size (kW DC)" scale={1000} value={kw} onValue={setKw} />
        <NumberInput id="check-modules" label="Modules" value={modules} onValue={setModules} />
        <MoneyInput id="check-discount" label="Discount ($)" value={discount} onValue={setDiscount} />
        <div>
          <label htmlFor="check-role" className="field-label">
            Given by
          </label>
          <select id="check-role" className="field-input min-h-9 py-1 text-sm" value={asRole} onChange={(e) => setAsRole(e.target.value as Role)}>
            {(["sales_rep", "office_manager", "admin"] as const).map((r) => (
              <option key={r} value={r}>
                {ROLE_LABELS[r]}
              </option>
            ))}
          </select>
        </div>
      </div>
      <div className="mt-2 flex flex-wrap gap-x-4 text-sm">
        {book.adders.map((a) => (
          <label key={a.id} className="flex min-h-touch items-center gap-2">
            <input type="checkbox" checked={adderIds.includes(a.id)} onChange={(e) => setAdderIds(toggle(adderIds, a.id, e.target.checked))} />
            {a.name}
          </label>
        ))}
        {book.lineItems.map((l) => (
          <label key={l.id} className="flex min-h-touch items-center gap-2">
            <input type="checkbox" checked={lineItemIds.includes(l.id)} onChange={(e) => setLineItemIds(toggle(lineItemIds, l.id, e.target.checked))} />
            {l.name}
          </label>
        ))}
      </div>
      {"error" in result ? (
        <p className="mt-3 text-sm text-caution" role="status">
          {result.error}
        </p>
      ) : (
        <PriceCheckTable price={result.price} />
      )}
    </Section>
  );
}

function Section({ id, title, hint, children }: { id: string; title: string; hint: string; children: ReactNode }) {
  return (
    <section aria-labelledby={`${id}-heading`} className="card p-5">
      <h2 id={`${id}-heading`} className="text-lg font-semibold">
        {title}
      </h2>
      <p className="mt-1 text-sm text-graphite-soft">{hint}</p>
      <div className="mt-3">{children}</div>
    </section>
  );
}

function TextInput(props: { id: string; label: string; value: string; onText: (t: string) => void; error?: string; hint?: string; type?: string }) {
  return (
    <div>
      <label htmlFor={props.id} className="field-label">
        {props.label}
      </label>
      <input
        id={props.id}
        type={props.type ?? "text"}
        className="field-input min-h-9 py-1 text-sm"
        value={props.value}
        aria-invalid={props.error ? true : undefined}
        aria-describedby={props.error ? `${props.id}-error` : undefined}
        onChange={(e) => props.onText(e.target.value)}
      />
      {props.hint ? <p className="mt-0.5 text-xs text-graphite-faint">{props.hint}</p> : null}
      {props.error ? (
        <p id={`${props.id}-error`} className="field-error text-xs" role="alert">
          {props.error}
        </p>
      ) : null}
    </div>
  );
}

function RemoveButton({ label, onClick }: { label: string; onClick: () => void }) {
  return (
    <button type="button" className="btn-quiet min-h-9 self-end px-3" aria-label={label} onClick={onClick}>
      Remove
    </button>
  );
}

/** One size band: where it starts, where it ends (the last runs on), its price per watt. */
function BandRow({ band, i, last, canRemove, err, update }: { band: PriceBook["bands"][number]; i: number; last: boolean; canRemove: boolean; err: BookEditor["err"]; update: BookEditor["update"] }) {
  return (
    <tr className="align-top" data-testid={`band-${i}`}>
      <td className="figure py-2 pr-3">
        {(band.minWatts / 1000).toLocaleString("en-US", { maximumFractionDigits: 3 })} kW
        {err(`bands.${i}.minWatts`) ? <p className="field-error text-xs" role="alert">{err(`bands.${i}.minWatts`)}</p> : null}
      </td>
      <td className="py-1 pr-3">
        {last ? (
          <span className="text-graphite-soft">and up</span>
        ) : (
          <NumberInput
            id={`band-${i}-max`}
            label={`Band ${i + 1} up to, kW DC`}
            srLabel
            scale={1000}
            value={band.maxWatts}
            error={err(`bands.${i}.maxWatts`)}
            onValue={(v) => update((d) => void (d.bands[i].maxWatts = nn(v)))}
          />
        )}
      </td>
      <td className="py-1 pr-3">
        <NumberInput
          id={`band-${i}-price`}
          label={`Band ${i + 1} price, $ per watt`}
          srLabel
          scale={100}
          storedDecimals={2}
          value={band.centsPerWattDc}
          error={err(`bands.${i}.centsPerWattDc`)}
          onValue={(v) => update((d) => void (d.bands[i].centsPerWattDc = nn(v)))}
        />
      </td>
      <td className="py-1 text-right">
        {canRemove ? (
          <button
            type="button"
            className="btn-quiet min-h-9 px-3"
            aria-label={`Remove band ${i + 1}`}
            onClick={() =>
              update((d) => {
                d.bands.splice(i, 1);
                d.bands[d.bands.length - 1].maxWatts = null;
              })
            }
          >
            Remove
          </button>
        ) : null}
      </td>
    </tr>
  );
}

/** How much the incentive is: per watt or a percentage (each with an optional cap), or a fixed amount. */
function IncentiveAmountFields({ rule, i, err, onChange }: IncentiveFieldProps) {
  const a = rule.amount;
  return (
    <div className="mt-2 grid gap-2 md:grid-cols-4">
      <div>
        <label htmlFor={`inc-${i}-kind`} className="field-label">
          Amount
        </label>
        <select id={`inc-${i}-kind`} className="field-input min-h-9 py-1 text-sm" value={a.kind} onChange={(e) => onChange((r) => void (r.amount = amountOfKind(e.target.value as Amount["kind"])))}>
          <option value="per-watt">per watt DC, with a cap</option>
          <option value="percent">percent of the price, with a cap</option>
          <option value="fixed">a fixed amount</option>
        </select>
      </div>
      {a.kind === "per-watt" ? (
        <>
          <NumberInput id={`inc-${i}-cpw`} label="$ per watt" scale={100} storedDecimals={2} value={a.centsPerWattDc} error={err("amount.centsPerWattDc")} onValue={(v) => onChange((r) => void (r.amount.kind === "per-watt" && (r.amount.centsPerWattDc = nn(v))))} />
          <MoneyInput id={`inc-${i}-cap`} label="Cap ($, optional)" value={a.capCents ?? null} error={err("amount.capCents")} onValue={(v) => onChange((r) => void (r.amount.kind === "per-watt" && (r.amount.capCents = v ?? undefined)))} />
        </>
      ) : a.kind === "percent" ? (
        <>
          <PercentInput id={`inc-${i}-pct`} label="Percent (%)" storedDecimals={4} value={a.pct} error={err("amount.pct")} onValue={(v) => onChange((r) => void (r.amount.kind === "percent" && (r.amount.pct = nn(v))))} />
          <MoneyInput id={`inc-${i}-cap`} label="Cap ($, optional)" value={a.capCents ?? null} error={err("amount.capCents")} onValue={(v) => onChange((r) => void (r.amount.kind === "percent" && (r.amount.capCents = v ?? undefined)))} />
          <div className="md:col-start-2">
            <label htmlFor={`inc-${i}-basis`} className="field-label">
              Of
            </label>
            <select id={`inc-${i}-basis`} className="field-input min-h-9 py-1 text-sm" value={a.basis} onChange={(e) => onChange((r) => void (r.amount.kind === "percent" && (r.amount.basis = e.target.value as "gross-price" | "net-of-earlier")))}>
              <option value="gross-price">the contract price</option>
              <option value="net-of-earlier">the price less the incentives listed above it</option>
            </select>
          </div>
        </>
      ) : (
        <MoneyInput id={`inc-${i}-fixed`} label="Amount ($)" value={a.amountCents} error={err("amount.amountCents")} onValue={(v) => onChange((r) => void (r.amount.kind === "fixed" && (r.amount.amountCents = nn(v))))} />
      )}
    </div>
  );
}

/** Which buyers the incentive is for; both ticked is stored as no limit. */
function PaymentTypesField({ rule, err, onChange }: IncentiveFieldProps) {
  return (
    <fieldset className="mt-2 flex flex-wrap items-center gap-4 text-sm">
      <legend className="sr-only">Payment types</legend>
      <span className="text-graphite-soft">For</span>
      {(["cash", "loan"] as const).map((p) => {
        const list = rule.eligibility.payment;
        const checked = !list || list.includes(p);
        return (
          <label key={p} className="flex min-h-touch items-center gap-2">
            <input
              type="checkbox"
              checked={checked}
              onChange={(e) =>
                onChange((r) => {
                  const current = r.eligibility.payment ?? ["cash", "loan"];
                  const next = e.target.checked ? [...new Set([...current, p])] : current.filter((x) => x !== p);
                  r.eligibility.payment = next.length === 2 ? undefined : next;
                })
              }
            />
            {p === "cash" ? "cash buyers" : "loan buyers"}
          </label>
        );
      })}
      {err("eligibility.payment") ? <span className="field-error" role="alert">{err("eligibility.payment")}</span> : null}
    </fieldset>
  );
}

/** The sample offer's lines, contract, deposit and where its discount stands against the role's limit. */
function PriceCheckTable({ price }: { price: OfferPrice }) {
  return (
    <table className="mt-3 w-full max-w-2xl text-sm" data-testid="price-check">
      <tbody className="divide-y divide-paper-line">
        {price.lines.map((l, i) => (
          <tr key={i}>
            <td className="py-1 pr-3">{l.label}</td>
            <td className="py-1 pr-3 text-graphite-soft">{l.detail}</td>
            <td className="figure py-1 text-right">{money(l.amountCents)}</td>
          </tr>
        ))}
        <tr className="font-semibold">
          <td className="py-1 pr-3" colSpan={2}>
            Contract
          </td>
          <td className="figure py-1 text-right" data-testid="price-check-contract">
            {money(price.contractCents)}
          </td>
        </tr>
        <tr>
          <td className="py-1 pr-3" colSpan={2}>
            Deposit at signing
          </td>
          <td className="figure py-1 text-right">{money(price.depositCents)}</td>
        </tr>
        <tr>
          <td className="py-1 pr-3" colSpan={3}>
            {price.discountLimitCents === null
              ? "No discount limit for this role."
              : price.discountNeedsApproval
                ? `Needs office approval: above this role's limit of ${money(price.discountLimitCents)}.`
                : `Within this role's limit of ${money(price.discountLimitCents)}.`}
          </td>
        </tr>
      </tbody>
    </table>
  );
}

/** When the book was last saved and by whom, and the save button. */
function SaveBar({ saved, timeZone, edit, pending, dirty, onSave, notice }: { saved: { at: string | null; by: string | null }; timeZone: string; edit: boolean; pending: boolean; dirty: boolean; onSave: () => void; notice: Notice | null }) {
  return (
    <div className="flex flex-wrap items-center justify-between gap-3">
      <p className="text-sm text-graphite-soft" data-testid="price-book-saved">
        {saved.at ? `Last saved ${formatDateTime(new Date(saved.at), timeZone)}${saved.by ? ` by ${saved.by}` : ""}.` : "Not set up yet: offers use the starting values below until it is saved."}
      </p>
      {edit ? (
        <SaveRow notice={notice}>
          <button type="button" className="btn-primary" onClick={onSave} disabled={pending}>
            {pending ? "Saving…" : dirty ? "Save changes" : "Save price book"}
          </button>
        </SaveRow>
      ) : null}
    </div>
  );
}

function BandsSection({ doc, edit, err, update }: BookEditor) {
  return (
    <Section id="bands" title="Price per watt by system size" hint="The whole system is priced at the rate of the band its DC size falls in. A size exactly on a boundary takes the higher band.">
      <FitTable className="text-sm">
        <thead className="text-left text-xs uppercase tracking-wide text-graphite-soft">
          <tr>
            <th className="py-1 pr-3">From</th>
            <th className="py-1 pr-3">Up to (kW DC)</th>
            <th className="py-1 pr-3">Price ($/W DC)</th>
            <th className="py-1" />
          </tr>
        </thead>
        <tbody>
          {doc.bands.map((band, i) => (
            <BandRow key={i} band={band} i={i} last={i === doc.bands.length - 1} canRemove={edit && doc.bands.length > 1} err={err} update={update} />
          ))}
        </tbody>
      </FitTable>
      {err("bands") ? <p className="field-error" role="alert">{err("bands")}</p> : null}
      {edit ? (
        <button
          type="button"
          className="btn-quiet mt-2"
          onClick={() =>
            update((d) => {
              const lastBand = d.bands[d.bands.length - 1];
              lastBand.maxWatts = lastBand.minWatts + 4_000;
              d.bands.push({ minWatts: lastBand.maxWatts, maxWatts: null, centsPerWattDc: lastBand.centsPerWattDc });
            })
          }
        >
          Add a size band
        </button>
      ) : null}
    </Section>
  );
}

function AddersSection({ doc, edit, err, update, rename }: BookEditor) {
  return (
    <Section id="adders" title="Adders" hint="Equipment and site conditions the rep ticks on an offer: priced per watt DC, per module, or once per job.">
      {doc.adders.length === 0 ? <p className="text-sm text-graphite-soft">No adders yet.</p> : null}
      <div className="space-y-2">
        {doc.adders.map((adder, i) => (
          <div key={i} className="grid items-start gap-2 md:grid-cols-[2fr_1fr_1fr_auto]" data-testid={`adder-${adder.id}`}>
            <TextInput id={`adder-${i}-name`} label="Name" value={adder.name} error={err(`adders.${i}.name`) ?? err(`adders.${i}.id`)} onText={(t) => update((d) => rename(d.adders, i, t))} hint={`id: ${adder.id}`} />
            <div>
              <label htmlFor={`adder-${i}-kind`} className="field-label">
                Priced
              </label>
              <select
                id={`adder-${i}-kind`}
                className="field-input min-h-9 py-1 text-sm"
                value={adder.kind}
                onChange={(e) => update((d) => void (d.adders[i] = adderOfKind(e.target.value as AdderKind, adder)))}
              >
                {ADDER_KINDS.map((k) => (
                  <option key={k} value={k}>
                    {ADDER_KIND_LABELS[k]}
                  </option>
                ))}
              </select>
            </div>
            {adder.kind === "per_watt" ? (
              <NumberInput id={`adder-${i}-amount`} label="$ per watt" scale={100} storedDecimals={2} value={adder.centsPerWattDc} error={err(`adders.${i}.centsPerWattDc`)} onValue={(v) => update((d) => void ((d.adders[i] as Extract<Adder, { kind: "per_watt" }>).centsPerWattDc = nn(v)))} />
            ) : adder.kind === "per_module" ? (
              <MoneyInput id={`adder-${i}-amount`} label="$ per module" value={adder.centsPerModule} error={err(`adders.${i}.centsPerModule`)} onValue={(v) => update((d) => void ((d.adders[i] as Extract<Adder, { kind: "per_module" }>).centsPerModule = nn(v)))} />
            ) : (
              <MoneyInput id={`adder-${i}-amount`} label="$ per job" value={adder.amountCents} error={err(`adders.${i}.amountCents`)} onValue={(v) => update((d) => void ((d.adders[i] as Extract<Adder, { kind: "fixed" }>).amountCents = nn(v)))} />
            )}
            {edit ? <RemoveButton label={`Remove adder ${adder.name}`} onClick={() => update((d) => void d.adders.splice(i, 1))} /> : null}
          </div>
        ))}
      </div>
      {edit ? (
        <button type="button" className="btn-quiet mt-3" onClick={() => update((d) => void d.adders.push({ id: newId("new adder", d.adders.map((a) => a.id)), name: "New adder", kind: "fixed", amountCents: 0 }))}>
          Add an adder
        </button>
      ) : null}
    </Section>
  );
}

function LineItemsSection({ doc, edit, err, update, rename }: BookEditor) {
  return (
    <Section id="line-items" title="Line items" hint="Fixed extras added to an offer as their own line.">
      {doc.lineItems.length === 0 ? <p className="text-sm text-graphite-soft">No line items yet.</p> : null}
      <div className="space-y-2">
        {doc.lineItems.map((item, i) => (
          <div key={i} className="grid items-start gap-2 md:grid-cols-[3fr_1fr_auto]" data-testid={`line-item-${item.id}`}>
            <TextInput id={`line-${i}-name`} label="Name" value={item.name} error={err(`lineItems.${i}.name`) ?? err(`lineItems.${i}.id`)} onText={(t) => update((d) => rename(d.lineItems, i, t))} hint={`id: ${item.id}`} />
            <MoneyInput id={`line-${i}-amount`} label="Price ($)" value={item.amountCents} error={err(`lineItems.${i}.amountCents`)} onValue={(v) => update((d) => void (d.lineItems[i].amountCents = nn(v)))} />
            {edit ? <RemoveButton label={`Remove line item ${item.name}`} onClick={() => update((d) => void d.lineItems.splice(i, 1))} /> : null}
          </div>
        ))}
      </div>
      {edit ? (
        <button type="button" className="btn-quiet mt-3" onClick={() => update((d) => void d.lineItems.push({ id: newId("new item", d.lineItems.map((l) => l.id)), name: "New item", amountCents: 0 }))}>
          Add a line item
        </button>
      ) : null}
    </Section>
  );
}

function DiscountsSection({ doc, err, update }: BookEditor) {
  return (
    <Section id="discounts" title="Discount limits" hint="The most each role may take off without an office approval, as dollars and/or a percentage of the price before discount. With both, the smaller applies; with neither, every discount needs approval. Owners and admins have no limit.">
      <div className="grid gap-4 md:grid-cols-2">
        {LIMITED_ROLES.map((role) => (
          <div key={role} className="grid grid-cols-2 gap-2" data-testid={`limit-${role}`}>
            <p className="col-span-2 text-sm font-medium">{ROLE_LABELS[role]}</p>
            <MoneyInput id={`limit-${role}-cents`} label="Up to ($)" placeholder="no $ limit" value={doc.discountLimits[role].maxCents} error={err(`discountLimits.${role}.maxCents`)} onValue={(v) => update((d) => void (d.discountLimits[role].maxCents = v))} />
            <PercentInput id={`limit-${role}-pct`} label="Up to (%)" placeholder="no % limit" storedDecimals={2} value={doc.discountLimits[role].maxPct} error={err(`discountLimits.${role}.maxPct`)} onValue={(v) => update((d) => void (d.discountLimits[role].maxPct = v))} />
          </div>
        ))}
      </div>
    </Section>
  );
}

function IncentivesSection({ doc, edit, err, update, rename, ...props }: BookEditor & { today: string; utilities: UtilityOption[] }) {
  return (
    <Section id="incentives" title="Incentives" hint="Rebates and credits as data, each with its dates: an offer applies a rule only on days within them. Nothing is built in; enter federal, state or utility programs here as they change.">
      {doc.incentives.length === 0 ? <p className="text-sm text-graphite-soft">No incentives yet.</p> : null}
      <div className="space-y-3">
        {doc.incentives.map((rule, i) => (
          <IncentiveEditor
            key={i}
            index={i}
            rule={rule}
            today={props.today}
            utilities={props.utilities}
            err={(p) => err(`incentives.${i}.${p}`)}
            edit={edit}
            onChange={(change) => update((d) => change(d.incentives[i]))}
            onRename={(name) => update((d) => rename(d.incentives, i, name))}
            onRemove={() => update((d) => void d.incentives.splice(i, 1))}
          />
        ))}
      </div>
      {edit ? (
        <button
          type="button"
          className="btn-quiet mt-3"
          onClick={() =>
            update((d) =>
              void d.incentives.push({
                id: newId("new incentive", d.incentives.map((r) => r.id)),
                name: "New incentive",
                source: "utility",
                utilityId: null,
                countsOn: "offer",
                amount: { kind: "fixed", amountCents: 0 },
                startDate: props.today,
                endDate: `${Number(props.today.slice(0, 4)) + 1}-12-31`,
                timing: "upfront",
                eligibility: {},
              }),
            )
          }
        >
          Add an incentive
        </button>
      ) : null}
    </Section>
  );
}

function DepositSection({ doc, err, update }: BookEditor) {
  return (
    <Section id="deposit" title="Deposit" hint="Asked when the customer signs; never more than the contract.">
      <RadioGroup
        name="deposit-kind"
        label="Deposit kind"
        options={[
          ["fixed", "A fixed amount"],
          ["percent", "A percentage of the contract"],
        ]}
        value={doc.deposit.kind}
        onChange={(kind) =>
          update((d) => void (d.deposit = kind === "fixed" ? { kind: "fixed", amountCents: 50_000 } : { kind: "percent", pct: 10, minCents: 50_000, maxCents: 250_000 }))
        }
      />
      {doc.deposit.kind === "fixed" ? (
        <MoneyInput id="deposit-amount" className="mt-2 max-w-48" label="Deposit ($)" value={doc.deposit.amountCents} error={err("deposit.amountCents")} onValue={(v) => update((d) => void (d.deposit.kind === "fixed" && (d.deposit.amountCents = nn(v))))} />
      ) : (
        <div className="mt-2 grid max-w-xl grid-cols-3 gap-2">
          <PercentInput id="deposit-pct" label="Percent (%)" storedDecimals={2} value={doc.deposit.pct} error={err("deposit.pct")} onValue={(v) => update((d) => void (d.deposit.kind === "percent" && (d.deposit.pct = nn(v))))} />
          <MoneyInput id="deposit-min" label="At least ($)" value={doc.deposit.minCents} error={err("deposit.minCents")} onValue={(v) => update((d) => void (d.deposit.kind === "percent" && (d.deposit.minCents = nn(v))))} />
          <MoneyInput id="deposit-max" label="At most ($)" value={doc.deposit.maxCents} error={err("deposit.maxCents")} onValue={(v) => update((d) => void (d.deposit.kind === "percent" && (d.deposit.maxCents = nn(v))))} />
        </div>
      )}
    </Section>
  );
}
