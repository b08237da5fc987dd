"use client";
import { CopyButton } from "@/components/ui/copy-button";

/** The crew's calendar feed: subscribe on the phone (webcal:) or copy the address. */
export function FeedLink({ feedUrl, crewName }: { feedUrl: string; crewName: string }) {
  const webcal = feedUrl.replace(/^https?:/, "webcal:");
  return (
    <section className="card mt-8 p-4" aria-labelledby="feed-heading">
      <h2 id="feed-heading" className="font-semibold">
        {crewName}&apos;s calendar
      </h2>
      <p className="mt-1 text-sm text-graphite-soft">Surveys, installs and inspections in your phone&apos;s calendar. Keep the address to yourselves.</p>
      <div className="mt-3 flex flex-wrap gap-2">
        <a href={webcal} className="btn-quiet">
          Subscribe
        </a>
        <CopyButton text={feedUrl} label="Copy address" copiedLabel="Address copied" />
      </div>
    </section>
  );
}
