"use client";
import { zodResolver } from "@hookform/resolvers/zod";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { ConfirmButton } from "@/components/ui/dialog";
import { Field, FieldShell, SelectField, StatusMessage, type Notice } from "@/components/ui/field";
import { EmptyState } from "@/components/ui/empty-state";
import { TableShell, Td, Th } from "@/components/ui/table";
import { useSave } from "@/components/ui/use-save";
import { COMPANY_TIME_ZONES } from "@/lib/schemas/company-settings";
import { utilitySchema, type UtilityInput } from "@/lib/schemas/utility";

type Row = { id: string; name: string; timeZone: string; territoryNotes: string; planCount: number; dealCount: number };

const ZONE_OPTIONS = COMPANY_TIME_ZONES.map((z) => ({ value: z.id, label: `${z.label} (${z.id})` }));
const zoneLabel = (id: string) => COMPANY_TIME_ZONES.find((z) => z.id === id)?.label ?? id;

export function UtilitiesClient({ utilities, canEdit, companyTimeZone }: { utilities: Row[]; canEdit: boolean; companyTimeZone: string }) {
  const [editing, setEditing] = useState<Row | null>(null);
  const [notice, setNotice] = useState<Notice | null>(null);
  const remove = useSave<Row>({
    request: (u) => ({ url: `/api/utilities/${u.id}`, method: "DELETE" }),
    success: (_, u) => `${u.name} deleted.`,
    notify: setNotice,
    onSaved: (_, u) => setEditing((e) => (e?.id === u.id ? null : e)),
  });
  return (
    <div className="mt-6 grid gap-6 lg:grid-cols-[3fr_2fr]">
      <div className="space-y-3">
        <StatusMessage notice={notice} />
      {utilities.length === 0 ? (
        <EmptyState>No utilities yet.{canEdit ? " Add the ones your customers buy power from." : " An owner or admin adds them."}</EmptyState>
      ) : (
        <TableShell
          minWidth={560}
          label="Utilities"
          head={
            <>
              <Th>Utility</Th>
              <Th>Time zone</Th>
              <Th numeric>Rate plans</Th>
              <Th numeric>Deals</Th>
              {canEdit ? <Th className="sr-only">Edit or delete</Th> : null}
            </>
          }
        >
          {utilities.map((u) => (
            <tr key={u.id} data-testid={`utility-${u.id}`}>
              <Td>
                <span className="font-medium">{u.name}</span>
                {u.territoryNotes ? <span className="block text-xs text-graphite-soft">{u.territoryNotes}</span> : null}
              </Td>
              <Td>{zoneLabel(u.timeZone)}</Td>
              <Td numeric>{u.planCount}</Td>
              <Td numeric>{u.dealCount}</Td>
              {canEdit ? (
                <Td>
                  <div className="flex flex-wrap gap-1">
                    <button type="button" className="btn-quiet" onClick={() => setEditing(u)} aria-label={`Edit ${u.name}`}>
                      Edit
                    </button>
                    <ConfirmButton
                      label="Delete"
                      ariaLabel={`Delete ${u.name}`}
                      title={`Delete ${u.name}?`}
                      message={
                        u.planCount + u.dealCount > 0
                          ? `${u.name} is still used (${u.planCount} rate plan${u.planCount === 1 ? "" : "s"}, ${u.dealCount} deal${u.dealCount === 1 ? "" : "s"}); it can be deleted only once nothing uses it.`
                          : `${u.name} leaves the list for good. Only a utility no household, rate plan or incentive uses can be deleted.`
                      }
                      confirmLabel="Delete utility"
                      danger
                      className="btn-quiet"
                      disabled={remove.pending}
                      onConfirm={() => remove.save(u)}
                    />
                  </div>
                </Td>
              ) : null}
            </tr>
          ))}
        </TableShell>
      )}
      </div>
      {canEdit ? <UtilityForm key={editing?.id ?? "new"} editing={editing} companyTimeZone={companyTimeZone} onDone={() => setEditing(null)} /> : null}
    </div>
  );
}

/** A new utility starts on the company's time zone (most bill on their customers' clock). */
function UtilityForm({ editing, companyTimeZone, onDone }: { editing: Row | null; companyTimeZone: string; onDone: () => void }) {
  const form = useForm<UtilityInput>({
    resolver: zodResolver(utilitySchema),
    defaultValues: editing ? { name: editing.name, timeZone: editing.timeZone, territoryNotes: editing.territoryNotes } : { name: "", timeZone: companyTimeZone, territoryNotes: "" },
  });
  const save = useSave<UtilityInput, { id: string }, UtilityInput>({
    request: (json) => (editing ? { url: `/api/utilities/${editing.id}`, method: "PUT", json } : { url: "/api/utilities", method: "POST", json }),
    setError: form.setError,
    success: editing ? "Utility saved." : "Utility added.",
    onSaved: () => {
      form.reset({ name: "", timeZone: companyTimeZone, territoryNotes: "" });
      onDone();
    },
  });
  const errors = form.formState.errors;
  return (
    <form onSubmit={form.handleSubmit(save.saveAndWait)} noValidate className="card h-fit space-y-4 p-5">
      <h2 className="font-semibold">{editing ? `Edit ${editing.name}` : "Add a utility"}</h2>
      <StatusMessage notice={save.notice} />
      <Field id="utility-name" label="Name (as its bills print it)" error={errors.name?.message} {...form.register("name")} />
      <SelectField id="utility-time-zone" label="Time zone" options={ZONE_OPTIONS} error={errors.timeZone?.message} {...form.register("timeZone")} />
      <FieldShell id="utility-territory" label="Territory notes" error={errors.territoryNotes?.message} hint="Which towns or counties it serves, anything a rep should know.">
        <textarea id="utility-territory" rows={3} className="field-input" {...form.register("territoryNotes")} />
      </FieldShell>
      <div className="flex flex-wrap gap-2">
        <button type="submit" className="btn-primary" disabled={form.formState.isSubmitting}>
          {editing ? "Save utility" : "Add utility"}
        </button>
        {editing ? (
          <button type="button" className="btn-quiet" onClick={onDone}>
            Cancel
          </button>
        ) : null}
      </div>
    </form>
  );
}
