import zipcodes from "zipcodes";
import { haversineKm } from "./geo";
import { sitePositionProblem } from "./site-position";

// Server side only in practice: the ZIP list is several megabytes (the form asks GET /api/zip-codes/<zip>).

export type ZipPlace = { zip: string; city: string; region: string; latitude: number; longitude: number };

/**
 * A US ZIP code's place and position, offline, from the `zipcodes` package (its data is the
 * federal ZIP code database it names; the position is the ZIP's centre or its post office, a
 * first guess for a house a few kilometres away at most in towns). Null for a code it does not
 * list or lists without a position.
 */
export function zipPlace(zip: string): ZipPlace | null {
  const five = /^([0-9]{5})(-[0-9]{4})?$/.exec(zip.trim())?.[1];
  if (!five) return null;
  const found = zipcodes.lookup(five);
  if (!found || found.country !== "US" || sitePositionProblem(found.latitude, found.longitude)) return null;
  return { zip: five, city: found.city, region: found.state, latitude: found.latitude, longitude: found.longitude };
}

/**
 * How far a house may lie from its ZIP code's listed position before we ask whether the
 * coordinates (or the ZIP) are wrong. Our choice: 100 km holds the largest rural ZIP areas of
 * the lower 48 states, and still catches the usual slips (a sign dropped, latitude and
 * longitude swapped, a digit missing), which land hundreds or thousands of kilometres away.
 */
const MAX_ZIP_DISTANCE_KM = 100;

/** The ZIP's place when the position lies too far from it (see MAX_ZIP_DISTANCE_KM); null when they agree or the ZIP is not listed. */
export function zipMismatch(zip: string, latitude: number, longitude: number): (ZipPlace & { distanceKm: number }) | null {
  const place = zipPlace(zip);
  if (!place) return null;
  const distanceKm = haversineKm(place, { latitude, longitude });
  return distanceKm > MAX_ZIP_DISTANCE_KM ? { ...place, distanceKm } : null;
}
