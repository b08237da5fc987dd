import { NextResponse } from "next/server";
import { updateChecklistTemplateSchema } from "@/lib/schemas/jobs";
import { deleteChecklistTemplate, getChecklistTemplateOrThrow, updateChecklistTemplate } from "@/server/checklists";
import { notFound } from "@/server/errors";
import { idSchema, readJson, withMember } from "@/server/route";

type Params = { id: string };

export const GET = withMember<Params>("checklists:manage", async ({ member, params }) => {
  if (!idSchema.safeParse(params.id).success) throw notFound("Checklist");
  return NextResponse.json({ data: await getChecklistTemplateOrThrow(member, params.id) });
});

/** New name or items, and/or activate (the others deactivate) or deactivate. */
export const PATCH = withMember<Params>("checklists:manage", async ({ req, member, params }) => {
  if (!idSchema.safeParse(params.id).success) throw notFound("Checklist");
  const input = await readJson(req, updateChecklistTemplateSchema);
  return NextResponse.json({ data: await updateChecklistTemplate(member, params.id, input) });
});

/** Jobs keep their own copy, so deleting a template changes no job. */
export const DELETE = withMember<Params>("checklists:manage", async ({ member, params }) => {
  if (!idSchema.safeParse(params.id).success) throw notFound("Checklist");
  await deleteChecklistTemplate(member, params.id);
  return new Response(null, { status: 204 });
});
