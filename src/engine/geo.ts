/** IUGG mean Earth radius, km (Moritz 2000, "Geodetic Reference System 1980", R₁). */
export const EARTH_MEAN_RADIUS_KM = 6371.0088;

const toRad = (deg: number) => (deg * Math.PI) / 180;

/**
 * Great-circle distance on a sphere by the haversine formula (Sinnott 1984, "Virtues of the
 * Haversine", Sky & Telescope 68(2):159):
 *   a = sin²(Δφ/2) + cos φ₁ · cos φ₂ · sin²(Δλ/2),   d = 2R · asin(√a).
 * On the ellipsoid the true distance differs by up to about 0.5 %, far below what matters here.
 */
export function haversineKm(a: { latitude: number; longitude: number }, b: { latitude: number; longitude: number }): number {
  const dPhi = toRad(b.latitude - a.latitude);
  const dLambda = toRad(b.longitude - a.longitude);
  const h = Math.sin(dPhi / 2) ** 2 + Math.cos(toRad(a.latitude)) * Math.cos(toRad(b.latitude)) * Math.sin(dLambda / 2) ** 2;
  return 2 * EARTH_MEAN_RADIUS_KM * Math.asin(Math.min(1, Math.sqrt(h)));
}
