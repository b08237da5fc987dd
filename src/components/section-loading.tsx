/**
 * Shown while a section's data loads (the shell stays in place). Only list sections use it:
 * a page that can answer "not found" (a deal, a job, a rate plan) must not sit under a loading
 * boundary, or its not-found page would be streamed after a 200 instead of answered as a 404.
 */
export function SectionLoading() {
  return (
    <div role="status" aria-live="polite" className="space-y-3">
      <span className="sr-only">Loading…</span>
      <div aria-hidden className="h-7 w-48 animate-pulse rounded bg-paper-deep" />
      <div aria-hidden className="h-4 w-72 animate-pulse rounded bg-paper-deep" />
      <div aria-hidden className="h-48 animate-pulse rounded-card bg-paper-deep" />
    </div>
  );
}
