import "server-only";
import type { NextRequest } from "next/server";
import type { Permission } from "@/lib/permissions";
import { openDeal, type DealScope } from "@/server/deal-scope";
import { notFound } from "@/server/errors";
import { idSchema, withMember } from "@/server/route";

type DealHandler = (args: { req: NextRequest; scope: DealScope }) => Promise<Response>;

/**
 * withMember for the routes of one deal: the deal's id comes from the path (/api/deals/<id>/…)
 * or, with `from: "query"`, from `?dealId=`. A malformed or invisible id is "Deal not found";
 * the handler gets the deal scope, opened once for the request.
 */
export function withDeal(permission: Permission, handler: DealHandler, options: { from?: "path" | "query"; bodyTypes?: readonly string[] } = {}) {
  return withMember<{ id?: string }>(
    permission,
    async ({ req, member, params }) => {
      const dealId = options.from === "query" ? (req.nextUrl.searchParams.get("dealId") ?? "") : (params.id ?? "");
      if (!idSchema.safeParse(dealId).success) throw notFound("Deal");
      return handler({ req, scope: await openDeal(member, dealId) });
    },
    { bodyTypes: options.bodyTypes },
  );
}
