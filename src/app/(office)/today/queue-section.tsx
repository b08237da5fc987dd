import type { ReactNode } from "react";

/**
 * One queue of a person's Today: a heading with its count, the items (each a link to where the
 * work is done), and a line when there are more than shown.
 */
export function QueueSection({
  id,
  title,
  total,
  shown,
  tone = "plain",
  empty,
  more,
  children,
}: {
  id: string;
  title: string;
  total: number;
  shown: number;
  tone?: "plain" | "caution" | "danger";
  /** Shown when the queue is empty; without it, an empty queue is left out. */
  empty?: string;
  more?: ReactNode;
  children: ReactNode;
}) {
  if (total === 0 && !empty) return null;
  const border = tone === "danger" ? "border-danger/40" : tone === "caution" ? "border-caution/40" : "";
  return (
    <section className={`card mt-6 p-5 ${border}`} aria-labelledby={`${id}-heading`}>
      <h2 id={`${id}-heading`} className="flex items-baseline justify-between gap-2 font-semibold">
        {title}
        <span className="figure text-sm font-normal text-graphite-soft" aria-label={`${total} in all`}>
          {total}
        </span>
      </h2>
      {total === 0 ? (
        <p className="mt-1 text-graphite-soft">{empty}</p>
      ) : (
        <ul className="mt-2 divide-y divide-paper-line" data-testid={id}>
          {children}
        </ul>
      )}
      {total > shown ? (
        <p className="mt-2 text-sm text-graphite-soft">
          The first <span className="figure">{shown}</span> of <span className="figure">{total}</span>.{more ? <> {more}</> : null}
        </p>
      ) : null}
    </section>
  );
}

/** One row of a queue: the link on the left, what it is about on the right. */
export function QueueItem({ children, aside }: { children: ReactNode; aside?: ReactNode }) {
  return (
    <li className="flex min-h-touch flex-wrap items-center justify-between gap-2 py-2">
      <span>{children}</span>
      {aside ? <span className="text-sm text-graphite-soft">{aside}</span> : null}
    </li>
  );
}
