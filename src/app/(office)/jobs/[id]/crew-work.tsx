"use client";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { CameraInput } from "@/components/camera-input";
import { FormMessage } from "@/components/ui/field";
import { api, ApiError } from "@/lib/api-client";
import type { JobChecklistItem } from "@/lib/schemas/jobs";

type PhotoThumb = { id: string; caption: string | null; widthPx: number; heightPx: number; uploadedByName: string | null };


/** The crew's work on a job: the install checklist, photos from the phone's camera, and "installed". */
export function CrewWork(props: { jobId: string; canWork: boolean; checklist: JobChecklistItem[]; photos: PhotoThumb[]; installedAt: string | null; timeZone: string }) {
  const router = useRouter();
  const [items, setItems] = useState(props.checklist);
  const [photos, setPhotos] = useState(props.photos);
  const [installedAt, setInstalledAt] = useState(props.installedAt);
  // The company's zone, not the runtime's: the server render and the browser then print the same time.
  const timeFmt = new Intl.DateTimeFormat("en-US", { month: "short", day: "numeric", hour: "numeric", minute: "2-digit", timeZone: props.timeZone, timeZoneName: "short" });
  const [busyItem, setBusyItem] = useState<string | null>(null);
  const [uploading, setUploading] = useState(false);
  const [confirming, setConfirming] = useState(false);
  const [notice, setNotice] = useState<{ tone: "error" | "success"; text: string } | null>(null);
  const open = items.filter((i) => !i.doneAt).length;

  async function tick(item: JobChecklistItem, done: boolean) {
    const before = items;
    // Shown ticked at once (a roof's mobile data is slow); put back if the server refuses.
    setItems((list) => list.map((i) => (i.id === item.id ? { ...i, doneAt: done ? new Date().toISOString() : null } : i)));
    setBusyItem(item.id);
    setNotice(null);
    try {
      setItems(await api<JobChecklistItem[]>(`/api/jobs/${props.jobId}/checklist`, { method: "PATCH", json: { itemId: item.id, done } }));
    } catch (err) {
      setItems(before);
      setNotice({ tone: "error", text: err instanceof ApiError ? err.message : "Not saved. Try again." });
    } finally {
      setBusyItem(null);
    }
  }

  async function upload(file: File) {
    setUploading(true);
    setNotice(null);
    const form = new FormData();
    form.set("file", file);
    try {
      const photo = await api<PhotoThumb>(`/api/jobs/${props.jobId}/photos`, { method: "POST", body: form });
      setPhotos((p) => [...p, photo]);
      setNotice({ tone: "success", text: "Photo saved." });
    } catch (err) {
      setNotice({ tone: "error", text: err instanceof ApiError ? err.message : "The photo was not saved. Try again." });
    } finally {
      setUploading(false);
    }
  }

  async function markInstalled() {
    setNotice(null);
    try {
      const job = await api<{ installedAt: string | null }>(`/api/jobs/${props.jobId}/installed`, { method: "POST" });
      setInstalledAt(job.installedAt);
      setConfirming(false);
      setNotice({ tone: "success", text: "Marked installed. The office has been updated." });
      router.refresh();
    } catch (err) {
      setNotice({ tone: "error", text: err instanceof ApiError ? err.message : "Not saved. Try again." });
    }
  }

  return (
    <>
      <div aria-live="polite">{notice ? <FormMessage tone={notice.tone}>{notice.text}</FormMessage> : null}</div>
      <section className="card p-4" aria-labelledby="checklist-heading">
        <h2 id="checklist-heading" className="text-lg font-semibold">
          Install checklist{" "}
          {items.length > 0 ? (
            <span className="figure text-base font-normal text-graphite-soft" data-testid="checklist-count">
              {items.length - open}/{items.length}
            </span>
          ) : null}
        </h2>
        {items.length === 0 ? <p className="mt-1 text-sm text-graphite-soft">This job has no checklist. The office can add the company&apos;s.</p> : null}
        <ul className="mt-2 divide-y divide-paper-line">
          {items.map((item) => (
            <li key={item.id}>
              <label className="flex min-h-touch cursor-pointer items-center gap-3 py-2">
                <input
                  type="checkbox"
                  className="h-6 w-6 shrink-0 accent-sage"
                  checked={!!item.doneAt}
                  disabled={!props.canWork || busyItem === item.id}
                  onChange={(e) => void tick(item, e.target.checked)}
                />
                <span className={item.doneAt ? "text-graphite-soft line-through decoration-sage" : ""}>{item.label}</span>
                {item.doneAt ? <span className="figure ml-auto shrink-0 text-xs text-graphite-soft">{timeFmt.format(new Date(item.doneAt))}</span> : null}
              </label>
            </li>
          ))}
        </ul>
      </section>

      <section className="card p-4" aria-labelledby="photos-heading">
        <h2 id="photos-heading" className="text-lg font-semibold">
          Job photos
        </h2>
        {photos.length === 0 ? <p className="mt-1 text-sm text-graphite-soft">No photos yet.</p> : null}
        <ul className="mt-2 grid grid-cols-3 gap-2" data-testid="job-photos">
          {photos.map((p) => (
            <li key={p.id}>
              <a href={`/api/job-photos/${p.id}/file`} target="_blank" rel="noreferrer">
                <img
                  src={`/api/job-photos/${p.id}/file`}
                  alt={p.caption ?? `Job photo${p.uploadedByName ? ` by ${p.uploadedByName}` : ""}`}
                  width={p.widthPx}
                  height={p.heightPx}
                  className="aspect-square w-full rounded-md object-cover"
                  loading="lazy"
                />
              </a>
            </li>
          ))}
        </ul>
        {props.canWork ? (
          <div className="mt-3">
            <CameraInput
              id="job-photo-input"
              label="Take or add a photo"
              busyLabel="Saving the photo…"
              busy={uploading}
              buttonClass="btn-primary w-full"
              onPhoto={(file) => void upload(file)}
            />
            <p className="mt-1 text-xs text-graphite-soft">JPEG, PNG or WebP; stored at up to 2048 px.</p>
          </div>
        ) : null}
      </section>

      <section className="card p-4" aria-labelledby="installed-heading">
        <h2 id="installed-heading" className="text-lg font-semibold">
          Install
        </h2>
        {installedAt ? (
          <p className="mt-1 text-sage" data-testid="installed-status">
            Installed {timeFmt.format(new Date(installedAt))}.
          </p>
        ) : props.canWork ? (
          confirming ? (
            <div className="mt-2 space-y-2">
              <p className="text-sm">
                {open > 0 ? `${open} checklist item${open === 1 ? " is" : "s are"} still open. ` : ""}Mark this job installed?
              </p>
              <div className="flex gap-2">
                <button type="button" className="btn-primary flex-1" onClick={() => void markInstalled()}>
                  Yes, installed
                </button>
                <button type="button" className="btn-quiet flex-1" onClick={() => setConfirming(false)}>
                  Not yet
                </button>
              </div>
            </div>
          ) : (
            <button type="button" className="btn-primary mt-2 w-full" onClick={() => setConfirming(true)}>
              Mark installed
            </button>
          )
        ) : (
          <p className="mt-1 text-graphite-soft">Not installed yet.</p>
        )}
      </section>
    </>
  );
}
