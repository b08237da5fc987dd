import "server-only";
import { randomBytes } from "node:crypto";
import { and, asc, eq, ne } from "drizzle-orm";
import type { z } from "zod";
import { checklistTemplate } from "@/db/schema";
import { type ChecklistTemplateItem, type checklistTemplateSchema, type updateChecklistTemplateSchema } from "@/lib/schemas/jobs";
import { companyRowOrThrow } from "@/server/records";
import { db, transaction } from "@/server/db";

import type { Member } from "@/server/session";

export type ChecklistTemplateView = {
  id: string;
  name: string;
  items: ChecklistTemplateItem[];
  active: boolean;
  createdAt: Date;
  updatedAt: Date;
};

function view(row: typeof checklistTemplate.$inferSelect): ChecklistTemplateView {
  return { id: row.id, name: row.name, items: row.items, active: row.active, createdAt: row.createdAt, updatedAt: row.updatedAt };
}

/** Item keys: kept when an item is edited, new for a new item. */
const newItemId = () => `i${randomBytes(6).toString("hex")}`;
function withIds(items: { id: string; label: string }[]): ChecklistTemplateItem[] {
  return items.map((item) => ({ id: item.id || newItemId(), label: item.label }));
}

export async function listChecklistTemplates(member: Member): Promise<ChecklistTemplateView[]> {
  const rows = await db()
    .select()
    .from(checklistTemplate)
    .where(eq(checklistTemplate.companyId, member.companyId))
    .orderBy(asc(checklistTemplate.name), asc(checklistTemplate.id));
  return rows.map(view);
}

export async function getChecklistTemplateOrThrow(member: Member, id: string): Promise<ChecklistTemplateView> {
  return view(await companyRowOrThrow(checklistTemplate, member.companyId, id, "Checklist"));
}

/**
 * A new template. The company's first template starts active (new jobs copy it); later ones
 * start inactive until an admin activates them.
 */
export async function createChecklistTemplate(member: Member, input: z.output<typeof checklistTemplateSchema>): Promise<ChecklistTemplateView> {
  const id = crypto.randomUUID();
  await transaction(async (tx) => {
    const [any] = await tx.select({ id: checklistTemplate.id }).from(checklistTemplate).where(eq(checklistTemplate.companyId, member.companyId)).limit(1);
    await tx.insert(checklistTemplate).values({ id, companyId: member.companyId, name: input.name, items: withIds(input.items), active: !any });
  });
  return getChecklistTemplateOrThrow(member, id);
}

/**
 * Edits a template. Activating one deactivates the company's others, so exactly one checklist
 * is copied into new jobs; jobs already created keep their own copy.
 */
export async function updateChecklistTemplate(
  member: Member,
  id: string,
  input: z.output<typeof updateChecklistTemplateSchema>,
): Promise<ChecklistTemplateView> {
  await getChecklistTemplateOrThrow(member, id);
  await transaction(async (tx) => {
    const set: Partial<typeof checklistTemplate.$inferInsert> = {};
    if (input.name !== undefined) set.name = input.name;
    if (input.items !== undefined) set.items = withIds(input.items);
    if (input.active !== undefined) set.active = input.active;
    if (input.active === true) {
      await tx
        .update(checklistTemplate)
        .set({ active: false })
        .where(and(eq(checklistTemplate.companyId, member.companyId), ne(checklistTemplate.id, id)));
    }
    await tx
      .update(checklistTemplate)
      .set(set)
      .where(and(eq(checklistTemplate.id, id), eq(checklistTemplate.companyId, member.companyId)));
  });
  return getChecklistTemplateOrThrow(member, id);
}

export async function deleteChecklistTemplate(member: Member, id: string): Promise<void> {
  await getChecklistTemplateOrThrow(member, id);
  await db()
    .delete(checklistTemplate)
    .where(and(eq(checklistTemplate.id, id), eq(checklistTemplate.companyId, member.companyId)));
}
