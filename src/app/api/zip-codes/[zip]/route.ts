import { NextResponse } from "next/server";
import { zipPlace } from "@/engine/zip-codes";
import { HttpError } from "@/server/errors";
import { withMember } from "@/server/route";

/** A US ZIP code's place and first position, from the offline list (src/engine/zip-codes.ts). */
export const GET = withMember<{ zip: string }>("deals:write", async ({ params }) => {
  const zip = params.zip ?? "";
  if (!/^[0-9]{5}$/.test(zip)) throw new HttpError(422, "validation_failed", "zip: Enter a 5-digit ZIP code", { postalCode: ["Enter a 5-digit ZIP code"] });
  const place = zipPlace(zip);
  if (!place) throw new HttpError(404, "not_found", `ZIP ${zip} has no position in the offline list: use the tablet's location or type the coordinates.`);
  return NextResponse.json({ data: place });
});
