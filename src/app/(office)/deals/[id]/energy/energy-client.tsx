"use client";
import { useQuery, useQueryClient } from "@tanstack/react-query";
import { useRef, useState } from "react";
import { StatusMessage, type Notice } from "@/components/ui/field";
import { FIGURE_CHARS, figureWidth } from "@/components/ui/number-input";
import { FitTable, Th } from "@/components/ui/table";
import { useSave } from "@/components/ui/use-save";
import { api, ApiError } from "@/lib/api-client";
import { fieldErrorsToErrors } from "@/lib/form-errors";
import type { BillReading } from "@/lib/bill-reader";
import type { BillTableRow } from "@/lib/bill-reader/to-bills";
import type { BillSource } from "@/lib/enums";
import { billsTableSchema } from "@/lib/schemas/energy";
import type { UsageYear } from "@/lib/usage-year";
import { Badge } from "@/components/ui/badge";
import { BillReadingReview } from "./bill-reading-review";
import { UsageChart } from "./usage-chart";

type BillValue = { periodStart: string; periodEnd: string; kwh: number; costCents: number | null; uploadId: string | null; source: BillSource; periodEstimated: boolean };
type Row = { key: string; periodStart: string; periodEnd: string; kwh: string; cost: string; uploadId: string | null; source: BillSource; periodEstimated: boolean };
type Usage = Omit<UsageYear, "hourlyKwh">;
type UploadView = { id: string; fileName: string; mimeType: string; purpose: string; createdAt: string };
type Outcome =
  | { kind: "bill-text"; upload: { id: string; fileName: string }; reading: BillReading; source: "text" | "ocr"; message: string }
  | { kind: "bill-image"; upload: { id: string; fileName: string }; message: string }
  | { kind: "interval"; upload: { id: string; fileName: string }; message: string };

let keySeq = 0;
const toRow = (b: BillValue): Row => ({
  key: `r${keySeq++}`,
  periodStart: b.periodStart,
  periodEnd: b.periodEnd,
  kwh: String(b.kwh),
  cost: b.costCents == null ? "" : (b.costCents / 100).toFixed(2),
  uploadId: b.uploadId,
  source: b.source,
  periodEstimated: b.periodEstimated,
});
const emptyRow = (): Row => ({ key: `r${keySeq++}`, periodStart: "", periodEnd: "", kwh: "", cost: "", uploadId: null, source: "typed", periodEstimated: false });

function toPayload(rows: Row[]) {
  return {
    bills: rows
      .filter((r) => r.periodStart || r.periodEnd || r.kwh || r.cost)
      .map((r) => ({
        periodStart: r.periodStart,
        periodEnd: r.periodEnd,
        kwh: r.kwh === "" ? Number.NaN : Number(r.kwh.replaceAll(",", "")),
        costCents: r.cost.trim() === "" ? null : Math.round(Number(r.cost.replace(/[$,]/g, "")) * 100),
        uploadId: r.uploadId,
        source: r.source,
        periodEstimated: r.periodEstimated,
      })),
  };
}

/** Uploads with progress (fetch cannot report upload progress; XMLHttpRequest can). */
function uploadWithProgress(url: string, files: File[], onProgress: (pct: number) => void): Promise<Outcome> {
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open("POST", url);
    xhr.upload.onprogress = (e) => e.lengthComputable && onProgress(Math.round((e.loaded / e.total) * 100));
    xhr.onerror = () => reject(new ApiError(0, "network", "The upload was interrupted. Check the connection and try again."));
    xhr.onload = () => {
      let body: { data?: Outcome; error?: { code: string; message: string } } = {};
      try {
        body = JSON.parse(xhr.responseText);
      } catch {
        /* handled below */
      }
      if (xhr.status >= 200 && xhr.status < 300 && body.data) resolve(body.data);
      else reject(new ApiError(xhr.status, body.error?.code ?? "http_error", body.error?.message ?? `The upload failed (${xhr.status}).`));
    };
    const form = new FormData();
    for (const file of files) form.append("file", file);
    xhr.send(form);
  });
}

type Review = { uploadId: string; reading: BillReading; source: "text" | "ocr" };
type SetNotice = (notice: Notice | null) => void;

/** The bills table's save: checked here first with the server's own schema, then PUT; errors land on their rows. */
function useBillsSave(dealId: string, rows: Row[], setRows: (rows: Row[]) => void, setNotice: SetNotice) {
  const queryClient = useQueryClient();
  const [rowErrors, setRowErrors] = useState<Record<string, string>>({});
  // The tab reads usage through useQuery: the answer carries the new usage year, put straight into it.
  const save = useSave<ReturnType<typeof toPayload>, { bills: BillValue[]; usage: Usage }>({
    request: (json) => ({ url: `/api/deals/${dealId}/bills`, method: "PUT", json }),
    notify: setNotice,
    refresh: false,
    success: (data) => `Saved ${data.bills.length} bill${data.bills.length === 1 ? "" : "s"}.`,
    onFieldErrors: (fields) => setRowErrors(fieldErrorsToErrors(fields)),
    onSaved: (data) => {
      queryClient.setQueryData(["usage", dealId], data.usage);
      setRows(data.bills.length ? data.bills.map(toRow) : [emptyRow()]);
      setRowErrors({});
    },
  });

  function onSave(toSave: Row[] = rows) {
    setNotice(null);
    const payload = toPayload(toSave);
    const checked = billsTableSchema.safeParse(payload);
    if (!checked.success) {
      const errs: Record<string, string> = {};
      for (const issue of checked.error.issues) errs[issue.path.join(".")] ??= issue.message;
      setRowErrors(errs);
      setNotice({ tone: "error", text: "Some bills need a look (marked below). Nothing was saved yet." });
      return;
    }
    save.save(payload);
  }
  return { rowErrors, onSave, saving: save.pending };
}

/** A file upload with its progress; a bill's text comes back as a reading to confirm, interval data as a new usage year. */
function useBillUpload(dealId: string, setNotice: SetNotice) {
  const queryClient = useQueryClient();
  const [progress, setProgress] = useState<number | null>(null);
  /** A photo (or a PDF that may be a scan) is read by OCR once uploaded: seconds, said while it runs. */
  const [picture, setPicture] = useState(false);
  const [review, setReview] = useState<Review | null>(null);
  const fileInput = useRef<HTMLInputElement>(null);

  /** One file, or several photos of one bill's pages (read as one bill). */
  async function onFile(files: File[]) {
    setNotice(null);
    setPicture(files.some((file) => file.type.startsWith("image/") || file.type === "application/pdf"));
    setProgress(0);
    try {
      const outcome = await uploadWithProgress(`/api/deals/${dealId}/uploads`, files, setProgress);
      setNotice({ tone: outcome.kind === "bill-image" ? "info" : "success", text: outcome.message });
      if (outcome.kind === "bill-text") setReview({ uploadId: outcome.upload.id, reading: outcome.reading, source: outcome.source });
      if (outcome.kind === "interval") await queryClient.invalidateQueries({ queryKey: ["usage", dealId] });
      await queryClient.invalidateQueries({ queryKey: ["uploads", dealId] });
    } catch (err) {
      setNotice({ tone: "error", text: err instanceof Error ? err.message : "The upload failed." });
    } finally {
      setProgress(null);
      if (fileInput.current) fileInput.current.value = "";
    }
  }
  return { progress, picture, review, setReview, fileInput, onFile };
}

export function EnergyClient(props: { dealId: string; canEdit: boolean; initialBills: BillValue[]; initialUsage: Usage; uploads: UploadView[] }) {
  const [rows, setRows] = useState<Row[]>(() => (props.initialBills.length ? props.initialBills.map(toRow) : [emptyRow()]));
  const [notice, setNotice] = useState<Notice | null>(null);
  const upload = useBillUpload(props.dealId, setNotice);

  const usage = useQuery({
    queryKey: ["usage", props.dealId],
    queryFn: () => api<Usage>(`/api/deals/${props.dealId}/usage`),
    initialData: props.initialUsage,
  });
  const uploads = useQuery({
    queryKey: ["uploads", props.dealId],
    queryFn: () => api<UploadView[]>(`/api/deals/${props.dealId}/uploads`),
    initialData: props.uploads,
  });
  const bills = useBillsSave(props.dealId, rows, setRows, setNotice);

  /** The confirmed reading joins the table and the table is saved in the same step. */
  function saveReading(read: BillTableRow[]) {
    const uploadId = upload.review?.uploadId ?? null;
    const next = [...rows.filter((r) => r.periodStart || r.periodEnd || r.kwh || r.cost), ...read.map((b) => toRow({ ...b, uploadId }))];
    setRows(next);
    upload.setReview(null);
    bills.onSave(next);
  }

  return (
    <div className="grid gap-6 xl:grid-cols-[3fr_2fr]">
      <div className="space-y-6">
        <StatusMessage notice={notice} />

        {props.canEdit ? <UploadSection upload={upload} onSave={saveReading} saving={bills.saving} /> : null}

        <BillsSection rows={rows} setRows={setRows} rowErrors={bills.rowErrors} canEdit={props.canEdit} onSave={() => bills.onSave()} saving={bills.saving} />
      </div>

      <aside className="space-y-6">
        <UsageYearCard u={usage.data} />
        <FilesCard uploads={uploads.data} />
      </aside>
    </div>
  );
}

function UploadSection({ upload, onSave, saving }: { upload: ReturnType<typeof useBillUpload>; onSave: (rows: BillTableRow[]) => void; saving: boolean }) {
  const { progress, picture, review, setReview, fileInput, onFile } = upload;
  return (
    <section className="card p-5" aria-labelledby="upload-heading">
      <h2 id="upload-heading" className="font-semibold">
        Add bills from files
      </h2>
      <p className="mt-1 text-sm text-graphite-soft">PDF bills, photos of bills (JPEG, PNG; choose several photos at once for one bill&apos;s pages, in page order), or hourly data: Green Button XML or CSV. Up to 10 MB a bill, 20 MB of interval data.</p>
      <label className="btn-quiet mt-3 cursor-pointer">
        Choose a file or photos…
        <input
          ref={fileInput}
          type="file"
          className="sr-only"
          accept=".pdf,.jpg,.jpeg,.png,.csv,.xml,application/pdf,image/jpeg,image/png,text/csv,application/xml"
          multiple
          onChange={(e) => e.target.files?.length && onFile([...e.target.files])}
          disabled={progress !== null}
          data-testid="bill-file-input"
        />
      </label>
      {progress !== null ? (
        <div className="mt-3" role="progressbar" aria-valuenow={progress} aria-valuemin={0} aria-valuemax={100} aria-label="Upload progress">
          <div className="h-2 rounded-full bg-paper-deep">
            <div className={`h-2 rounded-full bg-copper transition-all ${progress === 100 ? "animate-pulse" : ""}`} style={{ width: `${progress}%` }} />
          </div>
          <p className="mt-1 text-xs text-graphite-soft" aria-live="polite" data-testid="upload-stage">
            {progress < 100 ? `Uploading… ${progress} %` : picture ? "Reading the bill… a photo or a scanned page is read by OCR, which takes a few seconds a page." : "Reading the file…"}
          </p>
        </div>
      ) : null}
      {review ? <BillReadingReview key={review.uploadId} reading={review.reading} source={review.source} saving={saving} onSave={onSave} onDismiss={() => setReview(null)} /> : null}
    </section>
  );
}

function BillsSection(props: {
  rows: Row[];
  setRows: (update: (rows: Row[]) => Row[]) => void;
  rowErrors: Record<string, string>;
  canEdit: boolean;
  onSave: () => void;
  saving: boolean;
}) {
  const { rows, setRows } = props;
  const set = (key: string, field: keyof Row, value: string) => setRows((rs) => rs.map((r) => (r.key === key ? { ...r, [field]: value } : r)));
  return (
    <section className="card overflow-hidden" aria-labelledby="bills-heading">
      <div className="flex items-center justify-between px-5 pt-5">
        <h2 id="bills-heading" className="font-semibold">
          Bills
        </h2>
        <span className="text-sm text-graphite-soft">Billing period start and end, kWh, amount</span>
      </div>
      {/* Under 560 px the four fields are too narrow side by side: each bill becomes a card. */}
      <FitTable minWidth={560} frameClassName="mt-3" className="text-sm">
          <thead className="bg-paper-deep text-left text-xs uppercase tracking-wide text-graphite-soft">
            <tr>
              <Th>From</Th>
              <Th>To</Th>
              <Th>kWh</Th>
              <Th>Amount ($)</Th>
              <Th>
                <span className="sr-only">Remove</span>
              </Th>
            </tr>
          </thead>
          <tbody>
            {rows.map((r, i) => (
              <BillRow
                key={r.key}
                row={r}
                index={i}
                err={(f) => props.rowErrors[`bills.${i}.${f}`]}
                canEdit={props.canEdit}
                set={(field, value) => set(r.key, field, value)}
                onRemove={() => setRows((rs) => (rs.length > 1 ? rs.filter((x) => x.key !== r.key) : [emptyRow()]))}
              />
            ))}
          </tbody>
      </FitTable>
      {props.canEdit ? (
        <div className="flex flex-wrap gap-2 p-5">
          <button type="button" className="btn-quiet" onClick={() => setRows((rs) => [...rs, emptyRow()])}>
            Add a bill
          </button>
          <button type="button" className="btn-primary" onClick={props.onSave} disabled={props.saving}>
            {props.saving ? "Saving…" : "Save bills"}
          </button>
        </div>
      ) : null}
    </section>
  );
}

function BillRow(props: {
  row: Row;
  index: number;
  err: (field: string) => string | undefined;
  canEdit: boolean;
  set: (field: keyof Row, value: string) => void;
  onRemove: () => void;
}) {
  const { row: r, index: i, err, canEdit, set } = props;
  const rowMessage = err("periodStart") ?? err("periodEnd") ?? err("kwh") ?? err("costCents") ?? err("startDate") ?? err("endDate");
  return (
    <tr className="align-top" data-testid="bill-row">
      <td className="px-3 py-2">
        <input aria-label={`Bill ${i + 1} from`} type="date" className="field-input" value={r.periodStart} disabled={!canEdit} aria-invalid={!!(err("periodStart") || err("startDate"))} onChange={(e) => set("periodStart", e.target.value)} />
      </td>
      <td className="px-3 py-2">
        <input aria-label={`Bill ${i + 1} to`} type="date" className="field-input" value={r.periodEnd} disabled={!canEdit} aria-invalid={!!(err("periodEnd") || err("endDate"))} onChange={(e) => set("periodEnd", e.target.value)} />
      </td>
      <td className="px-3 py-2">
        <input aria-label={`Bill ${i + 1} kWh`} inputMode="decimal" className="field-input figure" style={figureWidth(FIGURE_CHARS.kwh)} value={r.kwh} disabled={!canEdit} aria-invalid={!!err("kwh")} onChange={(e) => set("kwh", e.target.value)} />
      </td>
      <td className="px-3 py-2">
        <input aria-label={`Bill ${i + 1} amount`} inputMode="decimal" className="field-input figure" style={figureWidth(FIGURE_CHARS.money)} value={r.cost} disabled={!canEdit} aria-invalid={!!err("costCents")} onChange={(e) => set("cost", e.target.value)} />
        {r.source === "history" ? (
          <Badge tone="usage" className="mt-1" testId="from-history">
            from the bill&apos;s history{r.periodEstimated ? ", dates estimated" : ""}
          </Badge>
        ) : null}
        {rowMessage ? (
          <p className="field-error" role="alert">
            {rowMessage}
          </p>
        ) : null}
      </td>
      <td className="px-3 py-2 text-right">
        {canEdit ? (
          <button type="button" className="btn-quiet px-3" aria-label={`Remove bill ${i + 1}`} onClick={props.onRemove}>
            ✕
          </button>
        ) : null}
      </td>
    </tr>
  );
}

/** The household's year of use: total, where it came from, the monthly chart and any flags. */
function UsageYearCard({ u }: { u: Usage }) {
  const measured = u.estimatedMonths.filter((e) => !e).length;
  return (
    <section className="card p-5" aria-labelledby="usage-heading">
      <h2 id="usage-heading" className="font-semibold">
        Usage year
      </h2>
      {u.source === "none" ? (
        <p className="mt-2 text-graphite-soft">No bills yet. Add at least one bill; 12 months give the best picture.</p>
      ) : (
        <>
          <p className="mt-1">
            <span className="figure text-2xl" data-testid="annual-kwh">
              {Math.round(u.annualKwh).toLocaleString("en-US")}
            </span>{" "}
            kWh a year
          </p>
          <p className="text-sm text-graphite-soft">
            {u.source === "interval"
              ? "From hourly interval data."
              : `${measured} of 12 months from bills${measured < 12 ? `; the rest estimated (${u.fillMethod === "degree-day" ? "degree-day regression" : "seasonal shape"})` : ""}.`}
            {u.averageCentsPerKwh != null ? ` Average price ${u.averageCentsPerKwh.toFixed(1)} ¢/kWh.` : ""}
          </p>
          <div className="mt-4">
            <UsageChart monthlyKwh={u.monthlyKwh} estimated={u.estimatedMonths} />
          </div>
          {u.warnings.length > 0 ? (
            <ul className="mt-3 space-y-1 text-sm text-caution" aria-label="Flags">
              {u.warnings.map((w) => (
                <li key={w}>⚑ {w}</li>
              ))}
            </ul>
          ) : null}
        </>
      )}
    </section>
  );
}

function FilesCard({ uploads }: { uploads: UploadView[] }) {
  return (
    <section className="card p-5" aria-labelledby="files-heading">
      <h2 id="files-heading" className="font-semibold">
        Files
      </h2>
      {uploads.length === 0 ? (
        <p className="mt-1 text-sm text-graphite-soft">None yet.</p>
      ) : (
        <ul className="mt-2 space-y-1 text-sm" data-testid="upload-list">
          {uploads.map((f) => (
            <li key={f.id} className="flex justify-between gap-2">
              <span className="truncate">{f.fileName}</span>
              <span className="shrink-0 text-graphite-soft">{f.purpose === "interval_data" ? "hourly data" : f.mimeType === "application/pdf" ? "PDF" : "photo"}</span>
            </li>
          ))}
        </ul>
      )}
    </section>
  );
}
