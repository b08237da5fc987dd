"use client";
import { useState, type ReactNode } from "react";
import type { FieldValues } from "react-hook-form";
import { Badge } from "@/components/ui/badge";
import { EmptyState } from "@/components/ui/empty-state";
import { StatusMessage } from "@/components/ui/field";
import { TableShell, Td, Th } from "@/components/ui/table";
import { useSave } from "@/components/ui/use-save";
import { CsvColumnsHelp, CsvImport } from "./csv-import";
import { EquipmentForm, type EquipmentFormSpec } from "./equipment-form";

export type Column<R> = { header: string; numeric?: boolean; title?: string; cell: (row: R) => ReactNode; className?: string; priority?: "low" };

type Row = FieldValues & { id: string; manufacturer: string; model: string; active: boolean };
type Editing<T> = { mode: "new" } | { mode: "edit"; row: T } | null;

/**
 * One catalog list (modules or inverters): heading, CSV export, the add/edit form, the table
 * with activate/deactivate, and the CSV import. The two lists differ only in `spec` and `columns`.
 */
export function EquipmentSection<R extends Row>(props: {
  canManage: boolean;
  rows: R[];
  heading: string;
  kind: "modules" | "inverters";
  spec: EquipmentFormSpec<R>;
  columns: Column<R>[];
  minWidth: number;
}) {
  const { canManage, rows, heading, kind, spec, columns } = props;
  const [editing, setEditing] = useState<Editing<R>>(null);
  const Noun = spec.noun === "module" ? "Module" : "Inverter";
  const setActive = useSave<{ row: R; active: boolean }>({
    request: ({ row, active }) => ({ url: `${spec.collection}/${row.id}`, method: "PATCH", json: { active } }),
    success: (_, { row, active }) => `${row.manufacturer} ${row.model} ${active ? "is active again." : "is deactivated: new designs cannot pick it."}`,
  });
  const headingId = `${kind}-heading`;
  return (
    <section aria-labelledby={headingId} className="space-y-3">
      <SectionHead
        headingId={headingId}
        heading={heading}
        count={rows.length}
        kind={kind}
        spec={spec}
        onAdd={canManage ? () => setEditing({ mode: "new" }) : null}
        adding={editing?.mode === "new"}
      />
      <StatusMessage notice={setActive.notice} />
      {canManage && editing ? (
        <EquipmentForm
          key={editing.mode === "edit" ? editing.row.id : "new"}
          spec={spec}
          row={editing.mode === "edit" ? editing.row : null}
          onClose={() => setEditing(null)}
          onSaved={(text) => {
            setEditing(null);
            setActive.setNotice({ tone: "success", text });
          }}
        />
      ) : null}
      {rows.length === 0 ? (
        <EmptyState>{canManage ? `No ${kind} yet. Add one, or import a CSV below.` : `No ${kind} are available yet.`}</EmptyState>
      ) : (
        <TableShell
          minWidth={props.minWidth}
          testId={`${kind}-table`}
          head={<TableHead noun={Noun} columns={columns} canManage={canManage} />}
        >
          {rows.map((r) => (
            <EquipmentRow
              key={r.id}
              row={r}
              noun={spec.noun}
              columns={columns}
              canManage={canManage}
              busy={setActive.pending}
              onEdit={() => setEditing({ mode: "edit", row: r })}
              onSetActive={(active) => setActive.save({ row: r, active })}
            />
          ))}
        </TableShell>
      )}
      {canManage ? <CsvImport kind={kind} /> : null}
      {canManage ? <CsvColumnsHelp kind={kind} /> : null}
    </section>
  );
}

/** The list's heading with its count, the CSV export, and (for managers) the add button. */
function SectionHead(props: {
  headingId: string;
  heading: string;
  count: number;
  kind: "modules" | "inverters";
  spec: { collection: string; noun: string };
  onAdd: (() => void) | null;
  adding: boolean;
}) {
  const { spec, kind } = props;
  return (
    <div className="flex flex-wrap items-center justify-between gap-3">
      <h2 id={props.headingId} className="text-lg font-semibold">
        {props.heading} <span className="figure text-sm font-normal text-graphite-soft">({props.count})</span>
      </h2>
      <div className="flex flex-wrap gap-2">
        <a className="btn-quiet" href={`${spec.collection}/export`} download>
          Export {kind} CSV
        </a>
        {props.onAdd ? (
          <button type="button" className="btn-primary" onClick={props.onAdd} disabled={props.adding}>
            Add {spec.noun}
          </button>
        ) : null}
      </div>
    </div>
  );
}

export function TableHead<R>({ noun, columns, canManage }: { noun: string; columns: Column<R>[]; canManage: boolean }) {
  return (
    <>
      <Th>{noun}</Th>
      {columns.map((c) => (
        <Th key={c.header} numeric={c.numeric} title={c.title} priority={c.priority}>
          {c.header}
        </Th>
      ))}
      <Th>Status</Th>
      {canManage ? (
        <Th>
          <span className="sr-only">Actions</span>
        </Th>
      ) : null}
    </>
  );
}

/** One model's row: name, the list's own columns, status, and (for managers) edit and activate/deactivate. */
export function EquipmentRow<R extends Row>(props: {
  row: R;
  noun: string;
  columns: Column<R>[];
  canManage: boolean;
  busy: boolean;
  /** Left out where rows change only through the CSV import (BOS parts). */
  onEdit?: () => void;
  onSetActive: (active: boolean) => void;
}) {
  const { row: r, columns, canManage, busy } = props;
  const name = `${r.manufacturer} ${r.model}`;
  return (
    <tr data-testid={`${props.noun}-${r.model}`} className={r.active ? undefined : "bg-paper/60"}>
      <Td>
        <span className="font-medium">{r.manufacturer}</span> {r.model}
      </Td>
      {columns.map((c) => (
        <Td key={c.header} numeric={c.numeric} className={c.className} priority={c.priority}>
          {c.cell(r)}
        </Td>
      ))}
      <Td>{r.active ? <Badge tone="success">Active</Badge> : <Badge>Deactivated</Badge>}</Td>
      {canManage ? (
        <Td className="whitespace-nowrap text-right">
          {props.onEdit ? (
            <>
              <button type="button" className="btn-quiet" disabled={busy} onClick={props.onEdit} aria-label={`Edit ${name}`}>
                Edit
              </button>{" "}
            </>
          ) : null}
          <button
            type="button"
            className={r.active ? "btn-danger" : "btn-quiet"}
            disabled={busy}
            aria-label={`${r.active ? "Deactivate" : "Reactivate"} ${name}`}
            onClick={() => props.onSetActive(!r.active)}
          >
            {r.active ? "Deactivate" : "Reactivate"}
          </button>
        </Td>
      ) : null}
    </tr>
  );
}
