import { NextResponse } from "next/server";
import { env } from "@/env";
import { withProposalToken } from "@/server/proposals";
import { readJson } from "@/server/route";
import { SIGNING_COOKIE, SIGNING_COOKIE_PATH, SIGNING_WINDOW_MS, verifySigningCode } from "@/server/signing";
import { z } from "zod";

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
