import { NextResponse } from "next/server";
import { bosPartSchema } from "@/lib/schemas/bos";
import { createBosPart } from "@/server/bos-catalog";
import { listEquipment } from "@/server/catalog-routes";
import { readJson, withMember } from "@/server/route";

/** GET: the company's balance-of-system parts; `?active=1` only what a bill of materials may use. */
export const GET = listEquipment("bos-parts");

/** POST: adds one part (409 when the manufacturer and model are already in the catalog). */
export const POST = withMember("catalog:manage", async ({ req, member }) => NextResponse.json({ data: await createBosPart(member, await readJson(req, bosPartSchema)) }, { status: 201 }));
