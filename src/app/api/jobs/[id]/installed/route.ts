import { NextResponse } from "next/server";
import { notFound } from "@/server/errors";
import { markJobInstalled } from "@/server/jobs";
import { idSchema, readJson, withMember } from "@/server/route";
import { markInstalledSchema } from "@/lib/schemas/jobs";

type Params = { id: string };

/**
 * "Installed": records the time and moves the deal to Installed (idempotent). From the install
 * date on; before it only the office, with `earlyReason`. Never inside the buyer's window.
 */
export const POST = withMember<Params>("jobs:work", async ({ req, member, params }) => {
  if (!idSchema.safeParse(params.id).success) throw notFound("Job");
  // The crew's one tap may come with no body at all: no early reason then.
  const input = req.headers.get("content-type")?.startsWith("application/json") ? await readJson(req, markInstalledSchema) : {};
  return NextResponse.json({ data: await markJobInstalled(member, params.id, input) });
});
