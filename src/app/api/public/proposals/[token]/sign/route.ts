import { NextResponse } from "next/server";
import { withProposalToken } from "@/server/proposals";
import { readJson } from "@/server/route";
import { SIGNING_COOKIE, SIGNING_COOKIE_PATH, signProposal } from "@/server/signing";
import { z } from "zod";

/**
 * Signs (body: { position, signerName, consent: true, signaturePng }) after the e-mail was
 * confirmed with a code in this browser. 409 when already signed or no longer live.
 */
export const POST = withProposalToken(async ({ req, proposal, token, client }) => {
  const body = await readJson(req, z.unknown());
  const outcome = await signProposal(proposal, token, body, client, req.cookies.get(SIGNING_COOKIE)?.value ?? null);
  const res = NextResponse.json({ data: outcome }, { status: 201 });
  res.cookies.set(SIGNING_COOKIE, "", { path: SIGNING_COOKIE_PATH, maxAge: 0 });
  return res;
});
