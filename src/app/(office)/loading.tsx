/** Shown while a section's data loads (the shell stays in place). */
export default function Loading() {
  return (
    <div role="status" aria-live="polite" className="space-y-3">
      <span className="sr-only">Loading…</span>
      <div aria-hidden className="h-7 w-48 animate-pulse rounded bg-paper-deep" />
      <div aria-hidden className="h-4 w-72 animate-pulse rounded bg-paper-deep" />
      <div aria-hidden className="h-48 animate-pulse rounded-card bg-paper-deep" />
    </div>
  );
}
