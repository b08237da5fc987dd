"use client";
import { useQuery } from "@tanstack/react-query";
import { useId, useState, type FormEvent } from "react";
import { Field, StatusMessage, type Notice } from "@/components/ui/field";
import { useSave } from "@/components/ui/use-save";
import { api } from "@/lib/api-client";
import type { SavedView, SavedViewQuery } from "@/lib/schemas/deal-table";

const VIEWS_KEY = ["saved-views"] as const;

/** Two queries mean the same view when their set values match (order and blanks aside). */
export function sameQuery(a: SavedViewQuery, b: SavedViewQuery): boolean {
  const norm = (q: SavedViewQuery) =>
    JSON.stringify(
      Object.entries(q)
        .filter(([, v]) => v !== undefined && v !== "" && !(Array.isArray(v) && v.length === 0))
        .map(([k, v]) => [k, Array.isArray(v) ? [...v].sort() : v])
        .sort(([x], [y]) => String(x).localeCompare(String(y))),
    );
  return norm(a) === norm(b);
}

/**
 * The person's saved views of the table: apply one, save the current view under a name,
 * save changes to the view in use, delete. Views are private to their person.
 */
export function SavedViewsMenu({
  current,
  activeId,
  onApply,
  onActiveChange,
}: {
  current: SavedViewQuery;
  activeId: string | null;
  onApply: (view: SavedView) => void;
  onActiveChange: (id: string | null) => void;
}) {
  const ids = useId();
  const views = useQuery({ queryKey: VIEWS_KEY, queryFn: () => api<SavedView[]>("/api/saved-views") });
  const [naming, setNaming] = useState(false);
  const [name, setName] = useState("");
  const [confirmDelete, setConfirmDelete] = useState<string | null>(null);
  const [message, setMessage] = useState<Notice | null>(null);

  const active = views.data?.find((v) => v.id === activeId) ?? null;
  const changed = active ? !sameQuery(active.query, current) : false;

  // The three saves share one status message and refresh the list they change (useQuery).
  const shared = { notify: setMessage, invalidate: [VIEWS_KEY], refresh: false as const };
  const create = useSave<{ name: string; query: SavedViewQuery }, SavedView>({
    ...shared,
    request: (json) => ({ url: "/api/saved-views", method: "POST", json }),
    success: (view) => `Saved the view “${view.name}”.`,
    onSaved: (view) => {
      setNaming(false);
      setName("");
      onActiveChange(view.id);
    },
  });
  const update = useSave<{ id: string; query: SavedViewQuery }, SavedView>({
    ...shared,
    request: ({ id, query }) => ({ url: `/api/saved-views/${id}`, method: "PUT", json: { query } }),
    success: (view) => `Saved the changes to “${view.name}”.`,
  });
  const remove = useSave<SavedView>({
    ...shared,
    request: (view) => ({ url: `/api/saved-views/${view.id}`, method: "DELETE" }),
    success: (_data, view) => `Deleted the view “${view.name}”.`,
    onSaved: (_data, view) => {
      setConfirmDelete(null);
      if (view.id === activeId) onActiveChange(null);
    },
  });

  function save(e: FormEvent) {
    e.preventDefault();
    setMessage(null);
    if (!name.trim()) {
      setMessage({ tone: "error", text: "Name the view first." });
      return;
    }
    create.save({ name: name.trim(), query: current });
  }

  return (
    <div className="flex flex-wrap items-end gap-2">
      <details className="relative" data-testid="saved-views">
        <summary className="btn-quiet cursor-pointer list-none">{active ? `View: ${active.name}` : "Saved views"}</summary>
        <div className="card absolute left-0 z-20 mt-1 w-72 p-2">
          {views.isPending ? <p className="px-2 py-2 text-sm text-graphite-soft">Loading your views…</p> : null}
          {views.error ? (
            <p role="alert" className="px-2 py-2 text-sm text-danger">
              {views.error instanceof Error ? views.error.message : "Your views could not be loaded."}
            </p>
          ) : null}
          {views.data && views.data.length === 0 ? (
            <p className="px-2 py-2 text-sm text-graphite-soft">No saved views yet. Set filters and a sort, then “Save view”.</p>
          ) : null}
          <ul aria-label="Your saved views" className="divide-y divide-paper-line">
            {views.data?.map((v) => (
              <li key={v.id} className="flex items-center gap-1">
                {confirmDelete === v.id ? (
                  <span className="flex min-h-touch flex-1 items-center justify-between gap-2 px-2 text-sm">
                    Delete “{v.name}”?
                    <span className="flex gap-1">
                      <button type="button" className="btn-danger px-3" onClick={() => remove.save(v)} disabled={remove.pending}>
                        Delete
                      </button>
                      <button type="button" className="btn-quiet px-3" onClick={() => setConfirmDelete(null)}>
                        Keep
                      </button>
                    </span>
                  </span>
                ) : (
                  <>
                    <button
                      type="button"
                      className={`flex min-h-touch flex-1 items-center rounded-md px-2 text-left text-sm hover:bg-paper ${v.id === activeId ? "font-semibold text-copper" : ""}`}
                      aria-current={v.id === activeId ? "true" : undefined}
                      onClick={(e) => {
                        setMessage(null);
                        onApply(v);
                        e.currentTarget.closest("details")?.removeAttribute("open");
                      }}
                    >
                      {v.name}
                    </button>
                    <button
                      type="button"
                      className="btn-quiet min-w-touch px-2 text-graphite-soft"
                      aria-label={`Delete the view ${v.name}`}
                      onClick={() => setConfirmDelete(v.id)}
                    >
                      ✕
                    </button>
                  </>
                )}
              </li>
            ))}
          </ul>
        </div>
      </details>
      {active && changed ? (
        <button type="button" className="btn-quiet" onClick={() => update.save({ id: active.id, query: current })} disabled={update.pending}>
          Save changes to “{active.name}”
        </button>
      ) : null}
      {naming ? (
        <form onSubmit={save} className="flex items-end gap-2" aria-label="Save this view">
          <Field id={`${ids}-name`} label="View name" inputClassName="w-48" value={name} maxLength={100} autoFocus onChange={(e) => setName(e.target.value)} />
          <button type="submit" className="btn-primary" disabled={create.pending}>
            {create.pending ? "Saving…" : "Save"}
          </button>
          <button type="button" className="btn-quiet" onClick={() => setNaming(false)}>
            Cancel
          </button>
        </form>
      ) : (
        <button
          type="button"
          className="btn-quiet"
          onClick={() => {
            setMessage(null);
            setNaming(true);
          }}
        >
          Save view
        </button>
      )}
      <div className="basis-full">
        <StatusMessage notice={message} />
      </div>
    </div>
  );
}
