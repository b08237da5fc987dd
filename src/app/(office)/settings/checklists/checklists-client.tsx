"use client";
import { zodResolver } from "@hookform/resolvers/zod";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { useFieldArray, useForm } from "react-hook-form";
import { FormMessage } from "@/components/ui/field";
import { api, ApiError } from "@/lib/api-client";
import { applyFieldErrors } from "@/lib/form-errors";
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
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const [confirmDelete, setConfirmDelete] = useState(false);

  async function run(task: () => Promise<unknown>) {
    setBusy(true);
    setError(null);
    try {
      await task();
      router.refresh();
    } catch (err) {
      setError(err instanceof ApiError ? err.message : "Not saved. Try again.");
    } finally {
      setBusy(false);
    }
  }

  return (
    <section className="card p-5" aria-labelledby={`tpl-${template.id}`} data-testid={`checklist-${template.name}`}>
      <div className="flex flex-wrap items-start justify-between gap-3">
        <h2 id={`tpl-${template.id}`} className="text-lg font-semibold">
          {template.name}{" "}
          {template.active ? <span className="ml-1 rounded-full bg-sage-light px-2 py-0.5 text-xs font-medium text-graphite">Active: new jobs get this</span> : null}
        </h2>
        <div className="flex flex-wrap gap-2">
          <button type="button" className="btn-quiet" onClick={onEdit}>
            Edit
          </button>
          {template.active ? (
            <button type="button" className="btn-quiet" disabled={busy} onClick={() => void run(() => api(`/api/checklist-templates/${template.id}`, { method: "PATCH", json: { active: false } }))}>
              Deactivate
            </button>
          ) : (
            <button type="button" className="btn-primary" disabled={busy} onClick={() => void run(() => api(`/api/checklist-templates/${template.id}`, { method: "PATCH", json: { active: true } }))}>
              Activate
            </button>
          )}
          {confirmDelete ? (
            <>
              <button type="button" className="btn-danger" disabled={busy} onClick={() => void run(() => api(`/api/checklist-templates/${template.id}`, { method: "DELETE" }))}>
                Yes, delete
              </button>
              <button type="button" className="btn-quiet" onClick={() => setConfirmDelete(false)}>
                Keep
              </button>
            </>
          ) : (
            <button type="button" className="btn-danger" onClick={() => setConfirmDelete(true)}>
              Delete
            </button>
          )}
        </div>
      </div>
      {error ? (
        <div className="mt-2">
          <FormMessage tone="error">{error}</FormMessage>
        </div>
      ) : null}
      {confirmDelete ? <p className="mt-2 text-sm text-caution">Jobs keep their own copy; only new jobs are affected.</p> : null}
      <ol className="mt-3 list-decimal space-y-1 pl-6 text-sm">
        {template.items.map((i) => (
          <li key={i.id}>{i.label}</li>
        ))}
      </ol>
    </section>
  );
}

function TemplateEditor({ template, onDone }: { template: Template | null; onDone: () => void }) {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  const {
    register,
    control,
    handleSubmit,
    setError: setFieldError,
    formState: { errors, isSubmitting },
  } = useForm<ChecklistTemplateInput>({
    resolver: zodResolver(checklistTemplateSchema),
    defaultValues: template ? { name: template.name, items: template.items } : { name: "", items: [{ id: "", label: "" }] },
  });
  const { fields, append, remove, move } = useFieldArray({ control, name: "items", keyName: "key" });

  const onSubmit = handleSubmit(async (values) => {
    setError(null);
    try {
      if (template) await api(`/api/checklist-templates/${template.id}`, { method: "PATCH", json: values });
      else await api("/api/checklist-templates", { method: "POST", json: values });
      router.refresh();
      onDone();
    } catch (err) {
      if (err instanceof ApiError && applyFieldErrors(err.fields, setFieldError)) return;
      setError(err instanceof ApiError ? err.message : "Not saved. Try again.");
    }
  });

  return (
    <form onSubmit={onSubmit} noValidate className="card space-y-4 p-5" aria-label={template ? `Edit ${template.name}` : "New checklist"}>
      {error ? <FormMessage tone="error">{error}</FormMessage> : null}
      <div className="max-w-md">
        <label htmlFor="tpl-name" className="field-label">
          Checklist name
        </label>
        <input id="tpl-name" className="field-input" autoComplete="off" aria-invalid={errors.name ? true : undefined} {...register("name")} />
        {errors.name ? <p className="field-error">{errors.name.message}</p> : null}
      </div>
      <fieldset>
        <legend className="field-label">Items, in the order the crew works</legend>
        {errors.items?.message ? <p className="field-error">{errors.items.message}</p> : null}
        <ol className="space-y-2">
          {fields.map((f, i) => (
            <li key={f.key} className="flex flex-wrap items-start gap-2">
              <span className="figure mt-3 w-6 text-right text-sm text-graphite-soft">{i + 1}.</span>
              <input type="hidden" {...register(`items.${i}.id`)} />
              <div className="min-w-64 flex-1">
                <label htmlFor={`tpl-item-${i}`} className="sr-only">
                  Item {i + 1}
                </label>
                <input id={`tpl-item-${i}`} className="field-input" aria-invalid={errors.items?.[i]?.label ? true : undefined} {...register(`items.${i}.label`)} />
                {errors.items?.[i]?.label ? <p className="field-error">{errors.items[i]?.label?.message}</p> : null}
              </div>
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
      <div className="flex gap-2">
        <button type="submit" className="btn-primary" disabled={isSubmitting}>
          {isSubmitting ? "Saving…" : template ? "Save checklist" : "Create checklist"}
        </button>
        <button type="button" className="btn-quiet" onClick={onDone}>
          Cancel
        </button>
      </div>
    </form>
  );
}
