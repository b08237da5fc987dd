import type { ReactNode, ThHTMLAttributes, TdHTMLAttributes } from "react";

/** The office tables' frame: white card, scrolls sideways inside itself on a narrow screen. */
export function TableShell({ minWidth, testId, head, children, label }: { minWidth?: number; testId?: string; head: ReactNode; children: ReactNode; label?: string }) {
  return (
    <div className="overflow-x-auto rounded-card border border-paper-line bg-white">
      <table className="w-full text-left text-sm" style={minWidth ? { minWidth } : undefined} data-testid={testId} aria-label={label}>
        <thead className="bg-paper-deep text-xs uppercase tracking-wide text-graphite-soft">
          <tr>{head}</tr>
        </thead>
        <tbody className="divide-y divide-paper-line">{children}</tbody>
      </table>
    </div>
  );
}

/** A column heading; `numeric` right-aligns it over figures. */
export function Th({ numeric, className, children, ...rest }: ThHTMLAttributes<HTMLTableCellElement> & { numeric?: boolean }) {
  return (
    <th scope="col" className={`px-3 py-2 font-medium ${numeric ? "text-right" : ""} ${className ?? ""}`} {...rest}>
      {children}
    </th>
  );
}

/** A cell; `numeric` right-aligns it in tabular figures. */
export function Td({ numeric, className, children, ...rest }: TdHTMLAttributes<HTMLTableCellElement> & { numeric?: boolean }) {
  return (
    <td className={`px-3 py-1.5 ${numeric ? "figure text-right" : ""} ${className ?? ""}`} {...rest}>
      {children}
    </td>
  );
}
