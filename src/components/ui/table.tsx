"use client";
import { useLayoutEffect, useRef, type ReactNode, type RefObject, type TableHTMLAttributes, type TdHTMLAttributes, type ThHTMLAttributes } from "react";
import "./table.css";

type Fit = "full" | "priority" | "stacked";

/** Each body cell gets its column's heading as `data-label` (shown beside the value as a card). */
function labelCells(table: HTMLTableElement) {
  const labels: string[] = [];
  for (const th of table.tHead?.rows[0]?.cells ?? []) {
    const text = th.dataset.label ?? th.textContent?.trim() ?? "";
    for (let i = 0; i < th.colSpan; i++) labels.push(text);
  }
  for (const body of table.tBodies) {
    for (const row of body.rows) {
      let col = 0;
      for (const cell of row.cells) {
        const label = labels[col] ?? "";
        // A row's own heading (<th scope="row">) heads its card: it needs no label.
        if (label && cell.tagName === "TD" && cell.dataset.label !== label) cell.dataset.label = label;
        col += cell.colSpan;
      }
    }
  }
}

/**
 * A table that fits its frame, in the shared way (issue #18: no sideways scrolling): all columns
 * when they fit (and the frame is at least `minWidth` wide, below which they are too squeezed to
 * read); else without its low-priority columns (`data-priority="low"` on their cells); else each
 * row as a card of "heading: value" lines. Measured again when the frame's width or the rows change.
 * The frame takes the focus so a keyboard can scroll a table that has no link or field in it
 * (WCAG 2.1.1; axe's scrollable-region-focusable).
 */
export function useFitTable(frame: RefObject<HTMLElement | null>, tableRef: RefObject<HTMLTableElement | null>, minWidth = 0) {
  useLayoutEffect(() => {
    const box = frame.current;
    const table = tableRef.current;
    if (!box || !table) return;
    let width = -1;
    const fits = (fit: Fit) => {
      table.dataset.fit = fit;
      return table.scrollWidth <= box.clientWidth + 1 && (fit !== "full" || box.clientWidth >= minWidth);
    };
    const fit = (force = false) => {
      if (!force && box.clientWidth === width) return;
      width = box.clientWidth;
      labelCells(table);
      const hasLow = table.querySelector('[data-priority="low"]') !== null;
      if (fits("full")) return;
      if (hasLow && fits("priority")) return;
      table.dataset.fit = "stacked";
    };
    fit(true);
    const resized = new ResizeObserver(() => fit());
    resized.observe(box);
    // New rows (a page of the deals table, an added bill) need labels and may change the fit.
    const changed = new MutationObserver(() => fit(true));
    changed.observe(table, { childList: true, subtree: true, characterData: true });
    return () => {
      resized.disconnect();
      changed.disconnect();
    };
  }, [frame, tableRef, minWidth]);
}

/**
 * A table in a frame that it fits (useFitTable). The frame takes its width from where it is
 * placed, never from the table (`contain: inline-size`): otherwise a grid or a fieldset around it
 * grows to the full table's width and the table never needs to fold.
 */
export function FitTable({ minWidth, frameClassName, className, children, ...rest }: TableHTMLAttributes<HTMLTableElement> & { minWidth?: number; frameClassName?: string }) {
  const frame = useRef<HTMLDivElement>(null);
  const table = useRef<HTMLTableElement>(null);
  useFitTable(frame, table, minWidth);
  return (
    <div ref={frame} tabIndex={0} className={`relative overflow-x-auto [contain:inline-size] ${frameClassName ?? ""}`}>
      <table ref={table} className={`fit-table w-full ${className ?? ""}`} {...rest}>
        {children}
      </table>
    </div>
  );
}

/**
 * The office tables' frame: a white card whose table fits it (FitTable): on a phone or an
 * upright tablet a wide table drops its low-priority columns or becomes cards, so nothing
 * scrolls sideways. `minWidth`: the width under which the full table is too squeezed.
 * `relative` keeps absolutely placed children (an sr-only heading) inside the frame.
 */
export function TableShell(props: { minWidth?: number; testId?: string; head: ReactNode; children: ReactNode; label?: string; alignTop?: boolean; className?: string }) {
  const { minWidth, testId, head, children, label } = props;
  return (
    <FitTable minWidth={minWidth} frameClassName={`rounded-card border border-paper-line bg-white ${props.className ?? ""}`} className="text-left text-sm" data-testid={testId} aria-label={label}>
      <thead className="bg-paper-deep text-xs uppercase tracking-wide text-graphite-soft">
        <tr>{head}</tr>
      </thead>
      <tbody className={`divide-y divide-paper-line ${props.alignTop ? "align-top" : ""}`}>{children}</tbody>
    </FitTable>
  );
}

/** A column heading; `numeric` right-aligns it over figures; `priority="low"` goes first when space is short. */
export function Th({ numeric, priority, className, children, ...rest }: ThHTMLAttributes<HTMLTableCellElement> & { numeric?: boolean; priority?: "low" }) {
  return (
    <th scope="col" data-priority={priority} className={`px-3 py-2 font-medium ${numeric ? "text-right" : ""} ${className ?? ""}`} {...rest}>
      {children}
    </th>
  );
}

/** A cell; `numeric` right-aligns it in tabular figures; `priority` as its column's heading. */
export function Td({ numeric, priority, className, children, ...rest }: TdHTMLAttributes<HTMLTableCellElement> & { numeric?: boolean; priority?: "low" }) {
  return (
    <td data-priority={priority} className={`px-3 py-1.5 ${numeric ? "figure text-right" : ""} ${className ?? ""}`} {...rest}>
      {children}
    </td>
  );
}
