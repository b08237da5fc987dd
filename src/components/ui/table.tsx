import type { ReactNode, ThHTMLAttributes, TdHTMLAttributes } from "react";

/**
 * The office tables' frame: white card, scrolls sideways inside itself on a narrow screen.
 * `relative` keeps absolutely placed children (an sr-only heading) inside the frame: without
 * it they are placed against the page and widen it. The frame takes the focus so a keyboard can
 * scroll a table that has no link or field in it (WCAG 2.1.1; axe's scrollable-region-focusable).
 */
export function TableShell(props: { minWidth?: number; testId?: string; head: ReactNode; children: ReactNode; label?: string; alignTop?: boolean; className?: string }) {
  const { minWidth, testId, head, children, label } = props;
  return (
    <div tabIndex={0} className={`relative overflow-x-auto rounded-card border border-paper-line bg-white ${props.className ?? ""}`}>
      <table className="w-full text-left text-sm" style={minWidth ? { minWidth } : undefined} data-testid={testId} aria-label={label}>
        <thead className="bg-paper-deep text-xs uppercase tracking-wide text-graphite-soft">
          <tr>{head}</tr>
        </thead>
        <tbody className={`divide-y divide-paper-line ${props.alignTop ? "align-top" : ""}`}>{children}</tbody>
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
