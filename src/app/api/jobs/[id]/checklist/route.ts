import { NextResponse } from "next/server";
import { checklistTickSchema } from "@/lib/schemas/jobs";
import { notFound } from "@/server/errors";
import { applyActiveChecklist, setChecklistItem } from "@/server/jobs";
import { idSchema, readJson, withMember } from "@/server/route";

type Params = { id: string };

/** Tick or untick one item (records who and when). */
export const PATCH = withMember<Params>("jobs:work", async ({ req, member, params }) => {
  if (!idSchema.safeParse(params.id).success) throw notFound("Job");
  const input = await readJson(req, checklistTickSchema);
  return NextResponse.json({ data: await setChecklistItem(member, params.id, input) });
});

/** The office copies the active checklist template into a job that has no checklist yet. */
export const POST = withMember<Params>("jobs:manage", async ({ member, params }) => {
  if (!idSchema.safeParse(params.id).success) throw notFound("Job");
  return NextResponse.json({ data: await applyActiveChecklist(member, params.id) }, { status: 201 });
});
