import { NextResponse } from "next/server";
import { savedViewCreateSchema } from "@/lib/schemas/deal-table";
import { readJson, withMember } from "@/server/route";
import { createSavedView, listSavedViews } from "@/server/saved-views";

/** The signed-in person's own saved views of the deals table, by name. */
export const GET = withMember("views:own", async ({ member }) => NextResponse.json({ data: await listSavedViews(member) }));

/** Saves a view: { name, query } where query is the table's filters and sort (src/lib/schemas/deal-table.ts). */
export const POST = withMember("views:own", async ({ req, member }) => {
  const input = await readJson(req, savedViewCreateSchema);
  return NextResponse.json({ data: await createSavedView(member, input) }, { status: 201 });
});
