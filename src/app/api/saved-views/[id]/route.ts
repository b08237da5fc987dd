import { savedViewUpdateSchema } from "@/lib/schemas/deal-table";
import { deleteById, readById, writeById } from "@/server/route";
import { deleteSavedView, getSavedViewOrThrow, updateSavedView } from "@/server/saved-views";

/** One's own saved view; another person's or another company's answers 404. */
export const GET = readById("views:own", "Saved view", getSavedViewOrThrow);

/** Renames the view and/or replaces its query: { name?, query? }. */
export const PUT = writeById("views:own", "Saved view", savedViewUpdateSchema, updateSavedView);

export const DELETE = deleteById("views:own", "Saved view", async (member, id) => {
  await deleteSavedView(member, id);
  return { id, deleted: true };
});
