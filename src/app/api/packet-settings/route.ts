import { NextResponse } from "next/server";
import { packetSettingsSchema } from "@/lib/schemas/packet-settings";
import { readJson, withMember } from "@/server/route";
import { getPacketSettings, savePacketSettings } from "@/server/roof-survey";

/** The company's job-packet settings: fire-code edition and spares per kind. */
export const GET = withMember("catalog:read", async ({ member }) => NextResponse.json({ data: await getPacketSettings(member.companyId) }));

export const PUT = withMember("company:manage", async ({ req, member }) => NextResponse.json({ data: await savePacketSettings(member, await readJson(req, packetSettingsSchema)) }));
