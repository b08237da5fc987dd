"use client";
import { useRouter } from "next/navigation";
import { useId, useState, type FormEvent } from "react";
import { FormMessage } from "@/components/ui/field";
import { RadioGroup } from "@/components/ui/radio-group";
import { BOS_CSV_COLUMNS } from "@/lib/schemas/bos";
import { CSV_MAX_BYTES, INVERTER_CSV_COLUMNS, MODULE_CSV_COLUMNS, type CsvImportReport, type ImportMode } from "@/lib/schemas/catalog";

type Kind = "modules" | "inverters" | "bos-parts";
const ENDPOINT: Record<Kind, string> = { modules: "/api/module-models/import", inverters: "/api/inverter-models/import", "bos-parts": "/api/bos-parts/import" };
const NOUN: Record<Kind, string> = { modules: "module", inverters: "inverter", "bos-parts": "part" };
/** How the kind reads in a sentence ("Import … from CSV"). */
const WORDS: Record<Kind, string> = { modules: "modules", inverters: "inverters", "bos-parts": "balance-of-system parts" };
const COLUMNS = { modules: MODULE_CSV_COLUMNS, inverters: INVERTER_CSV_COLUMNS, "bos-parts": BOS_CSV_COLUMNS };

const plural = (n: number, word: string) => `${n} ${word}${n === 1 ? "" : "s"}`;

/** Uploads a CSV to the import route and shows its report: every bad row by line and column. */
export function CsvImport({ kind }: { kind: Kind }) {
  const router = useRouter();
  const formId = useId();
  const [mode, setMode] = useState<ImportMode>("all_or_nothing");
  const [file, setFile] = useState<File | null>(null);
  const [busy, setBusy] = useState(false);
  const [failure, setFailure] = useState<string | null>(null);
  const [report, setReport] = useState<CsvImportReport | null>(null);

  async function onSubmit(e: FormEvent) {
    e.preventDefault();
    setFailure(null);
    setReport(null);
    if (!file) return setFailure("Choose a CSV file first.");
    if (file.size > CSV_MAX_BYTES) return setFailure(`The file is larger than ${CSV_MAX_BYTES / 1_000_000} MB. Split it into smaller files.`);
    setBusy(true);
    try {
      const body = new FormData();
      body.set("file", file);
      body.set("mode", mode);
      const res = await fetch(ENDPOINT[kind], { method: "POST", body });
      const json = (await res.json().catch(() => null)) as { data?: CsvImportReport; error?: { message: string } } | null;
      if (!res.ok || !json?.data) {
        setFailure(json?.error?.message ?? `The import failed (HTTP ${res.status}). Nothing was imported.`);
        return;
      }
      setReport(json.data);
      if (json.data.applied) router.refresh();
    } catch {
      setFailure("The upload did not reach the server. Check the connection; nothing was imported.");
    } finally {
      setBusy(false);
    }
  }

  return (
    <div className="card p-5">
      <h3 className="text-base font-semibold">Import {WORDS[kind]} from CSV</h3>
      <p className="mt-1 text-sm text-graphite-soft">
        Rows whose manufacturer and model are already in the catalog are updated; the others are added. The import is all in one step: it never
        leaves half a file behind.
      </p>
      <form onSubmit={onSubmit} className="mt-3 space-y-3" aria-describedby={`${formId}-result`}>
        <div>
          <label htmlFor={`${formId}-file`} className="field-label">
            CSV file ({NOUN[kind]}s)
          </label>
          <input
            id={`${formId}-file`}
            name="file"
            type="file"
            accept=".csv,text/csv"
            className="block min-h-touch text-sm file:mr-3 file:min-h-touch file:rounded-md file:border file:border-paper-line file:bg-white file:px-4"
            onChange={(e) => setFile(e.target.files?.[0] ?? null)}
          />
        </div>
        <RadioGroup
          name={`${formId}-mode`}
          label="If a row is bad"
          legend
          options={[
            ["all_or_nothing", "Import nothing if any row is bad"],
            ["good_rows", "Import only the good rows"],
          ]}
          value={mode}
          onChange={setMode}
        />
        <button type="submit" className="btn-primary" disabled={busy}>
          {busy ? "Importing…" : `Import ${WORDS[kind]}`}
        </button>
      </form>
      <div id={`${formId}-result`} className="mt-3 space-y-2" data-testid={`${NOUN[kind]}-import-result`}>
        {failure ? <FormMessage tone="error">{failure}</FormMessage> : null}
        {report ? <ImportReport kind={kind} report={report} /> : null}
      </div>
    </div>
  );
}

/** What the import did: the counts, every bad row by line and column, and the rows it updated. */
function ImportReport({ kind, report }: { kind: Kind; report: CsvImportReport }) {
  const bad = new Set(report.errors.map((e) => e.line)).size;
  return (
    <>
      {report.applied ? (
        <FormMessage tone="success">
          Imported {plural(report.created.length, `new ${NOUN[kind]}`)} and updated {plural(report.updated.length, NOUN[kind])}
          {report.errors.length > 0 ? `; skipped ${plural(bad, "bad row")}.` : "."}
        </FormMessage>
      ) : report.errors.length > 0 ? (
        <FormMessage tone="error">
          Nothing was imported: {plural(bad, "line")} {bad === 1 ? "has" : "have"} problems.
          {report.mode === "all_or_nothing" && report.rowsRead > 0 ? " Fix them and upload again, or choose “Import only the good rows”." : ""}
        </FormMessage>
      ) : (
        <FormMessage tone="info">The file has no data rows; nothing was imported.</FormMessage>
      )}
      {report.errors.length > 0 ? (
        <ol className="divide-y divide-paper-line rounded-md border border-paper-line text-sm" aria-label="Problems by line">
          {report.errors.map((e, i) => (
            <li key={i} className="flex gap-3 px-3 py-1.5" data-testid="import-error">
              <span className="figure w-20 shrink-0 text-danger">Line {e.line}</span>
              <span className="figure w-48 shrink-0">{e.column}</span>
              <span>{e.message}</span>
            </li>
          ))}
        </ol>
      ) : null}
      {report.updated.length > 0 ? (
        <details className="text-sm">
          <summary className="cursor-pointer">Updated ({report.updated.length})</summary>
          <ul className="mt-1 list-inside list-disc text-graphite-soft">
            {report.updated.map((u) => (
              <li key={u.line}>
                Line <span className="figure">{u.line}</span>: {u.manufacturer} {u.model}
              </li>
            ))}
          </ul>
        </details>
      ) : null}
    </>
  );
}

/** The file's columns, from the same list the import and export use. */
export function CsvColumnsHelp({ kind }: { kind: Kind }) {
  const columns = COLUMNS[kind];
  return (
    <details className="card p-5 text-sm">
      <summary className="cursor-pointer font-medium">CSV columns for {WORDS[kind]}</summary>
      <p className="mt-2 text-graphite-soft">
        UTF-8, comma-separated, a header row with these names in any order (line 1); one {NOUN[kind]} per line. Decimals use a point. At most 1 MB.
      </p>
      <p className="figure mt-2 overflow-x-auto whitespace-nowrap rounded-md bg-paper-deep px-3 py-2 text-xs">{columns.map((c) => c.name).join(",")}</p>
      <table className="mt-3 w-full text-left">
        <thead className="text-xs uppercase tracking-wide text-graphite-soft">
          <tr>
            <th scope="col" className="py-1 pr-3">Column</th>
            <th scope="col" className="py-1 pr-3">Required</th>
            <th scope="col" className="py-1">Meaning</th>
          </tr>
        </thead>
        <tbody className="divide-y divide-paper-line">
          {columns.map((c) => (
            <tr key={c.name}>
              <td className="figure py-1 pr-3">{c.name}</td>
              <td className="py-1 pr-3">{c.required ? "yes" : "no"}</td>
              <td className="py-1">{c.meaning}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </details>
  );
}
