"use client";
import { EmptyState } from "@/components/ui/empty-state";
import { StatusMessage } from "@/components/ui/field";
import { TableShell } from "@/components/ui/table";
import { useSave } from "@/components/ui/use-save";
import {
  BOS_KIND_LABELS,
  CONDUCTOR_MATERIAL_LABELS,
  CONDUIT_TYPE_LABELS,
  INSULATION_LABELS,
  LABEL_PURPOSE_LABELS,
  MLPE_FUNCTION_LABELS,
  spanTableText,
  type BosDetails,
  type BosKind,
} from "@/lib/schemas/bos";
import { CsvColumnsHelp, CsvImport } from "./csv-import";
import { EquipmentRow, TableHead, type Column } from "./equipment-section";

export type BosPartView = { id: string; kind: BosKind; manufacturer: string; model: string; details: BosDetails; priceLineItemId: string | null; active: boolean };

/** The kind's own fields in one line. */
function specOf(d: BosDetails): string {
  switch (d.kind) {
    case "rail":
      return `stock ${d.stockLengthsMm.join(" / ")} mm · spans ${spanTableText(d.spanTable)} (mph/psf:mm)`;
    case "mlpe":
      return `${MLPE_FUNCTION_LABELS[d.mlpeFunction]} · ${d.modulesPerUnit} per unit`;
    case "combiner":
      return `${d.inputs} inputs · ${d.ratingA} A`;
    case "disconnect":
      return `${d.ratingA} A · ${d.maxVoltageV} V · ${d.fusible ? "fusible" : "non-fusible"}`;
    case "breaker":
      return `${d.ratingA} A · ${d.poles}-pole`;
    case "fuse":
      return `${d.ratingA} A · ${d.maxVoltageV} V`;
    case "conductor":
      return `${d.sizeAwg} AWG · ${CONDUCTOR_MATERIAL_LABELS[d.material]} · ${INSULATION_LABELS[d.insulation]}`;
    case "conduit":
      return `${CONDUIT_TYPE_LABELS[d.conduitType]} · ${d.tradeSize} in`;
    case "label":
      return LABEL_PURPOSE_LABELS[d.purpose];
    default:
      return "—";
  }
}

const COLUMNS: Column<BosPartView>[] = [
  { header: "Kind", cell: (r) => BOS_KIND_LABELS[r.kind] },
  { header: "Specification", priority: "low", className: "text-xs wrap-anywhere", cell: (r) => specOf(r.details) },
];

/** Balance-of-system parts: racking, electronics, devices, wire, conduit, labels; kept by CSV. */
export function BosSection({ canManage, rows }: { canManage: boolean; rows: BosPartView[] }) {
  const setActive = useSave<{ row: BosPartView; active: boolean }>({
    request: ({ row, active }) => ({ url: `/api/bos-parts/${row.id}`, method: "PATCH", json: { active } }),
    success: (_, { row, active }) => `${row.manufacturer} ${row.model} ${active ? "is active again." : "is deactivated: new bills of materials leave it out."}`,
  });
  return (
    <section aria-labelledby="bos-heading" className="space-y-3">
      <div className="flex flex-wrap items-center justify-between gap-3">
        <h2 id="bos-heading" className="text-lg font-semibold">
          Balance of system <span className="figure text-sm font-normal text-graphite-soft">({rows.length})</span>
        </h2>
        <a className="btn-quiet" href="/api/bos-parts/export" download>
          Export parts CSV
        </a>
      </div>
      <p className="text-sm text-graphite-soft">
        What a bill of materials counts besides modules and inverters. The first active part of each kind is used; a rail&apos;s span table gives the attachment
        spacing for the site&apos;s wind and snow (the engineer of record decides). Add and change parts with the CSV import.
      </p>
      <StatusMessage notice={setActive.notice} />
      {rows.length === 0 ? (
        <EmptyState>{canManage ? "No parts yet. Import a CSV below." : "No parts are available yet."}</EmptyState>
      ) : (
        <TableShell
          minWidth={720}
          testId="bos-table"
          label="Balance-of-system parts"
          head={<TableHead noun="Part" columns={COLUMNS} canManage={canManage} />}
        >
          {rows.map((r) => (
            <EquipmentRow key={r.id} row={r} noun="part" columns={COLUMNS} canManage={canManage} busy={setActive.pending} onSetActive={(active) => setActive.save({ row: r, active })} />
          ))}
        </TableShell>
      )}
      {canManage ? <CsvImport kind="bos-parts" /> : null}
      {canManage ? <CsvColumnsHelp kind="bos-parts" /> : null}
    </section>
  );
}
