"use client";
import { useRouter } from "next/navigation";
import { useMemo, useState, type ReactNode } from "react";
import { FormMessage, SaveRow, SelectField } from "@/components/ui/field";
import { RadioGroup } from "@/components/ui/radio-group";
import { useSave } from "@/components/ui/use-save";
import { EngineInputError } from "@/engine/errors";
import { ratePlanSchema, touPeriodByHour, type AnnualBill, type RatePlan } from "@/engine/rates";
import { MONTH_START_DAY, weekdayOfJanuaryFirst } from "@/engine/year-calendar";
import { PREVIEW_MONTHLY_KWH, ratePlanRecordSchema } from "@/lib/schemas/rate-plan";
import { MoneyInput, NumberInput } from "@/components/ui/number-input";
import { fieldErrorsToErrors, refusedIssues, type PathErrors } from "@/lib/form-errors";
import { namedMessage, relabel } from "@/lib/validation-messages";
import { ALL_MONTHS, compensationTemplate, energyTemplate, RATE_PLAN_LABELS, type EditorRecord } from "./plan-templates";
import { sampleBill } from "./sample-bill";

type Tou = Extract<RatePlan["energy"], { kind: "tou" }>;
type Season = Tou["seasons"][number];
type HourRange = Season["weekday"][number];

const MONTH_NAMES = ["Jan", "Feb", "Mar", "Apr", "May", "Jun", "Jul", "Aug", "Sep", "Oct", "Nov", "Dec"];
const MONTH_LONG = ["January", "February", "March", "April", "May", "June", "July", "August", "September", "October", "November", "December"];
const PERIOD_COLORS = ["bg-copper", "bg-usage", "bg-sage", "bg-caution", "bg-graphite-faint", "bg-copper-light", "bg-slate-light", "bg-danger"];
const money = (cents: number) => `$${(cents / 100).toLocaleString("en-US", { minimumFractionDigits: 2, maximumFractionDigits: 2 })}`;
const hh = (h: number) => `${String(h).padStart(2, "0")}:00`;
const nn = (v: number | null) => v ?? Number.NaN;

/** What each card of the editor needs: the record on screen, whether it may change, its errors, and the way to change it. */
type PlanEditorProps = { record: EditorRecord; canEdit: boolean; err: (path: string) => string | undefined; update: (change: (draft: EditorRecord) => void) => void };
type TouProps = { energy: Tou; err: (p: string) => string | undefined; canEdit: boolean; update: (f: (e: Tou) => void) => void };
type SeasonProps = TouProps & { s: number; season: Season; periodOptions: { id: string; label: string }[]; byHour: Uint8Array | null };

type UtilityOption = { id: string; name: string };

export function RatePlanEditor({ id, initial, canEdit, utilities }: { id: string | null; initial: EditorRecord; canEdit: boolean; utilities: UtilityOption[] }) {
  const router = useRouter();
  const [record, setRecord] = useState<EditorRecord>(initial);
  const [errors, setErrors] = useState<PathErrors>({});
  const { save: send, pending, notice, setNotice } = useSave<EditorRecord, { id: string }>({
    request: (json) => (id ? { url: `/api/rate-plans/${id}`, method: "PUT", json } : { url: "/api/rate-plans", method: "POST", json }),
    // A new plan opens at its own address; a saved one stays here.
    success: id ? "Rate plan saved." : undefined,
    refresh: id !== null,
    labels: RATE_PLAN_LABELS,
    onFieldErrors: (fields) => setErrors(fieldErrorsToErrors(fields)),
    onSaved: (saved) => {
      setErrors({});
      if (!id) router.push(`/rate-plans/${saved.id}`);
    },
  });
  const plan = record.plan;

  function update(change: (draft: EditorRecord) => void) {
    setRecord((prev) => {
      const next = structuredClone(prev);
      change(next);
      return next;
    });
  }
  const err = (path: string) => errors[`plan.${path}`];

  function save() {
    setNotice(null);
    const parsed = ratePlanRecordSchema.safeParse(record);
    if (!parsed.success) {
      const refused = refusedIssues(parsed.error.issues, RATE_PLAN_LABELS);
      setErrors(refused.errors);
      setNotice({ tone: "error", text: refused.text });
      return;
    }
    send(parsed.data as EditorRecord);
  }

  const errorList = Object.entries(errors);

  return (
    <div className="mt-6 grid gap-6 lg:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]">
      <div className="space-y-6" data-edit-scope>
        {errorList.length > 0 ? <ProblemList errorList={errorList} /> : null}
        <fieldset disabled={!canEdit || pending} className="space-y-6">
          <legend className="sr-only">Rate plan</legend>
          <PlanCard record={record} canEdit={canEdit} err={err} update={update} utilityError={errors.utilityId} utilities={utilities} />

          <EnergyCard record={record} canEdit={canEdit} err={err} update={update} />

          <ExportCard record={record} canEdit={canEdit} err={err} update={update} />
        </fieldset>
        {canEdit ? (
          <SaveRow notice={notice}>
            <button type="button" className="btn-primary" onClick={save} disabled={pending}>
              {pending ? "Saving…" : id ? "Save rate plan" : "Create rate plan"}
            </button>
          </SaveRow>
        ) : (
          <p className="text-sm text-graphite-soft">Only an owner or admin can change rate plans.</p>
        )}
      </div>
      <Preview plan={plan} />
    </div>
  );
}

function TiersEditor({ energy, err, canEdit, update }: { energy: Extract<RatePlan["energy"], { kind: "tiered" }>; err: (p: string) => string | undefined; canEdit: boolean; update: (f: (e: Extract<RatePlan["energy"], { kind: "tiered" }>) => void) => void }) {
  return (
    <div className="space-y-2">
      {energy.tiers.map((tier, i) => {
        const last = i === energy.tiers.length - 1;
        const from = i === 0 ? 0 : energy.tiers[i - 1].upToKwh;
        return (
          <div key={i} className="grid items-end gap-2 md:grid-cols-[1fr_1fr_1fr_auto]" data-testid={`tier-${i}`}>
            <p className="figure pb-2 text-sm">
              Tier {i + 1}: from {from ?? "?"} kWh
            </p>
            {last ? (
              <p className="pb-2 text-sm text-graphite-soft">and up</p>
            ) : (
              <NumberInput id={`tier-${i}-limit`} label="Up to (kWh / month)" storedDecimals={3} value={tier.upToKwh} error={err(`energy.tiers.${i}.upToKwh`)} onValue={(v) => update((e) => void (e.tiers[i].upToKwh = nn(v)))} />
            )}
            <NumberInput id={`tier-${i}-price`} label="Price (¢/kWh)" storedDecimals={4} value={tier.centsPerKwh} error={err(`energy.tiers.${i}.centsPerKwh`)} onValue={(v) => update((e) => void (e.tiers[i].centsPerKwh = nn(v)))} />
            {canEdit && energy.tiers.length > 1 ? (
              <button
                type="button"
                className="btn-quiet min-h-9 px-3"
                aria-label={`Remove tier ${i + 1}`}
                onClick={() =>
                  update((e) => {
                    e.tiers.splice(i, 1);
                    e.tiers[e.tiers.length - 1].upToKwh = null;
                  })
                }
              >
                Remove
              </button>
            ) : null}
          </div>
        );
      })}
      {canEdit ? (
        <button
          type="button"
          className="btn-quiet"
          onClick={() =>
            update((e) => {
              const lastTier = e.tiers[e.tiers.length - 1];
              const prev = e.tiers.length > 1 ? (e.tiers[e.tiers.length - 2].upToKwh ?? 0) : 0;
              lastTier.upToKwh = prev + 500;
              e.tiers.push({ upToKwh: null, centsPerKwh: lastTier.centsPerKwh });
            })
          }
        >
          Add a tier
        </button>
      ) : null}
    </div>
  );
}

function TouEditor({ energy, err, canEdit, update }: TouProps) {
  const periodOptions = energy.periods.map((p) => ({ id: p.id, label: p.label || p.id }));
  const parsed = useMemo(() => {
    const r = ratePlanSchema.shape.energy.safeParse(energy);
    return r.success && r.data.kind === "tou" ? r.data : null;
  }, [energy]);
  const byHour = useMemo(() => (parsed ? touPeriodByHour(parsed) : null), [parsed]);

  return (
    <div className="space-y-4">
      <TouPeriods energy={energy} err={err} canEdit={canEdit} update={update} />

      <div>
        <h3 className="text-sm font-semibold">Seasons</h3>
        <p className="text-sm text-graphite-soft">Every month belongs to one season. Hours no range names take the season&apos;s other-hours period; a later range wins where ranges overlap. Hours are clock hours at the site, daylight saving included: 4–9 pm means 4–9 pm on the wall clock in summer too.</p>
        <div className="mt-2 space-y-3">
          {energy.seasons.map((season, s) => (
            <SeasonCard key={s} s={s} season={season} energy={energy} periodOptions={periodOptions} byHour={byHour} canEdit={canEdit} err={err} update={update} />
          ))}
        </div>
        {err("energy.seasons") ? (
          <p className="field-error" role="alert">
            {err("energy.seasons")}
          </p>
        ) : null}
        {canEdit ? (
          <button
            type="button"
            className="btn-quiet mt-2"
            onClick={() =>
              update((e) => {
                const used = new Set(e.seasons.flatMap((x) => x.months));
                const free = ALL_MONTHS.filter((m) => !used.has(m));
                e.seasons.push({ name: `Season ${e.seasons.length + 1}`, months: free, otherHoursPeriodId: e.periods[e.periods.length - 1].id, weekday: [], weekend: [] });
              })
            }
          >
            Add a season
          </button>
        ) : null}
      </div>
    </div>
  );
}

/** The 24 period indexes of the first weekday or weekend day of a month, from the engine's calendar. */
function dayHours(byHour: Uint8Array, month: number | undefined, dayType: "weekday" | "weekend"): number[] | null {
  if (month === undefined) return null;
  const jan1 = weekdayOfJanuaryFirst(2023);
  for (let k = 0; k < 7; k++) {
    const d = MONTH_START_DAY[month - 1] + k;
    const wd = (jan1 + d) % 7;
    if ((wd === 0 || wd === 6) === (dayType === "weekend")) return Array.from(byHour.subarray(d * 24, d * 24 + 24));
  }
  return null;
}

function HourStrip({ hours, periods }: { hours: number[] | null; periods: string[] }) {
  if (!hours) return null;
  return (
    <div className="flex" aria-label="Periods by hour" role="img">
      {hours.map((p, h) => (
        <span key={h} title={`${hh(h)}–${hh(h + 1)}: ${periods[p]}`} className={`h-3 w-2.5 border-r border-white ${PERIOD_COLORS[p % PERIOD_COLORS.length]}`} />
      ))}
    </div>
  );
}

function RangeRow(props: { id: string; range: HourRange; options: { id: string; label: string }[]; canEdit: boolean; err: (p: string) => string | undefined; onChange: (f: (r: HourRange) => void) => void; onRemove: () => void }) {
  const { id, range } = props;
  return (
    <div className="mt-1 grid items-end gap-2 md:grid-cols-[1fr_1fr_2fr_auto]">
      <div>
        <label htmlFor={`${id}-start`} className="field-label text-xs">
          From
        </label>
        <select id={`${id}-start`} className="field-input figure min-h-9 py-1 text-sm" value={range.startHour} onChange={(e) => props.onChange((r) => void (r.startHour = Number(e.target.value)))}>
          {Array.from({ length: 24 }, (_, h) => (
            <option key={h} value={h}>
              {hh(h)}
            </option>
          ))}
        </select>
      </div>
      <div>
        <label htmlFor={`${id}-end`} className="field-label text-xs">
          Until
        </label>
        <select id={`${id}-end`} className="field-input figure min-h-9 py-1 text-sm" value={range.endHour} aria-invalid={props.err("endHour") ? true : undefined} onChange={(e) => props.onChange((r) => void (r.endHour = Number(e.target.value)))}>
          {Array.from({ length: 24 }, (_, k) => k + 1).map((h) => (
            <option key={h} value={h}>
              {hh(h)}
            </option>
          ))}
        </select>
        {props.err("endHour") ? (
          <p className="field-error text-xs" role="alert">
            {props.err("endHour")}
          </p>
        ) : null}
      </div>
      <PeriodSelect id={`${id}-period`} label="Period" value={range.periodId} options={props.options} error={props.err("periodId")} onPick={(v) => props.onChange((r) => void (r.periodId = v))} />
      {props.canEdit ? (
        <button type="button" className="btn-quiet min-h-9 px-3" aria-label="Remove these hours" onClick={props.onRemove}>
          Remove
        </button>
      ) : null}
    </div>
  );
}

function PeriodSelect(props: { id: string; label: string; value: string; options: { id: string; label: string }[]; error?: string; onPick: (id: string) => void }) {
  const known = props.options.some((o) => o.id === props.value);
  return (
    <div>
      <label htmlFor={props.id} className="field-label text-xs">
        {props.label}
      </label>
      <select id={props.id} className="field-input min-h-9 py-1 text-sm" value={props.value} aria-invalid={props.error ? true : undefined} onChange={(e) => props.onPick(e.target.value)}>
        {known ? null : <option value={props.value}>(removed period)</option>}
        {props.options.map((o) => (
          <option key={o.id} value={o.id}>
            {o.label}
          </option>
        ))}
      </select>
      {props.error ? (
        <p className="field-error text-xs" role="alert">
          {props.error}
        </p>
      ) : null}
    </div>
  );
}

/** The sample household's bills under the plan as it stands on screen, from the engine. */
function Preview({ plan }: { plan: RatePlan }) {
  const [month, setMonth] = useState(0);
  const result = useMemo((): { bill: AnnualBill } | { problems: string[] } => {
    try {
      // The name does not change the bill; an unnamed draft still previews.
      return { bill: sampleBill({ ...plan, name: plan.name.trim() || "draft" }) };
    } catch (e) {
      if (e instanceof EngineInputError) return { problems: e.issues.map((i) => namedMessage(`plan.${i.path}`, relabel(`plan.${i.path}`, i.message, RATE_PLAN_LABELS), RATE_PLAN_LABELS)) };
      return { problems: ["This plan cannot be billed."] };
    }
  }, [plan]);

  return (
    <aside className="card h-fit p-5 lg:sticky lg:top-4" aria-labelledby="preview-heading">
      <h2 id="preview-heading" className="text-lg font-semibold">
        Sample bill
      </h2>
      <p className="mt-1 text-sm text-graphite-soft">A household using {PREVIEW_MONTHLY_KWH} kWh every month, spread over the hours like a typical home, without solar. Check the figures against the utility&apos;s tariff sheet.</p>
      {"problems" in result ? (
        <div className="mt-3 text-sm text-caution" role="status">
          <p>Fix these to see the bill:</p>
          <ul className="mt-1 list-disc pl-5">
            {result.problems.slice(0, 6).map((p) => (
              <li key={p}>{p}</li>
            ))}
          </ul>
        </div>
      ) : (
        <>
          <dl className="mt-3 grid grid-cols-2 gap-3">
            <div>
              <dt className="text-xs text-graphite-soft">Average month</dt>
              <dd className="figure text-xl font-semibold" data-testid="preview-average">
                {money(result.bill.totalCents / 12)}
              </dd>
            </div>
            <div>
              <dt className="text-xs text-graphite-soft">Year</dt>
              <dd className="figure text-xl" data-testid="preview-year">
                {money(result.bill.totalCents)}
              </dd>
            </div>
          </dl>
          <BillMonths bill={result.bill} month={month} onPick={setMonth} />
          <h3 className="mt-4 text-sm font-semibold">{MONTH_LONG[month]} in detail</h3>
          <table className="mt-1 w-full text-sm" data-testid="preview-lines">
            <tbody className="divide-y divide-paper-line">
              {result.bill.months[month].lines.map((l, i) => (
                <tr key={i}>
                  <td className="py-0.5 pr-2">{l.label}</td>
                  <td className="figure py-0.5 pr-2 text-right text-graphite-soft">
                    {l.kwh !== undefined ? `${l.kwh.toLocaleString("en-US", { maximumFractionDigits: 1 })} kWh` : ""}
                    {l.centsPerKwh !== undefined ? ` × ${l.centsPerKwh} ¢` : ""}
                  </td>
                  <td className="figure py-0.5 text-right">{money(l.amountCents)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </>
      )}
    </aside>
  );
}

function Card({ title, children }: { title: string; children: ReactNode }) {
  return (
    <section className="card p-5">
      <h2 className="text-lg font-semibold">{title}</h2>
      <div className="mt-3">{children}</div>
    </section>
  );
}

function TextField(props: { id: string; label: string; value: string; onText: (t: string) => void; error?: string }) {
  return (
    <div>
      <label htmlFor={props.id} className="field-label">
        {props.label}
      </label>
      <input
        id={props.id}
        className="field-input min-h-9 py-1 text-sm"
        value={props.value}
        aria-invalid={props.error ? true : undefined}
        aria-describedby={props.error ? `${props.id}-error` : undefined}
        onChange={(e) => props.onText(e.target.value)}
      />
      {props.error ? (
        <p id={`${props.id}-error`} className="field-error text-xs" role="alert">
          {props.error}
        </p>
      ) : null}
    </div>
  );
}

/** A season's hour ranges for weekdays or for weekends, with the periods they make on the month's first such day. */
function DayTypeHours({ dayType, s, season, energy, periodOptions, byHour, canEdit, err, update }: SeasonProps & { dayType: "weekday" | "weekend" }) {
  return (
    <div className="mt-3">
      <div className="flex items-center gap-3">
        <h4 className="text-sm font-medium">{dayType === "weekday" ? "Weekdays (Mon–Fri)" : "Weekends (Sat–Sun)"}</h4>
        {byHour ? <HourStrip hours={dayHours(byHour, season.months[0], dayType)} periods={energy.periods.map((p) => p.label || p.id)} /> : null}
      </div>
      {season[dayType].length === 0 ? <p className="text-xs text-graphite-soft">All hours: other hours period.</p> : null}
      {season[dayType].map((range, r) => (
        <RangeRow
          key={r}
          id={`season-${s}-${dayType}-${r}`}
          range={range}
          options={periodOptions}
          canEdit={canEdit}
          err={(p) => err(`energy.seasons.${s}.${dayType}.${r}.${p}`)}
          onChange={(f) => update((e) => f(e.seasons[s][dayType][r]))}
          onRemove={() => update((e) => void e.seasons[s][dayType].splice(r, 1))}
        />
      ))}
      {canEdit ? (
        <button
          type="button"
          className="btn-quiet mt-1 min-h-9 px-3"
          onClick={() => update((e) => void e.seasons[s][dayType].push({ startHour: 16, endHour: 21, periodId: e.periods[0].id }))}
        >
          Add {dayType} hours
        </button>
      ) : null}
    </div>
  );
}

/** The months a season covers, as toggles. */
function SeasonMonths({ s, season, err, update }: { s: number; season: Season; err: TouProps["err"]; update: TouProps["update"] }) {
  return (
    <fieldset className="mt-2">
      <legend className="field-label">Months</legend>
      <div className="flex flex-wrap gap-1">
        {ALL_MONTHS.map((m) => {
          const on = season.months.includes(m);
          return (
            <label key={m} className={`flex min-h-9 cursor-pointer items-center gap-1 rounded border px-2 text-sm ${on ? "border-copper bg-copper-light" : "border-paper-line bg-white"}`}>
              <input
                type="checkbox"
                className="sr-only"
                checked={on}
                onChange={(ev) =>
                  update((e) => {
                    const months = e.seasons[s].months.filter((x) => x !== m);
                    e.seasons[s].months = ev.target.checked ? [...months, m].sort((a, b) => a - b) : months;
                  })
                }
              />
              {MONTH_NAMES[m - 1]}
            </label>
          );
        })}
      </div>
      {[err(`energy.seasons.${s}.months`), ...season.months.map((_, i) => err(`energy.seasons.${s}.months.${i}`))]
        .filter((v): v is string => Boolean(v))
        .map((v) => (
          <p key={v} className="field-error text-xs" role="alert">
            {v}
          </p>
        ))}
    </fieldset>
  );
}

/** Every field error at once, each naming its field as the editor labels it. */
function ProblemList({ errorList }: { errorList: [string, string][] }) {
  return (
    <ul className="rounded-md border border-danger/30 bg-danger-light px-4 py-2 text-sm text-danger" aria-label="Problems">
      {errorList.map(([path, message]) => (
        <li key={path}>{namedMessage(path, message, RATE_PLAN_LABELS)}</li>
      ))}
    </ul>
  );
}

function PlanCard({ record, err, update, utilityError, utilities }: PlanEditorProps & { utilityError: string | undefined; utilities: UtilityOption[] }) {
  const plan = record.plan;
  return (
    <Card title="Plan">
      <div className="grid gap-3 md:grid-cols-2">
        <SelectField
          id="plan-utility"
          label="Utility"
          selectClassName="min-h-9 py-1 text-sm"
          value={record.utilityId}
          error={utilityError}
          hint={utilities.length === 0 ? "Add the utility on the Utilities screen first." : undefined}
          options={[{ value: "", label: "Pick the utility" }, ...utilities.map((u) => ({ value: u.id, label: u.name }))]}
          onChange={(e) => update((d) => void (d.utilityId = e.target.value))}
        />
        <TextField id="plan-name" label="Plan name" value={plan.name} error={err("name")} onText={(t) => update((d) => void (d.plan.name = t))} />
        <MoneyInput id="plan-fixed" label="Fixed charge ($ / month)" value={plan.fixedMonthlyCents} error={err("fixedMonthlyCents")} onValue={(v) => update((d) => void (d.plan.fixedMonthlyCents = nn(v)))} />
        <MoneyInput id="plan-minimum" label="Minimum bill ($ / month, fixed charge included)" value={plan.minimumBillCents} error={err("minimumBillCents")} onValue={(v) => update((d) => void (d.plan.minimumBillCents = nn(v)))} />
      </div>
      <label className="mt-3 flex min-h-touch items-center gap-2 text-sm">
        <input type="checkbox" checked={record.active} onChange={(e) => update((d) => void (d.active = e.target.checked))} />
        In use (reps can pick it for a household)
      </label>
    </Card>
  );
}

/** How imported energy is priced: flat, tiered by monthly use, or by time of use. */
function EnergyCard({ record, canEdit, err, update }: PlanEditorProps) {
  const plan = record.plan;
  return (
    <Card title="Energy charges">
      <RadioGroup
        name="energy-kind"
        label="Energy pricing"
        options={[
          ["flat", "Flat"],
          ["tiered", "Tiered (monthly kWh)"],
          ["tou", "Time-of-use"],
        ]}
        value={plan.energy.kind}
        onChange={(kind) => update((d) => void (d.plan.energy = energyTemplate(kind)))}
      />
      <div className="mt-3">
        {plan.energy.kind === "flat" ? (
          <NumberInput
            id="flat-price"
            className="max-w-48"
            label="Price (¢/kWh)"
            storedDecimals={4}
            value={plan.energy.centsPerKwh}
            error={err("energy.centsPerKwh")}
            onValue={(v) => update((d) => void (d.plan.energy.kind === "flat" && (d.plan.energy.centsPerKwh = nn(v))))}
          />
        ) : plan.energy.kind === "tiered" ? (
          <TiersEditor energy={plan.energy} err={err} canEdit={canEdit} update={(f) => update((d) => void (d.plan.energy.kind === "tiered" && f(d.plan.energy)))} />
        ) : (
          <TouEditor energy={plan.energy} err={err} canEdit={canEdit} update={(f) => update((d) => void (d.plan.energy.kind === "tou" && f(d.plan.energy)))} />
        )}
      </div>
    </Card>
  );
}

/** How exported energy is credited, and when the year is trued up. */
function ExportCard({ record, err, update }: PlanEditorProps) {
  const plan = record.plan;
  return (
    <Card title="Exported energy">
      <RadioGroup
        name="compensation-kind"
        label="Export compensation"
        options={[
          ["net-metering", "Net metering"],
          ["net-billing", "Net billing"],
          ["no-export", "No export"],
        ]}
        value={plan.compensation.kind}
        onChange={(kind) => update((d) => void (d.plan.compensation = compensationTemplate(kind)))}
      />
      <p className="mt-1 text-sm text-graphite-soft">
        {plan.compensation.kind === "net-metering"
          ? "Imports and exports are netted each month (per period on time-of-use); surplus becomes a credit at the retail price. At the annual true-up the year's net surplus kWh is paid at the surplus rate and leftover credit lapses."
          : plan.compensation.kind === "net-billing"
            ? "Every kWh bought is charged at the retail price; every kWh exported earns the export rate as a credit against energy charges. Leftover credit lapses at the true-up."
            : "Exported energy earns nothing."}
      </p>
      {plan.compensation.kind !== "no-export" ? (
        <div className="mt-3 grid gap-3 md:grid-cols-2">
          <div>
            <label htmlFor="true-up-month" className="field-label">
              True-up at the end of
            </label>
            <select
              id="true-up-month"
              className="field-input"
              value={plan.compensation.trueUpMonth}
              onChange={(e) => update((d) => void (d.plan.compensation.kind !== "no-export" && (d.plan.compensation.trueUpMonth = Number(e.target.value))))}
            >
              {MONTH_LONG.map((m, i) => (
                <option key={m} value={i + 1}>
                  {m}
                </option>
              ))}
            </select>
          </div>
          {plan.compensation.kind === "net-metering" ? (
            <NumberInput
              id="surplus-rate"
              label="Surplus paid at true-up (¢/kWh)"
              storedDecimals={4}
              value={plan.compensation.surplusCentsPerKwh}
              error={err("compensation.surplusCentsPerKwh")}
              onValue={(v) => update((d) => void (d.plan.compensation.kind === "net-metering" && (d.plan.compensation.surplusCentsPerKwh = nn(v))))}
            />
          ) : (
            <NumberInput
              id="export-rate"
              label="Export credit (¢/kWh)"
              storedDecimals={4}
              value={plan.compensation.exportCentsPerKwh}
              error={err("compensation.exportCentsPerKwh")}
              onValue={(v) => update((d) => void (d.plan.compensation.kind === "net-billing" && (d.plan.compensation.exportCentsPerKwh = nn(v))))}
            />
          )}
        </div>
      ) : null}
    </Card>
  );
}

/** The plan's time-of-use periods, each with its price. */
function TouPeriods({ energy, err, canEdit, update }: TouProps) {
  return (
    <div>
      <h3 className="text-sm font-semibold">Periods</h3>
      <div className="mt-1 space-y-2">
        {energy.periods.map((p, i) => (
          <div key={p.id} className="grid items-end gap-2 md:grid-cols-[auto_2fr_1fr_auto]" data-testid={`period-${i}`}>
            <span className={`mb-3 inline-block h-4 w-4 rounded-sm ${PERIOD_COLORS[i % PERIOD_COLORS.length]}`} aria-hidden />
            <TextField id={`period-${i}-label`} label="Name" value={p.label ?? ""} error={err(`energy.periods.${i}.label`) ?? err(`energy.periods.${i}.id`)} onText={(t) => update((e) => void (e.periods[i].label = t))} />
            <NumberInput id={`period-${i}-price`} label="Price (¢/kWh)" storedDecimals={4} value={p.centsPerKwh} error={err(`energy.periods.${i}.centsPerKwh`)} onValue={(v) => update((e) => void (e.periods[i].centsPerKwh = nn(v)))} />
            {canEdit && energy.periods.length > 1 ? (
              <button type="button" className="btn-quiet min-h-9 px-3" aria-label={`Remove period ${p.label || p.id}`} onClick={() => update((e) => void e.periods.splice(i, 1))}>
                Remove
              </button>
            ) : null}
          </div>
        ))}
      </div>
      {canEdit ? (
        <button
          type="button"
          className="btn-quiet mt-2"
          onClick={() =>
            update((e) => {
              let n = e.periods.length + 1;
              while (e.periods.some((p) => p.id === `period-${n}`)) n++;
              e.periods.push({ id: `period-${n}`, label: `Period ${n}`, centsPerKwh: 14 });
            })
          }
        >
          Add a period
        </button>
      ) : null}
    </div>
  );
}

/** One season: its name, other-hours period, months, and weekday and weekend hours. */
function SeasonCard({ s, season, energy, periodOptions, byHour, canEdit, err, update }: SeasonProps) {
  return (
    <div className="rounded-md border border-paper-line p-3" data-testid={`season-${s}`}>
      <div className="grid items-end gap-2 md:grid-cols-[2fr_2fr_auto]">
        <TextField id={`season-${s}-name`} label="Season" value={season.name} error={err(`energy.seasons.${s}.name`)} onText={(t) => update((e) => void (e.seasons[s].name = t))} />
        <PeriodSelect id={`season-${s}-other`} label="Other hours" value={season.otherHoursPeriodId} options={periodOptions} error={err(`energy.seasons.${s}.otherHoursPeriodId`)} onPick={(v) => update((e) => void (e.seasons[s].otherHoursPeriodId = v))} />
        {canEdit && energy.seasons.length > 1 ? (
          <button type="button" className="btn-quiet min-h-9 px-3" aria-label={`Remove season ${season.name}`} onClick={() => update((e) => void e.seasons.splice(s, 1))}>
            Remove
          </button>
        ) : null}
      </div>
      <SeasonMonths s={s} season={season} err={err} update={update} />
      {(["weekday", "weekend"] as const).map((dayType) => (
        <DayTypeHours key={dayType} dayType={dayType} s={s} season={season} energy={energy} periodOptions={periodOptions} byHour={byHour} canEdit={canEdit} err={err} update={update} />
      ))}
    </div>
  );
}

/** The sample year's bill month by month; picking a month shows its lines below. */
function BillMonths({ bill, month, onPick }: { bill: AnnualBill; month: number; onPick: (month: number) => void }) {
  return (
    <table className="mt-3 w-full text-sm">
      <thead className="text-left text-xs uppercase tracking-wide text-graphite-soft">
        <tr>
          <th className="py-1">Month</th>
          <th className="py-1 text-right">Bill</th>
        </tr>
      </thead>
      <tbody className="divide-y divide-paper-line">
        {bill.months.map((m, i) => (
          <tr key={m.month} className={i === month ? "bg-paper-deep" : undefined}>
            <td className="py-0.5">
              <button type="button" className="text-left hover:underline" aria-pressed={i === month} onClick={() => onPick(i)}>
                {MONTH_LONG[i]}
              </button>
            </td>
            <td className="figure py-0.5 text-right">{money(m.totalCents)}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
