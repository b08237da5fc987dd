import { NextResponse } from "next/server";
import { z } from "zod";
import { setProposalLocale, withProposalToken } from "@/server/proposals";
import { readJson } from "@/server/route";

/** The homeowner switches their page's language (body: { locale: "en" | "es" }); later e-mails follow it. 429 past LIMITS.languageLink / languageAddress. */
export const POST = withProposalToken(async ({ req, proposal, client }) => {
  const body = await readJson(req, z.unknown());
  return NextResponse.json({ data: await setProposalLocale(proposal, body, client) });
});
