"use client";
import { zodResolver } from "@hookform/resolvers/zod";
import { useState } from "react";
import { useFieldArray, useForm } from "react-hook-form";
import { Badge } from "@/components/ui/badge";
import { ConfirmButton } from "@/components/ui/dialog";
import { Field, SaveRow, StatusMessage } from "@/components/ui/field";
import { plainError, type FieldLabels } from "@/lib/validation-messages";
import { useSave, type SaveRequest } from "@/components/ui/use-save";
import { checklistTemplateSchema, type ChecklistTemplateInput } from "@/lib/schemas/jobs";

type Template = { id: string; name: string; items: { id: string; label: string }[]; active: boolean };

export function ChecklistsClient({ templates }: { templates: Template[] }) {
  const [editing, setEditing] = useState<string | "new" | null>(templates.length === 0 ? "new" : null);
  return (
    <div className="mt-6 space-y-4">
      {templates.map((t) =>
        editing === t.id ? (
          <TemplateEditor key={t.id} template={t} onDone={() => setEditing(null)} />
        ) : (
          <TemplateCard key={t.id} template={t} onEdit={() => setEditing(t.id)} />
        ),
      )}
      {editing === "new" ? (
        <TemplateEditor template={null} onDone={() => setEditing(null)} />
      ) : (
        <button type="button" className="btn-quiet" onClick={() => setEditing("new")}>
          New checklist
        </button>
      )}
    </div>
  );
}

function TemplateCard({ template, onEdit }: { template: Template; onEdit: () => void }) {
  const url = `/api/checklist-templates/${template.id}`;
  const change = useSave<SaveRequest>({ request: (r) => r });

  return (
    <section className="card p-5" aria-labelledby={`tpl-${template.id}`} data-testid={`checklist-${template.name}`}>
      <div className="flex flex-wrap items-start justify-between gap-3">
        <h2 id={`tpl-${template.id}`} className="text-lg font-semibold">
          {template.name}{" "}
          {template.active ? (
            <Badge tone="success" className="ml-1">
              Active: new jobs get this
            </Badge>
          ) : null}
        </h2>
        <div className="flex flex-wrap gap-2">
          <button type="button" className="btn-quiet" onClick={onEdit}>
            Edit
          </button>
          <button
            type="button"
            className={template.active ? "btn-quiet" : "btn-primary"}
            disabled={change.pending}
            onClick={() => change.save({ url, method: "PATCH", json: { active: !template.active } })}
          >
            {template.active ? "Deactivate" : "Activate"}
          </button>
          <ConfirmButton
            label="Delete"
            title={`Delete ${template.name}?`}
            message="Jobs keep their own copy; only new jobs are affected."
            confirmLabel="Yes, delete"
            danger
            disabled={change.pending}
            onConfirm={() => change.save({ url, method: "DELETE" })}
          />
        </div>
      </div>
      {change.notice ? (
        <div className="mt-2">
          <StatusMessage notice={change.notice} />
        </div>
      ) : null}
      <ol className="mt-3 list-decimal space-y-1 pl-6 text-sm">
        {template.items.map((i) => (
          <li key={i.id}>{i.label}</li>
        ))}
      </ol>
    </section>
  );
}

/** The checklist form's labels, for the messages that name a field (`#` an item's position). */
const CHECKLIST_LABELS: FieldLabels = { name: "Checklist name", items: "Items", "items.#.label": "Item {n}" };

function TemplateEditor({ template, onDone }: { template: Template | null; onDone: () => void }) {
  const {
    register,
    control,
    handleSubmit,
    setError,
    formState: { errors },
  } = useForm<ChecklistTemplateInput>({
    resolver: zodResolver(checklistTemplateSchema, { error: plainError(CHECKLIST_LABELS) }),
    defaultValues: template ? { name: template.name, items: template.items } : { name: "", items: [{ id: "", label: "" }] },
  });
  const { fields, append, remove, move } = useFieldArray({ control, name: "items", keyName: "key" });
  const save = useSave<ChecklistTemplateInput, unknown, ChecklistTemplateInput>({
    request: (json) => (template ? { url: `/api/checklist-templates/${template.id}`, method: "PATCH", json } : { url: "/api/checklist-templates", method: "POST", json }),
    setError,
    labels: CHECKLIST_LABELS,
    onSaved: onDone,
  });

  return (
    <form onSubmit={handleSubmit(save.save, save.invalid)} noValidate className="card space-y-4 p-5" aria-label={template ? `Edit ${template.name}` : "New checklist"}>
      <Field id="tpl-name" label="Checklist name" className="max-w-md" autoComplete="off" error={errors.name?.message} {...register("name")} />
      <fieldset>
        <legend className="field-label">Items, in the order the crew works</legend>
        {errors.items?.message ? <p className="field-error">{errors.items.message}</p> : null}
        <ol className="space-y-2">
          {fields.map((f, i) => (
            <li key={f.key} className="flex flex-wrap items-start gap-2">
              <span className="figure mt-3 w-6 text-right text-sm text-graphite-soft">{i + 1}.</span>
              <input type="hidden" {...register(`items.${i}.id`)} />
              <Field id={`tpl-item-${i}`} label={`Item ${i + 1}`} srLabel className="min-w-0 flex-1 basis-64" error={errors.items?.[i]?.label?.message} {...register(`items.${i}.label`)} />
              <button type="button" className="btn-quiet" aria-label={`Move item ${i + 1} up`} disabled={i === 0} onClick={() => move(i, i - 1)}>
                ↑
              </button>
              <button type="button" className="btn-quiet" aria-label={`Move item ${i + 1} down`} disabled={i === fields.length - 1} onClick={() => move(i, i + 1)}>
                ↓
              </button>
              <button type="button" className="btn-quiet" aria-label={`Remove item ${i + 1}`} disabled={fields.length === 1} onClick={() => remove(i)}>
                Remove
              </button>
            </li>
          ))}
        </ol>
        <button type="button" className="btn-quiet mt-2" onClick={() => append({ id: "", label: "" })}>
          Add item
        </button>
      </fieldset>
      <SaveRow notice={save.notice}>
        <button type="submit" className="btn-primary" disabled={save.pending}>
          {save.pending ? "Saving…" : template ? "Save checklist" : "Create checklist"}
        </button>
        <button type="button" className="btn-quiet" onClick={onDone}>
          Cancel
        </button>
      </SaveRow>
    </form>
  );
}
