import "server-only";
import type { NextRequest } from "next/server";
import { notFound } from "@/server/errors";
import { clientMeta, type ClientMeta } from "@/server/client-address";
import { toErrorResponse } from "@/server/route";
import { guardPublicMutation } from "@/server/request-guard";
import { findProposalByToken, type ProposalRow } from "./rows";

// ── Public route handlers ───────────────────────────────────────────────────────────────────

type TokenHandler = (args: { req: NextRequest; token: string; proposal: ProposalRow; client: ClientMeta }) => Promise<Response>;

/**
 * The wrapper for the customer's route handlers (/api/public/proposals/[token]/…): a malformed
 * or unknown token is simply not found, and nothing about other records is revealed. Its
 * mutations come only from our own pages (request-guard.ts: 403/415).
 */
export function withProposalToken(handler: TokenHandler) {
  return async (req: NextRequest, ctx: { params: Promise<{ token: string }> }): Promise<Response> => {
    try {
      guardPublicMutation(req);
      const { token } = await ctx.params;
      const found = await findProposalByToken(token);
      if (!found) throw notFound("Proposal");
      return await handler({ req, token, proposal: found, client: clientMeta(req.headers) });
    } catch (err) {
      return toErrorResponse(err);
    }
  };
}
