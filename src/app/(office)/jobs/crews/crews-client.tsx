"use client";
import { CopyButton } from "@/components/ui/copy-button";
import { zodResolver } from "@hookform/resolvers/zod";
import { useState, type Dispatch, type SetStateAction } from "react";
import { useForm } from "react-hook-form";
import { ConfirmButton } from "@/components/ui/dialog";
import { EmptyState } from "@/components/ui/empty-state";
import { Field, SaveRow, type Notice } from "@/components/ui/field";
import { useSave } from "@/components/ui/use-save";
import { createCrewSchema, type CreateCrewInput } from "@/lib/schemas/jobs";
import { plainError, type FieldLabels } from "@/lib/validation-messages";

type CrewRow = { id: string; name: string; feedUrl: string; openJobs: number; memberIds: string[] };
type Installer = { id: string; name: string; email: string; active: boolean; crewId: string | null };

export function CrewsClient({ crews, installers }: { crews: CrewRow[]; installers: Installer[] }) {
  return (
    <div className="mt-6 space-y-6">
      <NewCrewForm />
      {crews.length === 0 ? <EmptyState>No crews yet.</EmptyState> : null}
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

/** The crew forms' labels, for the messages that name a field (src/lib/validation-messages.ts). */
const NEW_CREW_LABELS: FieldLabels = { name: "New crew" };
const CREW_LABELS: FieldLabels = { name: "Name", memberIds: "Installers in this crew" };

function NewCrewForm() {
  const { register, handleSubmit, reset, setError, formState } = useForm<CreateCrewInput>({
    resolver: zodResolver(createCrewSchema, { error: plainError(NEW_CREW_LABELS) }),
    defaultValues: { name: "" },
  });
  const add = useSave<CreateCrewInput, unknown, CreateCrewInput>({
    request: (json) => ({ url: "/api/crews", method: "POST", json }),
    setError,
    labels: NEW_CREW_LABELS,
    onSaved: () => reset(),
  });
  return (
    <form onSubmit={handleSubmit(add.save, add.invalid)} noValidate className="card flex flex-wrap items-start gap-3 p-4" aria-label="New crew">
      <Field id="new-crew-name" label="New crew" className="w-72 max-w-full" placeholder="e.g. Crew East" autoComplete="off" error={formState.errors.name?.message} {...register("name")} />
      <div className="mt-6">
        <SaveRow notice={add.notice} submit={{ label: "Add crew", pending: add.pending }} />
      </div>
    </form>
  );
}

function CrewCard({ crew, installers, crews }: { crew: CrewRow; installers: Installer[]; crews: CrewRow[] }) {
  const [name, setName] = useState(crew.name);
  const [members, setMembers] = useState<string[]>(crew.memberIds);
  const [notice, setNotice] = useState<Notice | null>(null);
  // The server's refusal of the name (422), on the field as well as beside the button; gone at the next edit of it.
  const [nameError, setNameError] = useState<string | undefined>();
  const save = useSave<{ name: string; memberIds: string[] }>({
    request: (json) => ({ url: `/api/crews/${crew.id}`, method: "PATCH", json }),
    success: "Crew saved.",
    labels: CREW_LABELS,
    notify: setNotice,
    onFieldErrors: (fields) => setNameError(fields.name?.[0]),
  });
  const renew = useSave<void>({
    request: () => ({ url: `/api/crews/${crew.id}/feed-token`, method: "POST" }),
    success: "New calendar address made; the old one no longer works.",
    notify: setNotice,
  });
  const busy = save.pending || renew.pending;
  const dirty = name.trim() !== crew.name || members.slice().sort().join() !== crew.memberIds.slice().sort().join();
  return (
    <section className="card p-5" aria-labelledby={`crew-${crew.id}`} data-testid={`crew-${crew.name}`}>
      <h2 id={`crew-${crew.id}`} className="text-lg font-semibold">
        {crew.name}{" "}
        <span className="text-sm font-normal text-graphite-soft">
          · <span className="figure">{crew.openJobs}</span> open job{crew.openJobs === 1 ? "" : "s"}
        </span>
      </h2>
      <div className="mt-3 grid gap-6 md:grid-cols-2">
        {/* The status stands beside Save crew and goes at the next edit here (data-edit-scope). */}
        <div className="space-y-3" data-edit-scope>
          <Field id={`crew-name-${crew.id}`} label="Name" value={name} maxLength={100} error={nameError} onChange={(e) => {
              setName(e.target.value);
              setNameError(undefined);
            }}
          />
          <CrewMembersField crew={crew} installers={installers} crews={crews} members={members} setMembers={setMembers} />
          <SaveRow notice={notice}>
            <button type="button" className="btn-primary" disabled={busy || !dirty} onClick={() => save.save({ name: name.trim(), memberIds: members })}>
              Save crew
            </button>
          </SaveRow>
        </div>
        <CalendarAddress feedUrl={crew.feedUrl} busy={busy} onRenew={() => renew.save()} />
      </div>
    </section>
  );
}

/** One checkbox per installer; one already in another crew moves here when the crew is saved. */
function CrewMembersField({ crew, installers, crews, members, setMembers }: { crew: CrewRow; installers: Installer[]; crews: CrewRow[]; members: string[]; setMembers: Dispatch<SetStateAction<string[]>> }) {
  const crewName = (id: string | null) => crews.find((c) => c.id === id)?.name;
  return (
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
  );
}

/** The crew's calendar feed address, to copy to a phone, or to renew when it leaked. */
function CalendarAddress({ feedUrl, busy, onRenew }: { feedUrl: string; busy: boolean; onRenew: () => void }) {
  return (
    <div>
      <p className="field-label">Calendar address</p>
      <p className="figure break-all rounded-md border border-paper-line bg-paper px-3 py-2 text-xs" data-testid="feed-url">
        {feedUrl}
      </p>
      <div className="mt-2 flex flex-wrap gap-2">
        <CopyButton text={feedUrl} label="Copy" copiedLabel="Copied" />
        <ConfirmButton
          label="Renew address"
          title="Renew the calendar address?"
          message="Phones subscribed to the current address will stop updating until they subscribe again."
          confirmLabel="Yes, renew it"
          danger
          className="btn-quiet"
          disabled={busy}
          onConfirm={onRenew}
        />
      </div>
    </div>
  );
}
