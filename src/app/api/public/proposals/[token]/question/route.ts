import { NextResponse } from "next/server";
import { askQuestion, withProposalToken } from "@/server/proposals";
import { readJson } from "@/server/route";
import { z } from "zod";

/** The customer asks the rep a question (body: { question }); stored and e-mailed to the rep. */
export const POST = withProposalToken(async ({ req, proposal, client }) => {
  const body = await readJson(req, z.unknown());
  return NextResponse.json({ data: await askQuestion(proposal, body, client) }, { status: 201 });
});
