import type { Metadata } from "next";
import { formatDateTime } from "@/lib/format";
import { dealPageScope } from "../deal-page";
import { listTimeline } from "@/server/timeline";

export const metadata: Metadata = { title: "Timeline" };

export default async function TimelineTab({ params }: { params: Promise<{ id: string }> }) {
  const scope = await dealPageScope(params);
  if (!scope) return null;
  const events = await listTimeline(scope.member, scope.dealId);
  return (
    <ol className="relative space-y-4 border-l-2 border-paper-line pl-6" aria-label="What happened">
      {events.map((e) => (
        <li key={e.id} className="relative">
          <span aria-hidden className="absolute -left-[31px] top-1.5 h-3 w-3 rounded-full border-2 border-white bg-copper" />
          <p className="font-medium">{e.summary}</p>
          <p className="text-sm text-graphite-soft">
            {formatDateTime(e.createdAt, scope.settings.timeZone)}
            {e.actorName ? ` · ${e.actorName}` : ""}
          </p>
        </li>
      ))}
      {events.length === 0 ? <li className="text-graphite-soft">Nothing recorded yet.</li> : null}
    </ol>
  );
}
