import { NextResponse } from "next/server";
import { checkHealth } from "@/server/health";

export const dynamic = "force-dynamic";

/** For load balancers and people: 200 when the database answers and is migrated, else 503. */
export async function GET() {
  const health = await checkHealth();
  return NextResponse.json(health, { status: health.status === "ok" ? 200 : 503, headers: { "Cache-Control": "no-store" } });
}
