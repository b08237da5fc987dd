"use client";
import Link from "next/link";
import { columnVisibilityFeature, createColumnHelper, rowPaginationFeature, rowSelectionFeature, rowSortingFeature, tableFeatures } from "@tanstack/react-table";
import { useEffect, useRef, type InputHTMLAttributes } from "react";
import type { DealTableRow } from "@/lib/schemas/deal-table";
import { daysSince, formatCents, formatDate, formatKwFromWatts } from "@/lib/format";
import { STAGE_LABELS } from "@/lib/stages";

export const features = tableFeatures({
  rowSortingFeature,
  rowPaginationFeature,
  columnVisibilityFeature,
  rowSelectionFeature,
  columnMeta: {} as { align?: "right"; label: string; priority?: "low" },
});

const helper = createColumnHelper<typeof features, DealTableRow>();

/** A checkbox that can also show "some selected" (indeterminate is a DOM property, not an attribute). */
export function Checkbox({ indeterminate = false, ...props }: { indeterminate?: boolean } & InputHTMLAttributes<HTMLInputElement>) {
  const ref = useRef<HTMLInputElement>(null);
  useEffect(() => {
    if (ref.current) ref.current.indeterminate = indeterminate && !props.checked;
  }, [indeterminate, props.checked]);
  return <input ref={ref} type="checkbox" className="h-5 w-5 cursor-pointer accent-copper" {...props} />;
}

/** The table's columns (dates on the company's clock); each id is also the server's sort key. */
function columnsFor(timeZone: string) {
  return helper.columns([
    helper.accessor("householdName", {
      id: "household",
      header: "Household",
      enableHiding: false,
      meta: { label: "Household" },
      // The row's checkbox for bulk actions sits beside the household it selects.
      cell: (info) => (
        <span className="inline-flex items-center gap-3">
          <Checkbox
            aria-label={`Select ${info.getValue()}`}
            checked={info.row.getIsSelected()}
            onChange={info.row.getToggleSelectedHandler()}
          />
          {/* A long name wraps anywhere and stops at two lines; the whole name is its title. */}
          <Link
            href={`/deals/${info.row.original.id}`}
            title={info.getValue()}
            className="line-clamp-2 max-w-[16rem] font-medium text-graphite wrap-anywhere underline-offset-2 hover:text-copper hover:underline"
          >
            {info.getValue()}
          </Link>
        </span>
      ),
    }),
    helper.accessor("city", { id: "city", header: "City", meta: { label: "City", priority: "low" } }),
    helper.accessor("stage", { id: "stage", header: "Stage", meta: { label: "Stage" }, cell: (info) => STAGE_LABELS[info.getValue()] }),
    helper.accessor("systemDcWatts", {
      id: "systemDcWatts",
      header: "System",
      sortDescFirst: true,
      meta: { label: "System size", align: "right" },
      cell: (info) => <span className="figure">{formatKwFromWatts(info.getValue())}</span>,
    }),
    helper.accessor("contractCents", {
      id: "contractCents",
      header: "Contract",
      sortDescFirst: true,
      meta: { label: "Contract value", align: "right" },
      cell: (info) => <span className="figure">{formatCents(info.getValue())}</span>,
    }),
    helper.accessor("stageChangedAt", {
      id: "stageChangedAt",
      header: "In stage since",
      sortDescFirst: true,
      meta: { label: "In stage since" },
      cell: (info) => {
        const d = new Date(info.getValue());
        return (
          <span title={`${daysSince(d)} days in this stage`}>
            {formatDate(d, timeZone)} <span className="figure text-xs text-graphite-soft">({daysSince(d)} d)</span>
          </span>
        );
      },
    }),
    helper.accessor("createdAt", {
      id: "createdAt",
      header: "Created",
      sortDescFirst: true,
      meta: { label: "Created", priority: "low" },
      cell: (info) => formatDate(new Date(info.getValue()), timeZone),
    }),
    helper.accessor("ownerName", { id: "owner", header: "Owner", meta: { label: "Owner" }, cell: (info) => info.getValue() ?? "—" }),
    helper.accessor("source", { id: "source", header: "Source", meta: { label: "Source", priority: "low" }, cell: (info) => info.getValue() ?? "—" }),
  ]);
}

/** Every column for the office; a rep's table has no Owner column (all deals are theirs). */
export function dealColumns(timeZone: string, showOwner: boolean) {
  const all = columnsFor(timeZone);
  return showOwner ? all : all.filter((c) => c.id !== "owner");
}
