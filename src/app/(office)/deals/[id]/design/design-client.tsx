"use client";
// The Design tab: roof faces, equipment, weather, sizing, the live production estimate against
// usage, and the string check. The station's hourly weather and the deal's usage are fetched
// once; the engine then runs here, in the browser, on every edit.
import { useQuery } from "@tanstack/react-query";
import { useDeferredValue, useMemo, useState } from "react";
import { Field, FormMessage, SelectField, StatusMessage, type Notice } from "@/components/ui/field";
import { useSave } from "@/components/ui/use-save";
import { estimateProduction } from "@/engine/production";
import type { WeatherYear } from "@/engine/weather";
import { api } from "@/lib/api-client";
import { fieldErrorsToErrors } from "@/lib/form-errors";
import { checkStringPlan, engineSystem, inverterAcKw, manualProductionHourly, sizeDesign, STRING_CAUTION, suggestStrings, type InverterSpec, type ModuleSpec } from "@/lib/offer-figures";
import { DEFAULT_HIGHEST_TEMP_C, DEFAULT_LOWEST_TEMP_C, DEFAULT_SYSTEM_LOSSES_PCT, designDocumentSchema, type DesignDocument, type DesignDocumentInput } from "@/lib/schemas/design";
import type { DesignInputs, DesignRecord, WeatherColumns } from "@/server/designs";
import { ProductionChart } from "./production-chart";

type FaceDraft = { id: string; name: string; tiltDeg: string; azimuthDeg: string; usableSlots: string; solarAccess: string; moduleCount: string };
type Draft = {
  moduleId: string;
  inverterId: string;
  inverterCount: string;
  faces: FaceDraft[];
  weatherKind: "nearest" | "station" | "manual";
  stationId: string;
  manualAnnualKwh: string;
  manualMonthlyKwh: string;
  manualSource: string;
  lossesPct: string;
  targetOffsetPct: string;
  stringSizes: string;
  lowestTempC: string;
  highestTempC: string;
};

let faceSeq = 0;
const newFaceId = () => `face-${Date.now().toString(36)}-${(faceSeq += 1)}`;
const numberOrNaN = (s: string) => (s.trim() === "" ? Number.NaN : Number(s.trim()));
const listOfNumbers = (s: string) =>
  s
    .split(/[,;\s]+/)
    .filter((x) => x !== "")
    .map(Number);

function emptyFace(n: number): FaceDraft {
  return { id: newFaceId(), name: `Face ${n}`, tiltDeg: "25", azimuthDeg: "180", usableSlots: "12", solarAccess: "100", moduleCount: "0" };
}

function draftFrom(inputs: DesignInputs): Draft {
  const saved = inputs.design?.document;
  const firstModule = inputs.modules[0]?.id ?? "";
  const firstInverter = inputs.inverters[0]?.id ?? "";
  const w = saved?.weather;
  return {
    moduleId: saved?.moduleId ?? firstModule,
    inverterId: saved?.inverterId ?? firstInverter,
    inverterCount: String(saved?.inverterCount ?? 1),
    faces: saved
      ? saved.faces.map((f) => ({
          id: f.id,
          name: f.name,
          tiltDeg: String(f.tiltDeg),
          azimuthDeg: String(f.azimuthDeg),
          usableSlots: String(f.usableSlots),
          solarAccess: Array.isArray(f.solarAccessPct) ? f.solarAccessPct.join(", ") : String(f.solarAccessPct),
          moduleCount: String(f.moduleCount),
        }))
      : [emptyFace(1)],
    weatherKind: w?.kind ?? (inputs.nearest ? "nearest" : "manual"),
    stationId: w?.kind === "station" ? w.stationId : (inputs.nearest?.stationId ?? inputs.stations[0]?.id ?? ""),
    manualAnnualKwh: w?.kind === "manual" ? String(w.annualKwh) : "",
    manualMonthlyKwh: w?.kind === "manual" && w.monthlyKwh ? w.monthlyKwh.join(", ") : "",
    manualSource: w?.kind === "manual" ? w.source : "",
    lossesPct: String(saved?.lossesPct ?? DEFAULT_SYSTEM_LOSSES_PCT),
    targetOffsetPct: String(saved?.targetOffsetPct ?? 100),
    stringSizes: saved?.stringPlan ? saved.stringPlan.stringSizes.join(", ") : "",
    lowestTempC: String(saved?.stringPlan?.lowestTempC ?? DEFAULT_LOWEST_TEMP_C),
    highestTempC: String(saved?.stringPlan?.highestTempC ?? DEFAULT_HIGHEST_TEMP_C),
  };
}

function toDocument(d: Draft, inverterKind: "string" | "micro" | null): DesignDocumentInput {
  const weather: DesignDocumentInput["weather"] =
    d.weatherKind === "nearest"
      ? { kind: "nearest" }
      : d.weatherKind === "station"
        ? { kind: "station", stationId: d.stationId }
        : {
            kind: "manual",
            annualKwh: numberOrNaN(d.manualAnnualKwh),
            monthlyKwh: d.manualMonthlyKwh.trim() === "" ? null : listOfNumbers(d.manualMonthlyKwh),
            source: d.manualSource,
          };
  return {
    moduleId: d.moduleId,
    inverterId: d.inverterId,
    inverterCount: numberOrNaN(d.inverterCount),
    faces: d.faces.map((f) => ({
      id: f.id,
      name: f.name,
      tiltDeg: numberOrNaN(f.tiltDeg),
      azimuthDeg: numberOrNaN(f.azimuthDeg),
      usableSlots: numberOrNaN(f.usableSlots),
      solarAccessPct: f.solarAccess.includes(",") ? listOfNumbers(f.solarAccess) : numberOrNaN(f.solarAccess),
      moduleCount: numberOrNaN(f.moduleCount),
    })),
    weather,
    lossesPct: numberOrNaN(d.lossesPct),
    targetOffsetPct: numberOrNaN(d.targetOffsetPct),
    stringPlan:
      inverterKind === "string"
        ? { stringSizes: listOfNumbers(d.stringSizes), lowestTempC: numberOrNaN(d.lowestTempC), highestTempC: numberOrNaN(d.highestTempC) }
        : null,
  };
}

function toWeatherYear(c: WeatherColumns): WeatherYear {
  return {
    format: c.format,
    sourceLabel: c.sourceLabel,
    site: c.site,
    month: Uint8Array.from(c.month),
    day: Uint8Array.from(c.day),
    hour: Uint8Array.from(c.hour),
    ghi: Float64Array.from(c.ghi),
    dni: Float64Array.from(c.dni),
    dhi: Float64Array.from(c.dhi),
    tempAirC: Float64Array.from(c.tempAirC),
    windSpeedMs: Float64Array.from(c.windSpeedMs),
    albedo: Float64Array.from(c.albedo),
    ghiDerived: false,
    albedoFromFileHours: 0,
    notes: [],
  };
}

type Estimate = { monthlyKwh: number[]; annualKwh: number; kwDc: number; kwAc: number; clippedKwh: number | null; ms: number; label: string };

const fmt = (x: number, digits = 0) => x.toLocaleString("en-US", { minimumFractionDigits: digits, maximumFractionDigits: digits });

function issuesByPath(doc: DesignDocumentInput): Record<string, string> {
  const parsed = designDocumentSchema.safeParse(doc);
  if (parsed.success) return {};
  const out: Record<string, string> = {};
  for (const issue of parsed.error.issues) {
    const key = issue.path.join(".");
    out[key] ??= issue.message;
  }
  return out;
}

export function DesignClient({ dealId, canEdit, initialInputs }: { dealId: string; canEdit: boolean; initialInputs?: DesignInputs }) {
  const inputsQuery = useQuery({
    queryKey: ["design-inputs", dealId],
    queryFn: () => api<DesignInputs>(`/api/deals/${dealId}/design-inputs`),
    initialData: initialInputs,
    staleTime: Infinity,
  });
  if (inputsQuery.isPending) return <p role="status" className="text-graphite-soft">Loading the design…</p>;
  if (inputsQuery.isError) return <FormMessage tone="error">{inputsQuery.error.message}</FormMessage>;
  const inputs = inputsQuery.data;
  if (inputs.modules.length === 0 || inputs.inverters.length === 0) {
    return <FormMessage tone="info">The equipment catalog has no active {inputs.modules.length === 0 ? "modules" : "inverters"} yet. Ask an admin to add them under Catalog.</FormMessage>;
  }
  // The editor keeps its draft across refetches (e.g. after the first save gives the design an id).
  return <DesignEditor dealId={dealId} inputs={inputs} canEdit={canEdit} />;
}

type Mod = DesignInputs["modules"][number];
type Inv = DesignInputs["inverters"][number];
/** What every card of the editor needs: the draft, its errors, and how to change it. */
type DraftParts = { draft: Draft; errors: Record<string, string>; disabled: boolean; set: (patch: Partial<Draft>) => void };

/** The year's production for a valid design: from the station's weather, or spread from a typed figure. */
function estimateFor(doc: DesignDocument | null, mod: Mod | null, inv: Inv | null, weather: WeatherYear | null): Estimate | null {
  if (!doc || !mod || !inv) return null;
  const counts = doc.faces.map((f) => f.moduleCount);
  const modules = counts.reduce((a, b) => a + b, 0);
  const kwDc = (modules * mod.stcWatts) / 1000;
  const t0 = performance.now();
  if (doc.weather.kind === "manual") {
    const hourly = manualProductionHourly(doc.weather.annualKwh, doc.weather.monthlyKwh);
    const monthly = Array.from({ length: 12 }, () => 0);
    const months = doc.weather.monthlyKwh ?? null;
    if (months) months.forEach((v, i) => (monthly[i] = v));
    else {
      let h = 0;
      [31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31].forEach((d, m) => {
        for (let k = 0; k < d * 24; k++, h++) monthly[m] += hourly[h];
      });
    }
    return { monthlyKwh: monthly, annualKwh: doc.weather.annualKwh, kwDc, kwAc: inverterAcKw(inv, doc.inverterCount, modules), clippedKwh: null, ms: performance.now() - t0, label: `Typed from another source: ${doc.weather.source}` };
  }
  if (!weather) return null;
  const sys = engineSystem(doc.faces, counts, mod, inv, { inverterCount: doc.inverterCount, lossesPct: doc.lossesPct });
  if (!sys) return { monthlyKwh: Array(12).fill(0), annualKwh: 0, kwDc: 0, kwAc: 0, clippedKwh: 0, ms: 0, label: weather.sourceLabel };
  const r = estimateProduction(weather, sys);
  return { monthlyKwh: r.monthlyAcKwh, annualKwh: r.annualAcKwh, kwDc: r.dcKw, kwAc: r.acKw, clippedKwh: r.clippedKwh, ms: performance.now() - t0, label: weather.sourceLabel };
}

/** The draft and every way to change it; any change clears the last save's errors and message. */
function useDesignDraft(inputs: DesignInputs) {
  const [draft, setDraft] = useState<Draft>(() => draftFrom(inputs));
  const [notice, setNotice] = useState<Notice | null>(null);
  const [serverErrors, setServerErrors] = useState<Record<string, string>>({});
  const setFace = (i: number, patch: Partial<FaceDraft>) => {
    setServerErrors({});
    setNotice(null);
    setDraft((d) => ({ ...d, faces: d.faces.map((f, k) => (k === i ? { ...f, ...patch } : f)) }));
  };
  const set = (patch: Partial<Draft>) => update(() => patch);
  /** Every change goes through the latest draft (never a stale copy from an earlier render). */
  const update = (change: (d: Draft) => Partial<Draft>) => {
    setServerErrors({});
    setNotice(null);
    setDraft((d) => ({ ...d, ...change(d) }));
  };
  return { draft, setDraft, notice, setNotice, serverErrors, setServerErrors, setFace, set, update };
}

/** The hourly weather of the station the draft uses (none for a typed figure), fetched once per station. */
function useStationWeather(dealId: string, inputs: DesignInputs, draft: Draft) {
  const stationId = draft.weatherKind === "station" ? draft.stationId : draft.weatherKind === "nearest" ? (inputs.nearest?.stationId ?? "") : "";
  const station = inputs.stations.find((s) => s.id === stationId) ?? null;
  const weatherQuery = useQuery({
    queryKey: ["station-weather", dealId, stationId],
    queryFn: () => api<WeatherColumns>(`/api/deals/${dealId}/design-inputs/weather?stationId=${stationId}`),
    enabled: stationId !== "",
    staleTime: Infinity,
  });
  const weather = useMemo(() => (weatherQuery.data ? toWeatherYear(weatherQuery.data) : null), [weatherQuery.data]);
  return { station, weather, weatherQuery };
}

/** Module counts per face for the target offset, and the message that says how it went. */
function sizeToTarget(validDoc: DesignDocument, mod: Mod, inv: Inv, weather: WeatherYear, annualUsageKwh: number): { counts: number[]; notice: Notice } {
  const result = sizeDesign({
    faces: validDoc.faces,
    mod,
    inv,
    inverterCount: validDoc.inverterCount,
    lossesPct: validDoc.lossesPct,
    annualUsageKwh,
    targetOffsetPct: validDoc.targetOffsetPct,
    produce: (sys) => {
      const r = estimateProduction(weather, sys);
      return { hourlyAcW: r.hourlyAcW, annualAcKwh: r.annualAcKwh, dcKw: r.dcKw };
    },
  });
  const outcome = result.outcome === "reached" ? `Sized to ${fmt(validDoc.targetOffsetPct)} % offset: ${result.totalModules} modules.` : `${result.totalModules} modules. ${result.warnings.join(" ")}`;
  return { counts: validDoc.faces.map((_, i) => result.modulesByFace[i]?.modules ?? 0), notice: { tone: result.outcome === "reached" ? "info" : "error", text: outcome } };
}

function DesignEditor({ dealId, inputs, canEdit }: { dealId: string; inputs: DesignInputs; canEdit: boolean }) {
  const { draft, setDraft, notice, setNotice, serverErrors, setServerErrors, setFace, set, update } = useDesignDraft(inputs);
  const mod = inputs.modules.find((m) => m.id === draft.moduleId) ?? null;
  const inv = inputs.inverters.find((i) => i.id === draft.inverterId) ?? null;
  const doc = useMemo(() => toDocument(draft, inv?.kind ?? null), [draft, inv?.kind]);
  const errors = useMemo(() => ({ ...issuesByPath(doc), ...serverErrors }), [doc, serverErrors]);
  const parsed = useMemo(() => designDocumentSchema.safeParse(doc), [doc]);
  const validDoc: DesignDocument | null = parsed.success ? parsed.data : null;
  const { station, weather, weatherQuery } = useStationWeather(dealId, inputs, draft);

  const deferredDoc = useDeferredValue(validDoc);
  const estimate = useMemo(() => estimateFor(deferredDoc, mod, inv, weather), [deferredDoc, mod, inv, weather]);
  const usage = inputs.usage;
  const totalModules = validDoc ? validDoc.faces.reduce((s, f) => s + f.moduleCount, 0) : null;
  const stringCheck = useMemo(() => {
    if (!validDoc?.stringPlan || !mod || !inv || inv.kind !== "string") return null;
    return checkStringPlan(mod as ModuleSpec, inv as InverterSpec, validDoc.inverterCount, validDoc.stringPlan);
  }, [validDoc, mod, inv]);

  // The tab reads through useQuery: a save refreshes that query, not the server-rendered page.
  const save = useSave<DesignDocumentInput, DesignRecord>({
    request: (document) => ({ url: "/api/designs", method: "PUT", json: { dealId, document } }),
    notify: setNotice,
    success: "Design saved.",
    fieldPrefix: "document.",
    onFieldErrors: (fields) => setServerErrors(fieldErrorsToErrors(fields)),
    onSaved: () => setServerErrors({}),
    invalidate: [["design-inputs", dealId]],
    refresh: false,
  });

  const sizingBlocked =
    !validDoc ? "Fix the marked fields first." : usage.annualKwh <= 0 ? "The deal has no usage yet: add bills on the Energy tab." : draft.weatherKind === "manual" ? "Sizing needs a weather station; with a typed figure, set the module counts by hand." : !weather ? "The weather is still loading." : null;

  function runSizing() {
    if (!validDoc || !mod || !inv || !weather) return;
    const sized = sizeToTarget(validDoc, mod, inv, weather, usage.annualKwh);
    setDraft((d) => ({ ...d, faces: d.faces.map((f, i) => ({ ...f, moduleCount: String(sized.counts[i] ?? 0) })) }));
    setNotice(sized.notice);
  }

  function suggest() {
    if (!mod || !inv || totalModules === null) return;
    const sizes = suggestStrings(totalModules, mod, inv, numberOrNaN(draft.lowestTempC), numberOrNaN(draft.highestTempC));
    set({ stringSizes: sizes.join(", ") });
  }

  const parts: DraftParts = { draft, errors, disabled: !canEdit, set };
  return (
    <div className="grid grid-cols-1 gap-6 xl:grid-cols-[3fr_2fr]">
      <div className="space-y-6">
        <EquipmentCard {...parts} inputs={inputs} inv={inv} />
        <FacesCard {...parts} canEdit={canEdit} update={update} setFace={setFace} sizingBlocked={sizingBlocked} onSize={runSizing} />
        <WeatherCard {...parts} inputs={inputs} station={station} weatherError={weatherQuery.isError ? weatherQuery.error.message : null} />
        {inv?.kind === "string" && mod ? (
          <StringsCard {...parts} canEdit={canEdit} onSuggest={suggest} totalModules={totalModules} stringCheck={stringCheck} sizes={validDoc?.stringPlan?.stringSizes ?? []} coldestHourC={weather ? Math.min(...weather.tempAirC) : null} />
        ) : null}

        {canEdit ? (
          <div className="flex flex-wrap items-center gap-3">
            <button type="button" className="btn-primary" onClick={() => save.save(doc)} disabled={save.pending}>
              {save.pending ? "Saving…" : "Save design"}
            </button>
            {!parsed.success ? <p className="text-sm text-danger">Fix the marked fields before saving.</p> : null}
          </div>
        ) : null}
        <StatusMessage notice={notice} />
      </div>

      <aside className="space-y-4 xl:sticky xl:top-4 xl:self-start" aria-label="Production estimate">
        <EstimateCard
          usage={usage}
          estimate={estimate}
          inv={inv}
          waitingFor={!validDoc ? "Fix the marked fields to update the estimate." : draft.weatherKind !== "manual" && weatherQuery.isPending ? "Loading the station's weather…" : "No estimate yet."}
        />
      </aside>
    </div>
  );
}

function EquipmentCard({ draft, errors, disabled, set, inputs, inv }: DraftParts & { inputs: DesignInputs; inv: Inv | null }) {
  return (
    <section className="card p-4" aria-labelledby="equipment-heading">
      <h2 id="equipment-heading" className="text-lg font-semibold">
        Equipment
      </h2>
      <div className="mt-3 grid gap-4 sm:grid-cols-2">
        <SelectField
          id="module"
          label="Module"
          value={draft.moduleId}
          disabled={disabled}
          onChange={(e) => set({ moduleId: e.target.value })}
          options={inputs.modules.map((m) => ({ value: m.id, label: `${m.manufacturer} ${m.model} · ${m.stcWatts} W` }))}
        />
        <SelectField
          id="inverter"
          label="Inverter"
          value={draft.inverterId}
          disabled={disabled}
          onChange={(e) => set({ inverterId: e.target.value })}
          options={inputs.inverters.map((i) => ({ value: i.id, label: `${i.manufacturer} ${i.model} · ${i.kind === "micro" ? `micro, ${i.acWatts} W` : `string, ${fmt(i.acWatts / 1000, 1)} kW`}` }))}
        />
        {inv?.kind === "string" ? (
          <Field inputMode="decimal" id="inverter-count" label="Inverters of this model" value={draft.inverterCount} error={errors.inverterCount} disabled={disabled} onChange={(ev) => set({ inverterCount: ev.target.value })} />
        ) : null}
        <Field inputMode="decimal" id="losses" label="System losses (%)" value={draft.lossesPct} error={errors.lossesPct} disabled={disabled} onChange={(ev) => set({ lossesPct: ev.target.value })} hint="Wiring, soiling, mismatch, light-induced and age losses combined; shading goes in solar access." />
      </div>
    </section>
  );
}

function FacesCard(
  props: DraftParts & {
    canEdit: boolean;
    update: (change: (d: Draft) => Partial<Draft>) => void;
    setFace: (i: number, patch: Partial<FaceDraft>) => void;
    sizingBlocked: string | null;
    onSize: () => void;
  },
) {
  const { draft, errors, disabled, set, canEdit, update, sizingBlocked } = props;
  return (
    <section className="card p-4" aria-labelledby="faces-heading">
      <div className="flex flex-wrap items-center justify-between gap-2">
        <h2 id="faces-heading" className="text-lg font-semibold">
          Roof faces
        </h2>
        {canEdit ? (
          <button type="button" className="btn-quiet" onClick={() => update((d) => ({ faces: [...d.faces, emptyFace(d.faces.length + 1)] }))} disabled={draft.faces.length >= 24}>
            Add a roof face
          </button>
        ) : null}
      </div>
      {errors.faces ? <p className="field-error">{errors.faces}</p> : null}
      <ul className="mt-3 space-y-4">
        {draft.faces.map((f, i) => (
          <FaceItem
            key={f.id}
            face={f}
            index={i}
            errors={errors}
            disabled={disabled}
            setFace={(patch) => props.setFace(i, patch)}
            onRemove={canEdit && draft.faces.length > 1 ? () => update((d) => ({ faces: d.faces.filter((_, k) => k !== i) })) : null}
          />
        ))}
      </ul>
      <div className="mt-4 flex flex-wrap items-end gap-3 border-t border-paper-line pt-4">
        <div className="w-40">
          <Field inputMode="decimal" id="target-offset" label="Target offset (%)" value={draft.targetOffsetPct} error={errors.targetOffsetPct} disabled={disabled} onChange={(ev) => set({ targetOffsetPct: ev.target.value })} />
        </div>
        {canEdit ? (
          <button type="button" className="btn-quiet" onClick={props.onSize} disabled={sizingBlocked !== null}>
            Size to target offset
          </button>
        ) : null}
        {sizingBlocked && canEdit ? <p className="text-sm text-graphite-soft">{sizingBlocked}</p> : null}
      </div>
    </section>
  );
}

function FaceItem(props: { face: FaceDraft; index: number; errors: Record<string, string>; disabled: boolean; setFace: (patch: Partial<FaceDraft>) => void; onRemove: (() => void) | null }) {
  const { face: f, index: i, errors, disabled, setFace, onRemove } = props;
  const n = i + 1;
  const e = (k: string) => errors[`faces.${i}.${k}`];
  return (
    <li className="rounded-md border border-paper-line p-3" data-testid={`face-${n}`}>
      <div className="grid gap-3 sm:grid-cols-3">
        <Field id={`face-${n}-name`} label={`Face ${n} name`} value={f.name} error={e("name")} disabled={disabled} onChange={(ev) => setFace({ name: ev.target.value })} />
        <Field inputMode="decimal" id={`face-${n}-tilt`} label={`Face ${n} tilt (°)`} value={f.tiltDeg} error={e("tiltDeg")} disabled={disabled} onChange={(ev) => setFace({ tiltDeg: ev.target.value })} />
        <Field inputMode="decimal" id={`face-${n}-azimuth`} label={`Face ${n} azimuth (°)`} value={f.azimuthDeg} error={e("azimuthDeg")} disabled={disabled} onChange={(ev) => setFace({ azimuthDeg: ev.target.value })} hint="180 south, 90 east, 270 west" />
        <Field inputMode="decimal" id={`face-${n}-slots`} label={`Face ${n} usable module slots`} value={f.usableSlots} error={e("usableSlots")} disabled={disabled} onChange={(ev) => setFace({ usableSlots: ev.target.value })} />
        <Field
          id={`face-${n}-access`}
          label={`Face ${n} solar access (%)`}
          value={f.solarAccess}
          error={e("solarAccessPct") ?? Object.entries(errors).find(([k]) => k.startsWith(`faces.${i}.solarAccessPct.`))?.[1]}
          disabled={disabled}
          onChange={(ev) => setFace({ solarAccess: ev.target.value })}
          hint="One annual value, or 12 monthly values (Jan first) separated by commas"
          inputMode="decimal"
        />
        <Field inputMode="decimal" id={`face-${n}-modules`} label={`Face ${n} modules`} value={f.moduleCount} error={e("moduleCount")} disabled={disabled} onChange={(ev) => setFace({ moduleCount: ev.target.value })} />
      </div>
      {onRemove ? (
        <button type="button" className="btn-danger mt-3" onClick={onRemove}>
          Remove face {n}
        </button>
      ) : null}
    </li>
  );
}

function WeatherCard({ draft, errors, disabled, set, inputs, station, weatherError }: DraftParts & { inputs: DesignInputs; station: DesignInputs["stations"][number] | null; weatherError: string | null }) {
  return (
    <section className="card p-4" aria-labelledby="weather-heading">
      <h2 id="weather-heading" className="text-lg font-semibold">
        Weather
      </h2>
      {inputs.nearest === null ? (
        <div className="mt-2">
          <FormMessage tone="info">
            No weather station lies within {inputs.maxStationDistanceKm} km of this site, so Kilowright has no weather to estimate from. Type an annual production figure from another
            source below, or ask an admin to add a weather file for this area.
          </FormMessage>
        </div>
      ) : null}
      <fieldset className="mt-3 min-w-0 space-y-2" disabled={disabled}>
        <legend className="sr-only">Where the production estimate comes from</legend>
        {inputs.nearest ? (
          <label className="flex min-h-touch items-center gap-2">
            <input type="radio" name="weather" checked={draft.weatherKind === "nearest"} onChange={() => set({ weatherKind: "nearest" })} />
            Nearest station: {inputs.stations.find((s) => s.id === inputs.nearest?.stationId)?.name} ({fmt(inputs.nearest.distanceKm, 1)} km away)
          </label>
        ) : null}
        {inputs.stations.length > 0 ? (
          <label className="flex min-h-touch flex-wrap items-center gap-2">
            <input type="radio" name="weather" checked={draft.weatherKind === "station"} onChange={() => set({ weatherKind: "station" })} />
            Pick a station:
            <select aria-label="Weather station" className="field-input w-full min-w-0 max-w-full sm:w-auto" value={draft.stationId} onChange={(e) => set({ weatherKind: "station", stationId: e.target.value })}>
              {inputs.stations.map((s) => (
                <option key={s.id} value={s.id}>
                  {s.name} ({fmt(s.distanceKm, 0)} km{s.distanceKm > inputs.maxStationDistanceKm ? ", beyond the usual range" : ""})
                </option>
              ))}
            </select>
          </label>
        ) : null}
        <label className="flex min-h-touch items-center gap-2">
          <input type="radio" name="weather" checked={draft.weatherKind === "manual"} onChange={() => set({ weatherKind: "manual" })} />
          Production figure from another source
        </label>
      </fieldset>
      {draft.weatherKind === "manual" ? (
        <div className="mt-3 grid gap-3 sm:grid-cols-2">
          <Field inputMode="decimal" id="manual-annual" label="Annual production from another source (kWh)" value={draft.manualAnnualKwh} error={errors["weather.annualKwh"]} disabled={disabled} onChange={(ev) => set({ manualAnnualKwh: ev.target.value })} />
          <Field id="manual-source" label="Where the figure comes from" value={draft.manualSource} error={errors["weather.source"]} disabled={disabled} onChange={(ev) => set({ manualSource: ev.target.value })} hint="e.g. the utility's solar calculator, a site survey report" />
          <Field id="manual-monthly" label="Monthly figures (optional, 12 values, Jan first)" value={draft.manualMonthlyKwh} error={errors["weather.monthlyKwh"]} disabled={disabled} onChange={(ev) => set({ manualMonthlyKwh: ev.target.value })} />
        </div>
      ) : station ? (
        <p className="mt-2 text-sm text-graphite-soft">
          {station.name}, {fmt(station.distanceKm, 1)} km from the site. Source: {station.attribution}
        </p>
      ) : null}
      {weatherError ? <FormMessage tone="error">{weatherError}</FormMessage> : null}
    </section>
  );
}

function StringsCard(
  props: DraftParts & {
    canEdit: boolean;
    onSuggest: () => void;
    totalModules: number | null;
    stringCheck: ReturnType<typeof checkStringPlan> | null;
    sizes: number[];
    coldestHourC: number | null;
  },
) {
  const { draft, errors, disabled, set, canEdit, totalModules, stringCheck, coldestHourC } = props;
  return (
    <section className="card p-4" aria-labelledby="strings-heading">
      <h2 id="strings-heading" className="text-lg font-semibold">
        String check
      </h2>
      <div className="mt-3 grid gap-3 sm:grid-cols-3">
        <Field id="string-sizes" label="Modules per string" value={draft.stringSizes} error={errors["stringPlan.stringSizes"] ?? Object.entries(errors).find(([k]) => k.startsWith("stringPlan.stringSizes."))?.[1]} disabled={disabled} onChange={(ev) => set({ stringSizes: ev.target.value })} hint="One number per string, e.g. 10, 10" />
        <Field inputMode="decimal" id="lowest-temp" label="Site record low (°C)" value={draft.lowestTempC} error={errors["stringPlan.lowestTempC"]} disabled={disabled} onChange={(ev) => set({ lowestTempC: ev.target.value })} hint={`Use the site's record or extreme-minimum low.${coldestHourC !== null ? ` The typical year's coldest hour is ${fmt(coldestHourC, 1)} °C; records go lower.` : ""}`} />
        <Field inputMode="decimal" id="highest-temp" label="Hot design temperature (°C)" value={draft.highestTempC} error={errors["stringPlan.highestTempC"]} disabled={disabled} onChange={(ev) => set({ highestTempC: ev.target.value })} />
      </div>
      {canEdit ? (
        <button type="button" className="btn-quiet mt-3" onClick={props.onSuggest} disabled={!totalModules}>
          Suggest strings for {totalModules ?? 0} modules
        </button>
      ) : null}
      {stringCheck ? <StringCheckPanel check={stringCheck} totalModules={totalModules ?? 0} sizes={props.sizes} /> : null}
      <p className="mt-3 rounded-md bg-caution-light px-3 py-2 text-sm text-graphite">{STRING_CAUTION}</p>
    </section>
  );
}

/** The live estimate beside the form: size, production, offset against the deal's usage, and the monthly chart. */
function EstimateCard({ usage, estimate, inv, waitingFor }: { usage: DesignInputs["usage"]; estimate: Estimate | null; inv: Inv | null; waitingFor: string }) {
  const offsetPct = estimate && usage.annualKwh > 0 ? (estimate.annualKwh / usage.annualKwh) * 100 : null;
  return (
    <section className="card p-4">
      <h2 className="text-lg font-semibold">Estimate against usage</h2>
      {usage.source === "none" ? <p className="mt-1 text-sm text-graphite-soft">No usage yet: add bills on the Energy tab to see the offset.</p> : null}
      <dl className="mt-3 grid grid-cols-2 gap-3">
        <Figure label="System size" value={estimate ? `${fmt(estimate.kwDc, 2)} kW DC` : "—"} testId="kw-dc" />
        <Figure label="Annual production" value={estimate ? `${fmt(estimate.annualKwh)} kWh` : "—"} testId="annual-kwh" />
        <Figure label="Offset" value={offsetPct !== null ? `${fmt(offsetPct)} %` : "—"} testId="offset" />
        <Figure label="Specific yield" value={estimate && estimate.kwDc > 0 ? `${fmt(estimate.annualKwh / estimate.kwDc)} kWh/kW` : "—"} testId="specific-yield" />
        <Figure label="Annual usage" value={`${fmt(usage.annualKwh)} kWh`} testId="annual-usage" />
        <Figure label="Inverter AC" value={estimate ? `${fmt(estimate.kwAc, 2)} kW${estimate.kwAc > 0 && inv?.kind === "string" ? ` (DC/AC ${fmt(estimate.kwDc / estimate.kwAc, 2)})` : ""}` : "—"} testId="kw-ac" />
      </dl>
      <div className="mt-4">
        {estimate ? (
          <ProductionChart usageKwh={usage.monthlyKwh} productionKwh={estimate.monthlyKwh} />
        ) : (
          <p className="text-sm text-graphite-soft" role="status">
            {waitingFor}
          </p>
        )}
      </div>
      {estimate ? (
        <p className="mt-2 text-xs text-graphite-soft">
          {estimate.label}
          {estimate.clippedKwh ? ` · ${fmt(estimate.clippedKwh)} kWh clipped at the inverter` : ""} · computed in {fmt(estimate.ms)} ms. An estimate for a typical year, not a guarantee.
        </p>
      ) : null}
    </section>
  );
}

function StringCheckPanel({ check, totalModules, sizes }: { check: ReturnType<typeof checkStringPlan>; totalModules: number; sizes: number[] }) {
  const inStrings = sizes.reduce((a, b) => a + b, 0);
  const badge = { pass: "bg-sage-light text-graphite", warn: "bg-caution-light text-caution", fail: "bg-danger-light text-danger" } as const;
  return (
    <div className="mt-4 space-y-3" data-testid="string-check">
      <p className="text-sm">
        Longest string within the limits: <span className="figure">{check.maxInSeries}</span> modules.
      </p>
      {check.problems.map((p) => (
        <p key={p} className="text-sm text-graphite-soft">
          {p}
        </p>
      ))}
      {inStrings !== totalModules && sizes.length > 0 ? (
        <p className="text-sm text-caution">
          The strings hold {inStrings} modules; the faces hold {totalModules}.
        </p>
      ) : null}
      {check.results.map(({ modulesInSeries, strings, result }) => (
        <div key={modulesInSeries} className="rounded-md border border-paper-line p-3">
          <p className="font-medium">
            {strings} × {modulesInSeries} in series:{" "}
            <span className={`rounded px-2 py-0.5 text-sm ${badge[result.status]}`}>{result.status}</span>
          </p>
          <ul className="mt-2 space-y-1 text-sm">
            {result.checks.map((c) => (
              <li key={c.id} className="flex gap-2">
                <span className={`h-fit rounded px-1.5 text-xs uppercase ${badge[c.status]}`}>{c.status}</span>
                <span>
                  <span className="font-medium">{c.rule}</span>: <span className="figure">{c.detail}</span>
                </span>
              </li>
            ))}
          </ul>
        </div>
      ))}
    </div>
  );
}

function Figure({ label, value, testId }: { label: string; value: string; testId: string }) {
  return (
    <div>
      <dt className="text-xs text-graphite-soft">{label}</dt>
      <dd className="figure text-lg" data-testid={testId}>
        {value}
      </dd>
    </div>
  );
}
