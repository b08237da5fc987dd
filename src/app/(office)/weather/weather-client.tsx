"use client";
import { zodResolver } from "@hookform/resolvers/zod";
import { useRef, useState, type RefObject } from "react";
import { useForm, type FieldErrors, type UseFormRegister } from "react-hook-form";
import type { z } from "zod";
import { EmptyState } from "@/components/ui/empty-state";
import { describedBy, Field, FieldShell, FormMessage, optionsOf, SaveRow, SelectField, StatusMessage, type Notice } from "@/components/ui/field";
import { plainError, type FieldLabels } from "@/lib/validation-messages";
import { TableShell, Td, Th } from "@/components/ui/table";
import { useSave } from "@/components/ui/use-save";
import { api } from "@/lib/api-client";
import {
  nearestQuerySchema,
  stationFieldsSchema,
  WEATHER_FILE_MAX_BYTES,
  WEATHER_FILE_MAX_LABEL,
  WEATHER_FORMAT_CHOICES,
  WEATHER_FORMAT_LABELS,
  type NearestQueryInput,
  type StationFields,
  type StationFieldsInput,
} from "@/lib/schemas/weather";

export type StationView = {
  id: string;
  name: string;
  format: "epw" | "tmy3" | "csv";
  latitude: number;
  longitude: number;
  elevationM: number;
  utcOffsetHours: number;
  attribution: string;
  annualGhiKwhPerM2: number;
  fileName: string;
  sizeBytes: number;
  createdAt: string;
  /** The day it was added, on the company's clock. */
  addedOn: string;
  designCount: number;
  sites: { householdId: string; name: string; city: string; distanceKm: number; how: "chosen" | "nearest" }[];
};

const FORMAT_NAMES: Record<StationView["format"], string> = { epw: "EPW", tmy3: "TMY3", csv: "Hourly CSV" };
const kwh = new Intl.NumberFormat("en-US", { maximumFractionDigits: 0 });
const deg = (v: number, pos: string, neg: string) => `${Math.abs(v).toFixed(3)}° ${v >= 0 ? pos : neg}`;
const utc = (h: number) => `UTC${h >= 0 ? "+" : "−"}${Math.abs(h)}`;
const km = (d: number) => `${d < 10 ? d.toFixed(1) : kwh.format(d)} km`;

export function WeatherClient(props: { stations: StationView[]; canManage: boolean; seesAllSites: boolean; maxDistanceKm: number }) {
  const [notice, setNotice] = useState<Notice | null>(null);
  return (
    <div className="mt-6 space-y-8">
      <StatusMessage notice={notice} />
      {props.canManage ? <UploadStationForm /> : null}
      <StationsTable stations={props.stations} canManage={props.canManage} seesAllSites={props.seesAllSites} onNotice={setNotice} />
      <NearestCheck maxDistanceKm={props.maxDistanceKm} />
    </div>
  );
}

// ── Upload ────────────────────────────────────────────────────────────────────────────────

type StationFormValues = StationFieldsInput;
const EMPTY: StationFormValues = { name: "", format: "auto", latitude: "", longitude: "", elevationM: "", utcOffsetHours: "", attribution: "" };
const FORM_FIELDS = ["name", "format", "latitude", "longitude", "elevationM", "utcOffsetHours", "attribution"] as const satisfies readonly (keyof StationFields)[];

type StationFormParts = { register: UseFormRegister<StationFormValues>; errors: FieldErrors<StationFormValues> };

/** The station forms' labels, for the messages that name a field (src/lib/validation-messages.ts). */
const STATION_LABELS: FieldLabels = {
  name: "Name",
  format: "Format",
  latitude: "Latitude (° N)",
  longitude: "Longitude (° E, west negative)",
  elevationM: "Elevation (m)",
  utcOffsetHours: "UTC offset (h, standard time)",
  attribution: "Attribution",
  file: "Weather file",
};
const NEAREST_LABELS: FieldLabels = { lat: "Latitude (° N)", lon: "Longitude (° E, west negative)" };

/** The upload's status (the file's check, its refusal or the station added) stands beside its button. */
function UploadStationForm() {
  const fileRef = useRef<HTMLInputElement>(null);
  const [fileError, setFileError] = useState<string | null>(null);
  const [fileIssues, setFileIssues] = useState<string[]>([]);
  const {
    register,
    handleSubmit,
    reset,
    watch,
    setError,
    formState: { errors },
  } = useForm<StationFormValues, unknown, StationFields>({ resolver: zodResolver(stationFieldsSchema, { error: plainError(STATION_LABELS) }), defaultValues: EMPTY });
  const format = watch("format");
  const upload = useSave<{ values: StationFields; file: File }, { name: string; annualGhiKwhPerM2: number }, StationFormValues>({
    request: ({ values, file }) => {
      const body = new FormData();
      body.set("file", file);
      // The checked values go to the server, which validates them again with the same schema.
      for (const key of FORM_FIELDS) if (values[key] !== undefined) body.set(key, String(values[key]));
      return { url: "/api/weather-stations", method: "POST", body };
    },
    setError,
    labels: STATION_LABELS,
    onFieldErrors: (fields) => setFileIssues(fields.file ?? []),
    success: (station) => `${station.name} added: ${kwh.format(station.annualGhiKwhPerM2)} kWh/m² of sun on the horizontal a year.`,
    onSaved: () => {
      reset(EMPTY);
      if (fileRef.current) fileRef.current.value = "";
    },
  });

  function clearFileProblems() {
    setFileError(null);
    setFileIssues([]);
  }
  const onSubmit = handleSubmit((values) => {
    upload.setNotice(null);
    clearFileProblems();
    const file = fileRef.current?.files?.[0];
    if (!file) return setFileError("Choose a weather file to upload");
    if (file.size > WEATHER_FILE_MAX_BYTES) return setFileError(`The file is larger than ${WEATHER_FILE_MAX_LABEL}.`);
    upload.save({ values, file });
  }, upload.invalid);

  const siteHint = format === "csv" ? "Required: an hourly CSV does not say where it was measured." : "Leave empty to use the file header.";
  return (
    <section aria-labelledby="upload-heading" className="card p-5">
      <h2 id="upload-heading" className="text-lg font-semibold">
        Add a station
      </h2>
      <p className="mt-1 max-w-3xl text-sm text-graphite-soft">
        A typical year of hourly weather, up to {WEATHER_FILE_MAX_LABEL}: an EPW file, an NREL TMY3 CSV, or an hourly CSV with the columns{" "}
        <code className="figure text-xs wrap-anywhere">month,day,hour,ghi,dni,dhi,temp_air,wind_speed</code> (ghi and albedo optional; lines starting with # are
        notes). The whole file is checked first; nothing is stored unless every hour reads correctly.
      </p>
      <form onSubmit={onSubmit} noValidate className="mt-4 space-y-4">
        <div className="grid gap-4 md:grid-cols-[2fr_1.3fr_2fr]">
          <StationFileInput fileRef={fileRef} fileError={fileError} hasIssues={fileIssues.length > 0} onPick={clearFileProblems} />
          <SelectField id="station-format" label="Format" options={optionsOf(WEATHER_FORMAT_CHOICES, WEATHER_FORMAT_LABELS)} {...register("format")} />
          <Field id="station-name" label="Name" autoComplete="off" hint="Empty: the name in the file header." error={errors.name?.message} {...register("name")} />
        </div>
        {fileIssues.length ? <FileIssues issues={fileIssues} /> : null}
        <StationSiteFields register={register} errors={errors} hint={siteHint} />
        <AttributionField register={register} errors={errors} />
        <SaveRow notice={upload.notice}>
          <button type="submit" className="btn-primary" disabled={upload.pending}>
            {upload.pending ? "Checking the file…" : "Check and add station"}
          </button>
        </SaveRow>
      </form>
    </section>
  );
}

// ── List ──────────────────────────────────────────────────────────────────────────────────

const SITES_SHOWN = 6;

function StationsTable(props: { stations: StationView[]; canManage: boolean; seesAllSites: boolean; onNotice: (n: Notice | null) => void }) {
  const [confirming, setConfirming] = useState<string | null>(null);
  const remove = useSave<StationView>({
    request: (s) => ({ url: `/api/weather-stations/${s.id}`, method: "DELETE" }),
    success: (_, s) => `${s.name} and its file are deleted.`,
    notify: props.onNotice,
    onSaved: () => setConfirming(null),
  });
  const pending = remove.pending;

  return (
    <section aria-labelledby="stations-heading" className="space-y-2">
      <h2 id="stations-heading" className="text-lg font-semibold">
        Stations
      </h2>
      {props.stations.length === 0 ? (
        <EmptyState>
          No weather stations yet. {props.canManage ? "Add a weather file above." : "Ask an admin to add a weather file."} Until then, production comes from a
          figure entered by hand.
        </EmptyState>
      ) : (
        <TableShell
          minWidth={900}
          alignTop
          head={
            <>
              <Th>Station</Th>
              <Th>Location</Th>
              <Th numeric>Annual GHI</Th>
              <Th>Attribution</Th>
              <Th>{props.seesAllSites ? "Sites using it" : "Your sites using it"}</Th>
              {props.canManage ? (
                <Th>
                  <span className="sr-only">Actions</span>
                </Th>
              ) : null}
            </>
          }
        >
          {props.stations.map((s) => (
            <StationRow key={s.id} station={s} canManage={props.canManage} confirming={confirming} setConfirming={setConfirming} pending={pending} onRemove={remove.save} />
          ))}
        </TableShell>
      )}
    </section>
  );
}

// ── Nearest station for a location ────────────────────────────────────────────────────────

type NearestAnswer =
  | { found: true; distanceKm: number; maxDistanceKm: number; station: { name: string; annualGhiKwhPerM2: number } }
  | { found: false; maxDistanceKm: number; message: string };

function NearestCheck({ maxDistanceKm }: { maxDistanceKm: number }) {
  const [answer, setAnswer] = useState<NearestAnswer | null>(null);
  const [error, setError] = useState<string | null>(null);
  const {
    register,
    handleSubmit,
    formState: { errors, isSubmitting },
  } = useForm<NearestQueryInput, unknown, z.output<typeof nearestQuerySchema>>({ resolver: zodResolver(nearestQuerySchema, { error: plainError(NEAREST_LABELS) }), defaultValues: { lat: "", lon: "" } });

  const onSubmit = handleSubmit(async (values) => {
    setError(null);
    setAnswer(null);
    const params = new URLSearchParams({ lat: String(values.lat), lon: String(values.lon) });
    try {
      setAnswer(await api<NearestAnswer>(`/api/weather-stations/nearest?${params}`));
    } catch (err) {
      setError((err as Error).message);
    }
  });

  return (
    <section aria-labelledby="nearest-heading" className="card p-5">
      <h2 id="nearest-heading" className="text-lg font-semibold">
        Which station serves a place?
      </h2>
      <p className="mt-1 text-sm text-graphite-soft">
        The nearest station by great-circle distance, if it lies within <span className="figure">{maxDistanceKm}</span> km.
      </p>
      <form onSubmit={onSubmit} noValidate className="mt-3 grid gap-4 sm:grid-cols-[1fr_1fr_auto] sm:items-start">
        <Field id="nearest-lat" label="Latitude (° N)" inputMode="decimal" autoComplete="off" error={errors.lat?.message} {...register("lat")} />
        <Field id="nearest-lon" label="Longitude (° E, west negative)" inputMode="decimal" autoComplete="off" error={errors.lon?.message} {...register("lon")} />
        <button type="submit" className="btn-quiet sm:mt-6" disabled={isSubmitting}>
          {isSubmitting ? "Looking…" : "Find station"}
        </button>
      </form>
      <div className="mt-3">
        {error ? <FormMessage tone="error">{error}</FormMessage> : null}
        {answer?.found ? (
          <FormMessage tone="success">
            {answer.station.name}, <span className="figure">{km(answer.distanceKm)}</span> away (
            <span className="figure">{kwh.format(answer.station.annualGhiKwhPerM2)}</span> kWh/m² a year).
          </FormMessage>
        ) : null}
        {answer && !answer.found ? (
          <div role="status" aria-live="polite" className="rounded-md border border-caution/30 bg-caution-light px-3 py-2 text-sm text-graphite">
            {answer.message}
          </div>
        ) : null}
      </div>
    </section>
  );
}

/** One station: its file, place, yearly sun, attribution, the sites it serves, and (for managers) deleting it when no design uses it. */
function StationRow({ station: s, canManage, confirming, setConfirming, pending, onRemove }: { station: StationView; canManage: boolean; confirming: string | null; setConfirming: (id: string | null) => void; pending: boolean; onRemove: (station: StationView) => void }) {
  return (
    <tr data-testid={`station-${s.id}`}>
      <Td>
        <span className="font-medium">{s.name}</span>
        <span className="block text-xs text-graphite-soft">
          {FORMAT_NAMES[s.format]} · {s.fileName} · added {s.addedOn}
        </span>
      </Td>
      <Td className="figure whitespace-nowrap text-xs">
        {deg(s.latitude, "N", "S")}, {deg(s.longitude, "E", "W")}
        <span className="block text-graphite-soft">
          {kwh.format(s.elevationM)} m · {utc(s.utcOffsetHours)}
        </span>
      </Td>
      <Td className="whitespace-nowrap text-right">
        <span className="figure">{kwh.format(s.annualGhiKwhPerM2)}</span> <span className="text-xs text-graphite-soft">kWh/m²</span>
      </Td>
      <Td className="max-w-xs text-xs text-graphite-soft">{s.attribution}</Td>
      <Td className="text-xs">
        {s.sites.length === 0 ? (
          <span className="text-graphite-soft">None</span>
        ) : (
          <ul className="space-y-0.5">
            {s.sites.slice(0, SITES_SHOWN).map((site) => (
              <li key={site.householdId}>
                {site.name}, {site.city} · <span className="figure">{km(site.distanceKm)}</span>
                {site.how === "chosen" ? <span className="text-graphite-soft"> (chosen on the design)</span> : null}
              </li>
            ))}
            {s.sites.length > SITES_SHOWN ? <li className="text-graphite-soft">and {s.sites.length - SITES_SHOWN} more</li> : null}
          </ul>
        )}
      </Td>
      {canManage ? (
        <Td className="whitespace-nowrap text-right">
          {s.designCount > 0 ? (
            <span className="text-xs text-graphite-soft">
              Used by <span className="figure">{s.designCount}</span> {s.designCount === 1 ? "design" : "designs"}
            </span>
          ) : confirming === s.id ? (
            <span className="inline-flex gap-2">
              <button type="button" className="btn-danger" disabled={pending} onClick={() => onRemove(s)}>
                {pending ? "Deleting…" : "Delete for good"}
              </button>
              <button type="button" className="btn-quiet" disabled={pending} onClick={() => setConfirming(null)}>
                Keep
              </button>
            </span>
          ) : (
            <button type="button" className="btn-quiet" aria-label={`Delete ${s.name}`} onClick={() => setConfirming(s.id)}>
              Delete
            </button>
          )}
        </Td>
      ) : null}
    </tr>
  );
}

/** The weather file picker; a new pick clears the last file's problems. */
function StationFileInput({ fileRef, fileError, hasIssues, onPick }: { fileRef: RefObject<HTMLInputElement | null>; fileError: string | null; hasIssues: boolean; onPick: () => void }) {
  return (
    <FieldShell id="station-file" label="Weather file" error={fileError ?? undefined}>
      <input
        id="station-file"
        ref={fileRef}
        type="file"
        accept=".epw,.csv,text/csv,text/plain"
        className="block min-h-touch w-full text-sm file:mr-3 file:min-h-touch file:rounded-md file:border file:border-paper-line file:bg-white file:px-4 file:text-sm file:font-medium"
        aria-invalid={fileError || hasIssues ? true : undefined}
        aria-describedby={hasIssues ? "station-file-issues" : describedBy("station-file", fileError ?? undefined)}
        onChange={onPick}
      />
    </FieldShell>
  );
}

/** Every problem the server found in the file, listed. */
function FileIssues({ issues: fileIssues }: { issues: string[] }) {
  return (
    <div id="station-file-issues" role="alert" className="rounded-md border border-danger/30 bg-danger-light px-3 py-2 text-sm text-danger">
      <p className="font-medium">Problems in the file{fileIssues.length > 1 ? ` (${fileIssues.length} listed)` : ""}:</p>
      <ul className="mt-1 max-h-48 list-disc overflow-y-auto pl-5" data-testid="file-issues">
        {fileIssues.map((issue, i) => (
          <li key={i}>{issue}</li>
        ))}
      </ul>
    </div>
  );
}

function StationSiteFields({ register, errors, hint: siteHint }: StationFormParts & { hint: string }) {
  return (
    <fieldset>
      <legend className="field-label">Site of the station</legend>
      <p className="mb-2 text-sm text-graphite-soft">{siteHint}</p>
      <div className="grid gap-4 sm:grid-cols-2 md:grid-cols-4">
        <Field id="station-latitude" label="Latitude (° N)" inputMode="decimal" autoComplete="off" error={errors.latitude?.message} {...register("latitude")} />
        <Field id="station-longitude" label="Longitude (° E, west negative)" inputMode="decimal" autoComplete="off" error={errors.longitude?.message} {...register("longitude")} />
        <Field id="station-elevation" label="Elevation (m)" inputMode="decimal" autoComplete="off" error={errors.elevationM?.message} {...register("elevationM")} />
        <Field id="station-utc" label="UTC offset (h, standard time)" inputMode="decimal" autoComplete="off" error={errors.utcOffsetHours?.message} {...register("utcOffsetHours")} />
      </div>
    </fieldset>
  );
}

function AttributionField({ register, errors }: StationFormParts) {
  return (
    <FieldShell id="station-attribution" label="Attribution" hint="Where the data comes from and its licence; shown beside every estimate. Empty: taken from the file header (or the # lines of an hourly CSV)." error={errors.attribution?.message}>
      <textarea
        id="station-attribution"
        rows={2}
        className="field-input py-2"
        aria-invalid={errors.attribution ? true : undefined}
        aria-describedby={describedBy("station-attribution", errors.attribution?.message, true)}
        {...register("attribution")}
      />
    </FieldShell>
  );
}
