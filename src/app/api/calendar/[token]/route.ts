import type { NextRequest } from "next/server";
import { crewCalendarIcs } from "@/server/jobs";
import { errorResponse, toErrorResponse } from "@/server/route";

type Params = { token: string };

/**
 * Public: a crew's calendar feed (RFC 5545) behind its secret token, which is the only key —
 * calendar apps cannot sign in. An unknown or rotated token is simply not found. A trailing
 * ".ics" is accepted for apps that want one.
 */
export async function GET(_req: NextRequest, ctx: { params: Promise<Params> }): Promise<Response> {
  try {
    const { token } = await ctx.params;
    const ics = await crewCalendarIcs(token.replace(/\.ics$/, ""));
    if (ics === null) return errorResponse(404, "not_found", "Calendar not found.");
    return new Response(ics, {
      headers: {
        "Content-Type": "text/calendar; charset=utf-8",
        "Content-Disposition": 'inline; filename="jobs.ics"',
        "Cache-Control": "private, max-age=300",
        "X-Robots-Tag": "noindex",
      },
    });
  } catch (err) {
    return toErrorResponse(err);
  }
}
