import { openDealOf } from "@/server/deal-scope";
import { readById } from "@/server/route";
import { getTimelineEventOrThrow } from "@/server/timeline";

export const GET = readById("deals:read-own", "Timeline event", async (member, id) => {
  const event = await getTimelineEventOrThrow(member, id);
  await openDealOf(member, event.dealId, "Timeline event"); // a rep reads only their own deals' events
  return event;
});
