/**
 * Whether a typed or measured position can be a house: both numbers given, on Earth, and not
 * (0, 0) — the point a blank field or a failed lookup turns into, in the open sea off West
 * Africa ("Null Island"). Null when the position is usable, else the reason.
 */
export function sitePositionProblem(latitude: number, longitude: number): string | null {
  if (!Number.isFinite(latitude) || !Number.isFinite(longitude)) return "Give both latitude and longitude";
  if (latitude < -90 || latitude > 90) return `Latitude ${latitude} is not between −90 and 90`;
  if (longitude < -180 || longitude > 180) return `Longitude ${longitude} is not between −180 and 180`;
  if (Math.abs(latitude) < 0.01 && Math.abs(longitude) < 0.01) return "0, 0 is open sea off West Africa, not a house: set the site's real position";
  return null;
}
