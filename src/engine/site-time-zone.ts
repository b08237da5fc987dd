import tzLookup from "@photostructure/tz-lookup";
import { EngineInputError } from "./errors";

/**
 * The IANA time zone of a place, from its coordinates, offline (the time-zone boundary data
 * bundled with @photostructure/tz-lookup, built from the timezone-boundary-builder shapes).
 * Used where a person's clock matters: time-of-use hours, interval data without an offset.
 */
export function siteTimeZone(latitude: number, longitude: number): string {
  if (!(Number.isFinite(latitude) && latitude >= -90 && latitude <= 90 && Number.isFinite(longitude) && longitude >= -180 && longitude <= 180)) {
    throw new EngineInputError([{ path: "site", message: `(${latitude}, ${longitude}) is not a place on Earth` }], "time zone");
  }
  return tzLookup(latitude, longitude);
}
