// Input schemas for jobs, crews, checklist templates and job photos, shared by the forms
// (zodResolver) and the server.
import { z } from "zod";

/** One item of a job's install checklist, copied from a template when the job is created. */
export type JobChecklistItem = { id: string; label: string; doneAt: string | null; doneByUserId: string | null };
/** One item of a checklist template. */
export type ChecklistTemplateItem = { id: string; label: string };

const checklistItemSchema = z.object({
  id: z.string().min(1).max(64),
  label: z.string(),
  doneAt: z.string().nullable(),
  doneByUserId: z.string().nullable(),
});
const templateItemSchema = z.object({ id: z.string().min(1).max(64), label: z.string() });

/** Reads a stored checklist defensively (JSON column): anything malformed is dropped. */
export function parseJobChecklist(value: unknown): JobChecklistItem[] {
  const parsed = z.array(checklistItemSchema).safeParse(value);
  return parsed.success ? parsed.data : [];
}

export function parseTemplateItems(value: unknown): ChecklistTemplateItem[] {
  const parsed = z.array(templateItemSchema).safeParse(value);
  return parsed.success ? parsed.data : [];
}
