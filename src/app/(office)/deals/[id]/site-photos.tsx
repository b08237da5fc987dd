"use client";
import { useState } from "react";
import { CameraInput } from "@/components/camera-input";
import { StatusMessage, type Notice } from "@/components/ui/field";
import { useSave } from "@/components/ui/use-save";

export type SitePhotoThumb = { id: string; fileName: string; uploadedByName: string | null };

/**
 * Photos from the site visit (roof faces, the electrical panel, the meter): taken with the
 * phone's camera or added from a file, checked and resized on the server, and shown to the
 * install crew in the job packet.
 */
export function SitePhotos(props: { dealId: string; photos: SitePhotoThumb[]; canEdit: boolean }) {
  const [photos, setPhotos] = useState(props.photos);
  const [notice, setNotice] = useState<Notice | null>(null);
  const fileUrl = (id: string) => `/api/deals/${props.dealId}/site-photos/${id}`;
  // The list is this component's own state: a save updates it, no page refresh.
  const add = useSave<File, SitePhotoThumb>({
    request: (file) => {
      const body = new FormData();
      body.set("file", file);
      return { url: `/api/deals/${props.dealId}/site-photos`, method: "POST", body };
    },
    notify: setNotice,
    refresh: false,
    success: (photo) => `Site photo saved as “${photo.fileName}”. The install crew will see it in the job packet.`,
    onSaved: (photo) => setPhotos((list) => [photo, ...list]),
  });
  const remove = useSave<SitePhotoThumb>({
    request: (photo) => ({ url: fileUrl(photo.id), method: "DELETE" }),
    notify: setNotice,
    refresh: false,
    success: (_data, photo) => `Removed “${photo.fileName}”.`,
    onSaved: (_data, photo) => setPhotos((list) => list.filter((p) => p.id !== photo.id)),
  });
  const busy = add.pending || remove.pending;

  return (
    <section className="card p-5 lg:col-span-2" aria-labelledby="site-photos-heading">
      <h2 id="site-photos-heading" className="font-semibold">
        Site photos
      </h2>
      <p className="mt-1 text-sm text-graphite-soft">The roof, the electrical panel and the meter, as you saw them. The install crew sees these in the job packet.</p>
      <div aria-live="polite" className="mt-2">
        <StatusMessage notice={notice} />
      </div>
      {photos.length === 0 ? <p className="mt-2 text-sm text-graphite-soft">No site photos yet.</p> : null}
      <ul className="mt-3 grid grid-cols-2 gap-3 sm:grid-cols-4" data-testid="site-photos">
        {photos.map((p) => (
          <li key={p.id} className="text-xs">
            <a href={fileUrl(p.id)} target="_blank" rel="noreferrer">
              <img src={fileUrl(p.id)} alt={`Site photo ${p.fileName}`} className="aspect-square w-full rounded-md object-cover" loading="lazy" />
            </a>
            <div className="mt-1 flex items-center justify-between gap-2">
              <span className="truncate text-graphite-soft" title={p.fileName}>
                {p.fileName}
              </span>
              {props.canEdit ? (
                <button type="button" className="text-danger underline" disabled={busy} onClick={() => remove.save(p)} aria-label={`Remove site photo ${p.fileName}`}>
                  Remove
                </button>
              ) : null}
            </div>
          </li>
        ))}
      </ul>
      {props.canEdit ? (
        <div className="mt-3">
          <CameraInput id="site-photo-input" label="Take or add a site photo" busyLabel="Saving…" busy={busy} buttonClass="btn-quiet" onPhoto={add.save} />
          <span className="ml-2 text-xs text-graphite-soft">JPEG, PNG or WebP; kept at up to 2048 px, location data removed.</span>
        </div>
      ) : null}
    </section>
  );
}
