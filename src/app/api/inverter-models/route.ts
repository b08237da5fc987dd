import { NextResponse } from "next/server";
import { inverterModelSchema } from "@/lib/schemas/catalog";
import { createInverter, listActiveInverters, listInverters } from "@/server/catalog";
import { readJson, withMember } from "@/server/route";

/** The company's inverters; `?active=1` lists only those a new design may use. */
export const GET = withMember("catalog:read", async ({ req, member }) => {
  const activeOnly = req.nextUrl.searchParams.get("active") === "1";
  const rows = activeOnly ? await listActiveInverters(member.companyId) : await listInverters(member.companyId);
  return NextResponse.json({ data: rows });
});

/** Adds an inverter (409 when the manufacturer and model are already in the catalog). */
export const POST = withMember("catalog:manage", async ({ req, member }) => {
  const input = await readJson(req, inverterModelSchema);
  return NextResponse.json({ data: await createInverter(member, input) }, { status: 201 });
});
