import { NextResponse } from "next/server";
import { checklistTemplateSchema } from "@/lib/schemas/jobs";
import { createChecklistTemplate, listChecklistTemplates } from "@/server/checklists";
import { readJson, withMember } from "@/server/route";

export const GET = withMember("checklists:manage", async ({ member }) => {
  return NextResponse.json({ data: await listChecklistTemplates(member) });
});

export const POST = withMember("checklists:manage", async ({ req, member }) => {
  const input = await readJson(req, checklistTemplateSchema);
  return NextResponse.json({ data: await createChecklistTemplate(member, input) }, { status: 201 });
});
