import { getDealOrThrow } from "@/server/deals";
import { readById } from "@/server/route";
import { getTimelineEventOrThrow } from "@/server/timeline";

export const GET = readById("deals:read-own", "Timeline event", async (member, id) => {
  const event = await getTimelineEventOrThrow(member, id);
  await getDealOrThrow(member, event.dealId); // a rep reads only their own deals' events
  return event;
});
