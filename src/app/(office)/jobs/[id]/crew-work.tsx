"use client";
import { type ReactNode, useState } from "react";
import { CameraInput } from "@/components/camera-input";
import { ConfirmButton } from "@/components/ui/dialog";
import { EmptyState } from "@/components/ui/empty-state";
import { Field, StatusMessage, type Notice } from "@/components/ui/field";
import { longDate } from "../dates";
import { useSave } from "@/components/ui/use-save";
import type { JobChecklistItem } from "@/lib/schemas/jobs";

type PhotoThumb = { id: string; caption: string | null; widthPx: number; heightPx: number; uploadedByName: string | null };


type CrewWorkProps = {
  jobId: string;
  canWork: boolean;
  checklist: JobChecklistItem[];
  photos: PhotoThumb[];
  installedAt: string | null;
  installDate: string | null;
  office: boolean;
  /** The company's today: before the install date, marking it installed is the office's. */
  today: string;
  timeZone: string;
};

/** The crew's work on a job: the install checklist, photos from the phone's camera, and "installed". */
export function CrewWork(props: CrewWorkProps) {
  const [items, setItems] = useState(props.checklist);
  // The company's zone, not the runtime's: the server render and the browser then print the same time.
  const timeFmt = new Intl.DateTimeFormat("en-US", { month: "short", day: "numeric", hour: "numeric", minute: "2-digit", timeZone: props.timeZone, timeZoneName: "short" });
  const [before, setBefore] = useState(items);
  const [notice, setNotice] = useState<Notice | null>(null);
  const open = items.filter((i) => !i.doneAt).length;

  // The checklist and photos are this screen's own state (a roof's mobile data is slow): no page refresh.
  const tick = useSave<{ item: JobChecklistItem; done: boolean }, JobChecklistItem[]>({
    request: ({ item, done }) => ({ url: `/api/jobs/${props.jobId}/checklist`, method: "PATCH", json: { itemId: item.id, done } }),
    refresh: false,
    notify: setNotice,
    onSaved: setItems,
    onError: () => setItems(before),
  });
  function toggle(item: JobChecklistItem, done: boolean) {
    setBefore(items);
    // Shown ticked at once; put back if the server refuses.
    setItems((list) => list.map((i) => (i.id === item.id ? { ...i, doneAt: done ? new Date().toISOString() : null } : i)));
    tick.save({ item, done });
  }

  return (
    <>
      <div aria-live="polite">
        <StatusMessage notice={notice} />
      </div>
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
                  disabled={!props.canWork || tick.pending}
                  onChange={(e) => toggle(item, e.target.checked)}
                />
                <span className={item.doneAt ? "text-graphite-soft line-through decoration-sage" : ""}>{item.label}</span>
                {item.doneAt ? <span className="figure ml-auto shrink-0 text-xs text-graphite-soft">{timeFmt.format(new Date(item.doneAt))}</span> : null}
              </label>
            </li>
          ))}
        </ul>
      </section>

      <PhotosSection jobId={props.jobId} canWork={props.canWork} initial={props.photos} notify={setNotice} />

      <InstallSection
        jobId={props.jobId}
        canWork={props.canWork}
        initial={props.installedAt}
        early={!props.installDate || props.installDate > props.today ? { installDate: props.installDate, office: props.office } : null}
        openItems={open}
        notify={setNotice}
        timeFmt={timeFmt}
      />
    </>
  );
}

/** The job's photos, and the camera button for the crew; a new photo shows at once, without a page refresh. */
function PhotosSection({ jobId, canWork, initial, notify }: { jobId: string; canWork: boolean; initial: PhotoThumb[]; notify: (notice: Notice | null) => void }) {
  const [photos, setPhotos] = useState(initial);
  const upload = useSave<File, PhotoThumb>({
    request: (file) => {
      const body = new FormData();
      body.set("file", file);
      return { url: `/api/jobs/${jobId}/photos`, method: "POST", body };
    },
    refresh: false,
    notify,
    success: "Photo saved.",
    onSaved: (photo) => setPhotos((p) => [...p, photo]),
  });
  return (
    <section className="card p-4" aria-labelledby="photos-heading">
      <h2 id="photos-heading" className="text-lg font-semibold">
        Job photos
      </h2>
      {photos.length === 0 ? <EmptyState>No photos yet.</EmptyState> : null}
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
      {canWork ? (
        <div className="mt-3">
          <CameraInput
            id="job-photo-input"
            label="Take or add a photo"
            busyLabel="Saving the photo…"
            busy={upload.pending}
            buttonClass="btn-primary w-full"
            onPhoto={upload.save}
          />
          <p className="mt-1 text-xs text-graphite-soft">JPEG, PNG or WebP; stored at up to 2048 px.</p>
        </div>
      ) : null}
    </section>
  );
}

type InstallProps = {
  jobId: string;
  canWork: boolean;
  initial: string | null;
  /** Set when today is before the install date (or none is booked): only the office may mark it, with a reason. */
  early: { installDate: string | null; office: boolean } | null;
  openItems: number;
  notify: (notice: Notice | null) => void;
  timeFmt: Intl.DateTimeFormat;
};

/** When the job was installed, or the crew's button to say it is (before the install date: the office's, with a reason). */
function InstallSection({ jobId, canWork, initial, early, openItems: open, notify, timeFmt }: InstallProps) {
  const [installedAt, setInstalledAt] = useState(initial);
  const [reason, setReason] = useState("");
  const install = useSave<{ earlyReason?: string }, { installedAt: string | null }>({
    request: (json) => ({ url: `/api/jobs/${jobId}/installed`, method: "POST", json }),
    notify,
    success: "Marked installed. The office has been updated.",
    onSaved: (job) => setInstalledAt(job.installedAt),
  });
  const booked = early?.installDate ? `its install date, ${longDate(early.installDate)}` : "an install date is booked";
  let action: ReactNode = <p className="mt-1 text-graphite-soft">Not installed yet.</p>;
  if (canWork && early && !early.office) {
    action = <p className="mt-1 text-graphite-soft" data-testid="install-early-note">The job can be marked installed from {booked}. Installing earlier needs the office&apos;s confirmation.</p>;
  } else if (canWork && early) {
    action = (
      <div className="mt-2 space-y-2">
        <Field id="install-early-reason" label={`Why was it installed before ${booked}?`} hint="Written on the deal's Timeline." value={reason} onChange={(e) => setReason(e.target.value)} />
        <ConfirmButton
          label="Confirm early install"
          title="Confirm the early install?"
          message={`${open > 0 ? `${open} checklist item${open === 1 ? " is" : "s are"} still open. ` : ""}The deal moves to Installed.`}
          confirmLabel="Yes, installed"
          className="btn-primary w-full"
          disabled={install.pending}
          onConfirm={() => install.save({ earlyReason: reason })}
        />
      </div>
    );
  } else if (canWork) {
    action = (
      <ConfirmButton
        label="Mark installed"
        title="Mark this job installed?"
        message={`${open > 0 ? `${open} checklist item${open === 1 ? " is" : "s are"} still open. ` : ""}The office sees it at once.`}
        confirmLabel="Yes, installed"
        className="btn-primary mt-2 w-full"
        disabled={install.pending}
        onConfirm={() => install.save({})}
      />
    );
  }
  return (
    <section className="card p-4" aria-labelledby="installed-heading">
      <h2 id="installed-heading" className="text-lg font-semibold">
        Install
      </h2>
      {installedAt ? (
        <p className="mt-1 text-sage" data-testid="installed-status">
          Installed {timeFmt.format(new Date(installedAt))}.
        </p>
      ) : (
        action
      )}
    </section>
  );
}
