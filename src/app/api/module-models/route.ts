import { NextResponse } from "next/server";
import { moduleModelSchema } from "@/lib/schemas/catalog";
import { createModule, listActiveModules, listModules } from "@/server/catalog";
import { readJson, withMember } from "@/server/route";

/** The company's modules; `?active=1` lists only those a new design may use. */
export const GET = withMember("catalog:read", async ({ req, member }) => {
  const activeOnly = req.nextUrl.searchParams.get("active") === "1";
  const rows = activeOnly ? await listActiveModules(member.companyId) : await listModules(member.companyId);
  return NextResponse.json({ data: rows });
});

/** Adds a module (409 when the manufacturer and model are already in the catalog). */
export const POST = withMember("catalog:manage", async ({ req, member }) => {
  const input = await readJson(req, moduleModelSchema);
  return NextResponse.json({ data: await createModule(member, input) }, { status: 201 });
});
