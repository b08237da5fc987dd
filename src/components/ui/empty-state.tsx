import type { ReactNode } from "react";

/** What a list says when it has nothing yet, and what to do about it. */
export function EmptyState({ children, action }: { children: ReactNode; action?: ReactNode }) {
  return (
    <div className="rounded-card border border-dashed border-paper-line bg-white/60 px-4 py-6 text-center text-graphite-soft">
      <p>{children}</p>
      {action ? <div className="mt-3">{action}</div> : null}
    </div>
  );
}
