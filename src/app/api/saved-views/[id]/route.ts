import { NextResponse } from "next/server";
import { savedViewUpdateSchema } from "@/lib/schemas/deal-table";
import { notFound } from "@/server/errors";
import { idSchema, readJson, withMember } from "@/server/route";
import { deleteSavedView, getSavedViewOrThrow, updateSavedView } from "@/server/saved-views";

type Params = { id: string };

function checkId(id: string): string {
  if (!idSchema.safeParse(id).success) throw notFound("Saved view");
  return id;
}

/** One's own saved view; another person's or another company's answers 404. */
export const GET = withMember<Params>("views:own", async ({ member, params }) =>
  NextResponse.json({ data: await getSavedViewOrThrow(member, checkId(params.id)) }),
);

/** Renames the view and/or replaces its query: { name?, query? }. */
export const PUT = withMember<Params>("views:own", async ({ req, member, params }) => {
  const id = checkId(params.id);
  const input = await readJson(req, savedViewUpdateSchema);
  return NextResponse.json({ data: await updateSavedView(member, id, input) });
});

export const DELETE = withMember<Params>("views:own", async ({ member, params }) => {
  await deleteSavedView(member, checkId(params.id));
  return NextResponse.json({ data: { id: params.id, deleted: true } });
});
