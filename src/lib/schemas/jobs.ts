// Input schemas for jobs, crews, checklist templates and job photos, shared by the forms
// (zodResolver) and the server.
import { z } from "zod";
import { plainText } from "@/lib/schemas/text";

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
const storedTemplateItemSchema = z.object({ id: z.string().min(1).max(64), label: z.string() });

/**
 * A stored checklist (column job.checklist, copied from a template) and a template's items
 * (checklist_template.items), read forgivingly: anything malformed reads as empty.
 */
export const storedJobChecklistSchema = z.array(checklistItemSchema).catch([]);
export const storedTemplateItemsSchema = z.array(storedTemplateItemSchema).catch([]);

// ── Jobs (office) ───────────────────────────────────────────────────────────────────────

const isoDate = z
  .string()
  .trim()
  .regex(/^\d{4}-\d{2}-\d{2}$/, "Use a date like 2026-04-30")
  .refine((s) => !Number.isNaN(Date.parse(`${s}T00:00:00Z`)) && new Date(`${s}T00:00:00Z`).toISOString().startsWith(s), "Not a real date");

/** An optional date field: "" or null clears it. */
const optionalDate = z
  .union([z.literal(""), z.null(), isoDate])
  .transform((v) => (v ? v : null))
  .optional();

const optionalText = (max: number, label: string) =>
  z
    .union([z.null(), plainText({ multiline: true }).trim().max(max, `Keep the ${label} under ${max} characters`)])
    .transform((v) => (v ? v : null))
    .optional();

/** Every field the office sets on a job; absent fields stay as they are. */
export const jobFieldsSchema = z
  .object({
    crewId: z
      .union([z.literal(""), z.null(), z.string().uuid("Pick a crew from the list")])
      .transform((v) => (v ? v : null))
      .optional(),
    surveyDate: optionalDate,
    surveyDoneOn: optionalDate,
    installDate: optionalDate,
    permitNumber: optionalText(100, "permit number"),
    permitSubmittedOn: optionalDate,
    permitApprovedOn: optionalDate,
    interconnectionNumber: optionalText(100, "interconnection number"),
    interconnectionSubmittedOn: optionalDate,
    interconnectionApprovedOn: optionalDate,
    inspectionOn: optionalDate,
    inspectionPassedOn: optionalDate,
    ptoOn: optionalDate,
    notes: optionalText(5000, "notes"),
  })
  .strict()
  .superRefine((v, ctx) => {
    if (v.permitSubmittedOn && v.permitApprovedOn && v.permitApprovedOn < v.permitSubmittedOn) {
      ctx.addIssue({ code: "custom", path: ["permitApprovedOn"], message: "The permit cannot be approved before it was submitted" });
    }
    if (v.interconnectionSubmittedOn && v.interconnectionApprovedOn && v.interconnectionApprovedOn < v.interconnectionSubmittedOn) {
      ctx.addIssue({ code: "custom", path: ["interconnectionApprovedOn"], message: "Interconnection cannot be approved before it was submitted" });
    }
    if (v.installDate && v.inspectionOn && v.inspectionOn < v.installDate) {
      ctx.addIssue({ code: "custom", path: ["inspectionOn"], message: "The inspection cannot come before the install" });
    }
  });
export type JobFieldsInput = z.input<typeof jobFieldsSchema>;
export type JobFields = z.output<typeof jobFieldsSchema>;

/** The office job form: every field as text ("" = empty). */
export type JobFormValues = {
  crewId: string;
  surveyDate: string;
  surveyDoneOn: string;
  installDate: string;
  permitNumber: string;
  permitSubmittedOn: string;
  permitApprovedOn: string;
  interconnectionNumber: string;
  interconnectionSubmittedOn: string;
  interconnectionApprovedOn: string;
  inspectionOn: string;
  inspectionPassedOn: string;
  ptoOn: string;
  notes: string;
};

/**
 * POST /api/jobs/[id]/installed. A crew marks its job installed from the install date on; before
 * it, only the office can, saying why (`earlyReason`, written on the Timeline).
 */
export const markInstalledSchema = z
  .object({
    earlyReason: z
      .union([z.null(), plainText().trim().max(300, "Keep the reason under 300 characters")])
      .transform((v) => (v ? v : null))
      .optional(),
  })
  .strict();
export type MarkInstalledInput = z.output<typeof markInstalledSchema>;

/** PATCH /api/jobs/[id]/checklist — tick or untick one item. */
export const checklistTickSchema = z.object({
  itemId: z.string().min(1, "Unknown checklist item").max(64),
  done: z.boolean({ error: "Say whether the item is done" }),
});

/** Job photos: what the phone may send, and the largest file accepted. */
export const JOB_PHOTO_MAX_BYTES = 25 * 1024 * 1024;
export const JOB_PHOTO_MIME_TYPES = ["image/jpeg", "image/png", "image/webp"] as const;
/** Longest side of a stored photo, px: enough to read a label, small enough for a roof's mobile data. */
export const JOB_PHOTO_MAX_SIDE_PX = 2048;
export const jobPhotoCaptionSchema = plainText().trim().max(200, "Keep the caption under 200 characters").default("");

// ── Crews ───────────────────────────────────────────────────────────────────────────────

const crewName = plainText().trim().min(2, "Give the crew a name").max(100, "Keep the name under 100 characters");

export const createCrewSchema = z.object({ name: crewName });
export type CreateCrewInput = z.input<typeof createCrewSchema>;

/** PATCH /api/crews/[id]: rename, and/or set exactly which installers belong to it (membership ids). */
export const updateCrewSchema = z
  .object({
    name: crewName.optional(),
    memberIds: z.array(z.string().uuid("Unknown person")).max(50, "At most 50 people in a crew").optional(),
  })
  .refine((v) => v.name !== undefined || v.memberIds !== undefined, { message: "Nothing to change" });

// ── Checklist templates ─────────────────────────────────────────────────────────────────

export const templateItemSchema = z.object({
  /** Kept when editing so jobs can be traced to the item; new items get one on the server. */
  id: z
    .string()
    .trim()
    .max(64)
    .regex(/^[A-Za-z0-9_-]*$/, "Unknown item")
    .default(""),
  label: plainText().trim().min(3, "Write what the crew checks (3 characters or more)").max(200, "Keep each item under 200 characters"),
});

const templateName = plainText().trim().min(2, "Give the checklist a name").max(100, "Keep the name under 100 characters");
const templateItems = z
  .array(templateItemSchema)
  .min(1, "Add at least one item")
  .max(60, "At most 60 items")
  .superRefine((items, ctx) => {
    const seen = new Set<string>();
    items.forEach((item, i) => {
      if (item.id && seen.has(item.id)) ctx.addIssue({ code: "custom", path: [i, "id"], message: "Two items share one key" });
      if (item.id) seen.add(item.id);
    });
  });

export const checklistTemplateSchema = z.object({ name: templateName, items: templateItems });
export type ChecklistTemplateInput = z.input<typeof checklistTemplateSchema>;

/** PATCH /api/checklist-templates/[id]: new name/items and/or (de)activation. */
export const updateChecklistTemplateSchema = z
  .object({
    name: templateName.optional(),
    items: templateItems.optional(),
    active: z.boolean().optional(),
  })
  .refine((v) => v.name !== undefined || v.items !== undefined || v.active !== undefined, { message: "Nothing to change" });
