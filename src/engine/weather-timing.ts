/**
 * Is a weather file's time where its stated UTC offset puts it? Two checks before the data are
 * trusted, because an offset off by hours silently moves every hour of sun:
 *
 * 1. The offset's sign must fit the longitude. Local standard time is about longitude ÷ 15 h
 *    from UTC (west of Greenwich behind, east ahead); political zones stray from that by up
 *    to about 3 h (e.g. far-western China on UTC+8). An offset more than
 *    MAX_OFFSET_FROM_LONGITUDE_H away (the date line folded in) contradicts the longitude.
 * 2. The data must sit where the sun is. Over a day, global horizontal irradiance is centred on
 *    solar noon; the irradiance-weighted mean time of each day's hours (each hour's mean at its
 *    middle), less that day's solar noon in local standard time, averaged over the year
 *    (weighted by each day's irradiation), is how far the data sit from where the offset puts
 *    them. Clouds scatter single days both ways; a year averages them out. Solar noon uses the
 *    equation of time of Spencer (1971), "Fourier series representation of the position of the
 *    sun", Search 2(5), as given in Iqbal (1983) eq. 1.4.1 (accurate to about 0.5 min, ample here).
 *    A shift of SHIFT_WARNING_H or more is reported: e.g. hour-ending data read as hour-starting
 *    sit 1 h late, data in UTC with a local offset sit the offset away.
 */
import { HOURS_PER_YEAR } from "./year-calendar";

/** A stated offset this far from longitude ÷ 15 (hours) is refused (our choice, above the ≈3 h real zones reach). */
export const MAX_OFFSET_FROM_LONGITUDE_H = 3.5;
/** Data this far from solar noon (hours, yearly mean) are reported (our choice: half an hour is half a row). */
export const SHIFT_WARNING_H = 0.5;

/** Hours by which the offset differs from longitude ÷ 15, folded to (−12, 12] across the date line. */
export function offsetMismatchHours(longitudeDeg: number, utcOffsetHours: number): number {
  let diff = utcOffsetHours - longitudeDeg / 15;
  while (diff > 12) diff -= 24;
  while (diff <= -12) diff += 24;
  return diff;
}

/** Null when the offset fits the longitude, else the reason it does not. */
export function offsetContradiction(longitudeDeg: number, utcOffsetHours: number): string | null {
  const diff = offsetMismatchHours(longitudeDeg, utcOffsetHours);
  if (Math.abs(diff) <= MAX_OFFSET_FROM_LONGITUDE_H) return null;
  const expected = Math.round(longitudeDeg / 15);
  const side = longitudeDeg < 0 ? "west of Greenwich, where clocks are behind UTC" : "east of Greenwich, where clocks are ahead of UTC";
  return `a UTC offset of ${signed(utcOffsetHours)} h does not fit longitude ${longitudeDeg}° (${side}; expected about ${signed(expected)} h)`;
}

/** Equation of time, minutes, for day-of-year index d (0 = 1 January): Spencer (1971). */
export function equationOfTimeMinutes(dayIndex: number): number {
  const b = (2 * Math.PI * dayIndex) / 365;
  return 229.18 * (0.000075 + 0.001868 * Math.cos(b) - 0.032077 * Math.sin(b) - 0.014615 * Math.cos(2 * b) - 0.040849 * Math.sin(2 * b));
}

/**
 * How far (hours, + = later) the irradiance sits from solar noon as the offset places it: the
 * irradiation-weighted yearly mean of each day's irradiance centroid − solar noon (LST).
 * Null when the file has too little sun to tell.
 */
export function sunTimingShiftHours(ghi: ArrayLike<number>, longitudeDeg: number, utcOffsetHours: number): number | null {
  if (ghi.length !== HOURS_PER_YEAR) return null;
  let weighted = 0;
  let total = 0;
  for (let d = 0; d < 365; d++) {
    let sum = 0;
    let moment = 0;
    for (let k = 0; k < 24; k++) {
      const g = Math.max(0, ghi[d * 24 + k]);
      sum += g;
      moment += g * (k + 0.5);
    }
    if (sum <= 0) continue;
    // Solar noon in local standard time: 12 h − EoT − (longitude − 15° × offset) / 15°.
    const solarNoon = 12 - equationOfTimeMinutes(d) / 60 - (longitudeDeg - 15 * utcOffsetHours) / 15;
    let shift = moment / sum - solarNoon;
    // A day split across midnight (polar summer, or an offset far off) folds back into ±12 h.
    if (shift > 12) shift -= 24;
    if (shift < -12) shift += 24;
    weighted += shift * sum;
    total += sum;
  }
  return total > 0 ? weighted / total : null;
}

/** The warning a person reads when the data sit SHIFT_WARNING_H or more from the sun, else null. */
export function sunTimingWarning(shiftHours: number | null, utcOffsetHours: number): string | null {
  if (shiftHours === null || Math.abs(shiftHours) < SHIFT_WARNING_H) return null;
  const how = shiftHours > 0 ? "later" : "earlier";
  return (
    `The sunshine in this file sits ${Math.abs(shiftHours).toFixed(1)} h ${how} than the sun does at UTC offset ${signed(utcOffsetHours)} h: ` +
    "the file's time stamps may be in another zone (e.g. UTC), or mark the hour's end rather than its start. Check the offset and the time convention before estimating production."
  );
}

function signed(x: number): string {
  return `${x > 0 ? "+" : x < 0 ? "−" : "±"}${Math.abs(x)}`;
}
