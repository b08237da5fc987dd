"use client";
import { zodResolver } from "@hookform/resolvers/zod";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { Field, FormMessage } from "@/components/ui/field";
import { api, ApiError } from "@/lib/api-client";
import { applyFieldErrors } from "@/lib/form-errors";
import { createCrewSchema, type CreateCrewInput } from "@/lib/schemas/jobs";

type CrewRow = { id: string; name: string; feedUrl: string; openJobs: number; memberIds: string[] };
type Installer = { id: string; name: string; email: string; active: boolean; crewId: string | null };

export function CrewsClient({ crews, installers }: { crews: CrewRow[]; installers: Installer[] }) {
  return (
    <div className="mt-6 space-y-6">
      <NewCrewForm />
      {crews.length === 0 ? <p className="text-graphite-soft">No crews yet.</p> : null}
      {crews.map((c) => (
        <CrewCard key={c.id} crew={c} installers={installers} crews={crews} />
      ))}
      {installers.length === 0 ? (
        <p className="text-sm text-graphite-soft">
          Nobody has the Installer crew role yet. Invite installers under Settings → People, then add them to a crew here.
        </p>
      ) : null}
    </div>
  );
}

function NewCrewForm() {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  const {
    register,
    handleSubmit,
    reset,
    setError: setFieldError,
    formState: { errors, isSubmitting },
  } = useForm<CreateCrewInput>({ resolver: zodResolver(createCrewSchema), defaultValues: { name: "" } });
  const onSubmit = handleSubmit(async (values) => {
    setError(null);
    try {
      await api("/api/crews", { method: "POST", json: values });
      reset();
      router.refresh();
    } catch (err) {
      if (err instanceof ApiError && applyFieldErrors(err.fields, setFieldError)) return;
      setError(err instanceof ApiError ? err.message : "Not saved. Try again.");
    }
  });
  return (
    <form onSubmit={onSubmit} noValidate className="card flex flex-wrap items-start gap-3 p-4" aria-label="New crew">
      {error ? (
        <div className="w-full">
          <FormMessage tone="error">{error}</FormMessage>
        </div>
      ) : null}
      <div className="w-72">
        <Field id="new-crew-name" label="New crew" placeholder="e.g. Crew East" autoComplete="off" error={errors.name?.message} {...register("name")} />
      </div>
      <button type="submit" className="btn-primary mt-6" disabled={isSubmitting}>
        {isSubmitting ? "Adding…" : "Add crew"}
      </button>
    </form>
  );
}

function CrewCard({ crew, installers, crews }: { crew: CrewRow; installers: Installer[]; crews: CrewRow[] }) {
  const router = useRouter();
  const [name, setName] = useState(crew.name);
  const [members, setMembers] = useState<string[]>(crew.memberIds);
  const [notice, setNotice] = useState<{ tone: "error" | "success"; text: string } | null>(null);
  const [busy, setBusy] = useState(false);
  const [confirmRotate, setConfirmRotate] = useState(false);
  const [copied, setCopied] = useState(false);
  const dirty = name.trim() !== crew.name || members.slice().sort().join() !== crew.memberIds.slice().sort().join();
  const crewName = (id: string | null) => crews.find((c) => c.id === id)?.name;

  async function run(task: () => Promise<unknown>, done: string) {
    setBusy(true);
    setNotice(null);
    try {
      await task();
      setNotice({ tone: "success", text: done });
      router.refresh();
    } catch (err) {
      setNotice({ tone: "error", text: err instanceof ApiError ? err.message : "Not saved. Try again." });
    } finally {
      setBusy(false);
    }
  }

  return (
    <section className="card p-5" aria-labelledby={`crew-${crew.id}`} data-testid={`crew-${crew.name}`}>
      <h2 id={`crew-${crew.id}`} className="text-lg font-semibold">
        {crew.name}{" "}
        <span className="text-sm font-normal text-graphite-soft">
          · <span className="figure">{crew.openJobs}</span> open job{crew.openJobs === 1 ? "" : "s"}
        </span>
      </h2>
      {notice ? (
        <div className="mt-2">
          <FormMessage tone={notice.tone}>{notice.text}</FormMessage>
        </div>
      ) : null}
      <div className="mt-3 grid gap-6 md:grid-cols-2">
        <div className="space-y-3">
          <div>
            <label htmlFor={`crew-name-${crew.id}`} className="field-label">
              Name
            </label>
            <input id={`crew-name-${crew.id}`} className="field-input" value={name} maxLength={100} onChange={(e) => setName(e.target.value)} />
          </div>
          <fieldset>
            <legend className="field-label">Installers in this crew</legend>
            <ul className="space-y-1">
              {installers.map((i) => (
                <li key={i.id}>
                  <label className="flex min-h-touch items-center gap-3">
                    <input
                      type="checkbox"
                      className="h-5 w-5 accent-copper"
                      checked={members.includes(i.id)}
                      onChange={(e) => setMembers((m) => (e.target.checked ? [...m, i.id] : m.filter((x) => x !== i.id)))}
                    />
                    <span>
                      {i.name}
                      <span className="block text-xs text-graphite-soft">
                        {i.email}
                        {!i.active ? " · deactivated" : ""}
                        {i.crewId && i.crewId !== crew.id ? ` · now in ${crewName(i.crewId) ?? "another crew"} (moves here when saved)` : ""}
                      </span>
                    </span>
                  </label>
                </li>
              ))}
            </ul>
          </fieldset>
          <button
            type="button"
            className="btn-primary"
            disabled={busy || !dirty || name.trim().length < 2}
            onClick={() => void run(() => api(`/api/crews/${crew.id}`, { method: "PATCH", json: { name: name.trim(), memberIds: members } }), "Crew saved.")}
          >
            Save crew
          </button>
        </div>
        <div>
          <p className="field-label">Calendar address</p>
          <p className="figure break-all rounded-md border border-paper-line bg-paper px-3 py-2 text-xs" data-testid="feed-url">
            {crew.feedUrl}
          </p>
          <div className="mt-2 flex flex-wrap gap-2">
            <button
              type="button"
              className="btn-quiet"
              onClick={async () => {
                await navigator.clipboard.writeText(crew.feedUrl).catch(() => undefined);
                setCopied(true);
              }}
            >
              {copied ? "Copied" : "Copy"}
            </button>
            {confirmRotate ? (
              <>
                <button
                  type="button"
                  className="btn-danger"
                  disabled={busy}
                  onClick={() =>
                    void run(async () => {
                      await api(`/api/crews/${crew.id}/feed-token`, { method: "POST" });
                      setConfirmRotate(false);
                    }, "New calendar address made; the old one no longer works.")
                  }
                >
                  Yes, renew it
                </button>
                <button type="button" className="btn-quiet" onClick={() => setConfirmRotate(false)}>
                  Keep it
                </button>
              </>
            ) : (
              <button type="button" className="btn-quiet" onClick={() => setConfirmRotate(true)}>
                Renew address
              </button>
            )}
          </div>
          {confirmRotate ? <p className="mt-2 text-sm text-caution">Phones subscribed to the current address will stop updating until they subscribe again.</p> : null}
        </div>
      </div>
    </section>
  );
}
