import { NextResponse } from "next/server";
import { env } from "@/env";
import { withProposalToken } from "@/server/proposals";
import { readJson } from "@/server/route";
import { SIGNING_COOKIE, SIGNING_COOKIE_PATH, SIGNING_WINDOW_MS, signingCodeState, verifySigningCode } from "@/server/signing";
import { z } from "zod";

/** Whether this browser already confirmed its code (a reload within the 30 minutes), or has a code waiting to be typed. */
export const GET = withProposalToken(async ({ req, proposal }) => {
  const state = await signingCodeState(proposal, req.cookies.get(SIGNING_COOKIE)?.value ?? null);
  return NextResponse.json({ data: state }, { headers: { "Cache-Control": "no-store" } });
});

/** Checks the code (body: { code }); a right code leaves a 30-minute signing confirmation in an httpOnly cookie. */
export const POST = withProposalToken(async ({ req, proposal, client }) => {
  const body = await readJson(req, z.unknown());
  const { session, validUntil } = await verifySigningCode(proposal, body, client);
  const res = NextResponse.json({ data: { verified: true, validUntil } });
  res.cookies.set(SIGNING_COOKIE, session, {
    httpOnly: true,
    sameSite: "strict",
    secure: env().APP_URL.startsWith("https:"),
    path: SIGNING_COOKIE_PATH,
    maxAge: SIGNING_WINDOW_MS / 1000,
  });
  return res;
});
