import { NextResponse } from "next/server";
import { dealBulkSchema } from "@/lib/schemas/deal-table";
import { bulkDealAction } from "@/server/deal-table";
import { readJson, withMember } from "@/server/route";

/**
 * Moves or reassigns up to 200 selected deals under the same rules as one at a time:
 * { dealIds, action: { kind: "move", to, reason? } | { kind: "reassign", ownerUserId } }.
 * Answers 200 with one result per deal (moved, reassigned, unchanged, or refused with the reason).
 */
export const POST = withMember("deals:write", async ({ req, member }) => {
  const input = await readJson(req, dealBulkSchema);
  return NextResponse.json({ data: await bulkDealAction(member, input) });
});
