import type { Metadata } from "next";
import { formatDateTime } from "@/lib/format";
import { openDeal } from "@/server/deal-scope";
import { getMember } from "@/server/session";
import { listTimeline } from "@/server/timeline";

export const metadata: Metadata = { title: "Timeline" };

export default async function TimelineTab({ params }: { params: Promise<{ id: string }> }) {
  const { id } = await params;
  const member = await getMember();
  if (!member) return null;
  await openDeal(member, id);
  const events = await listTimeline(member, id);
  return (
    <ol className="relative space-y-4 border-l-2 border-paper-line pl-6" aria-label="What happened">
      {events.map((e) => (
        <li key={e.id} className="relative">
          <span aria-hidden className="absolute -left-[31px] top-1.5 h-3 w-3 rounded-full border-2 border-white bg-copper" />
          <p className="font-medium">{e.summary}</p>
          <p className="text-sm text-graphite-soft">
            {formatDateTime(e.createdAt)}
            {e.actorName ? ` · ${e.actorName}` : ""}
          </p>
        </li>
      ))}
      {events.length === 0 ? <li className="text-graphite-soft">Nothing recorded yet.</li> : null}
    </ol>
  );
}
