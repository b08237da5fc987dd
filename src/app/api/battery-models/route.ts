import { NextResponse } from "next/server";
import { batteryModelSchema } from "@/lib/schemas/battery-catalog";
import { createBattery, listBatteries } from "@/server/battery-catalog";
import { readJson, withMember } from "@/server/route";

/** GET: the company's batteries; `?active=1` lists only what a new offer may use. */
export const GET = withMember("catalog:read", async ({ req, member }) =>
  NextResponse.json({ data: await listBatteries(member.companyId, { activeOnly: req.nextUrl.searchParams.get("active") === "1" }) }),
);

/** POST: adds one (409 when the manufacturer and model are already in the catalog). */
export const POST = withMember("catalog:manage", async ({ req, member }) => NextResponse.json({ data: await createBattery(member, await readJson(req, batteryModelSchema)) }, { status: 201 }));
