import { updateChecklistTemplateSchema } from "@/lib/schemas/jobs";
import { deleteChecklistTemplate, getChecklistTemplateOrThrow, updateChecklistTemplate } from "@/server/checklists";
import { deleteById, readById, writeById } from "@/server/route";

export const GET = readById("checklists:manage", "Checklist", getChecklistTemplateOrThrow);

/** New name or items, and/or activate (the others deactivate) or deactivate. */
export const PATCH = writeById("checklists:manage", "Checklist", updateChecklistTemplateSchema, updateChecklistTemplate);

/** Jobs keep their own copy, so deleting a template changes no job. */
export const DELETE = deleteById("checklists:manage", "Checklist", async (member, id) => {
  await deleteChecklistTemplate(member, id);
});
