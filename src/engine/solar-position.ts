/**
 * Sun position by the NREL Solar Position Algorithm (SPA):
 * Reda, I. & Andreas, A. (2004), "Solar position algorithm for solar radiation applications",
 * Solar Energy 76(5), 577–589 (NREL/TP-560-34302). Equation numbers below refer to that paper.
 *
 * Two entry points:
 *  - `solarPosition(date, site)`: the full algorithm for one instant (every periodic term).
 *  - `sunPositionsForYear(weather)`: 8760 positions at the middles of a weather year's hours.
 *    The slow part of SPA (heliocentric terms, nutation, obliquity, aberration: eqs 9–30) depends
 *    only on time, not on the site, and moves smoothly; it is evaluated in full every 3 days (UT
 *    midnights) and interpolated (4-point Lagrange) to each hour. The fast, site-dependent part
 *    (sidereal time, hour angle, parallax, refraction: eqs 12–16, 31–47) is evaluated exactly for
 *    each hour. The interpolation error is below 1e-4° (checked in solar-position.test.ts).
 *    Speed without approximation beyond that: the nodes' periodic terms are advanced from node to
 *    node by rotation (angle-addition identities) rather than a cosine each, the nutation terms
 *    are built from multiple angles of their five arguments, and within each day the hour angle's
 *    cosine and sine are carried along its (nearly linear) course by rotation.
 *
 * Angles in degrees; azimuth measured eastward from north (SPA's Φ, eq 46).
 */
import { z } from "zod";
import { EngineInputError, parseOrThrow } from "./errors";
import { HOURS_PER_YEAR } from "./year-calendar";

// ---- SPA Table A4.2 (Earth periodic terms: amplitude, phase, frequency), as printed in Reda &
// Andreas 2004 and transcribed in pvlib-python `pvlib/spa.py` (TABLE_1_DICT). ----
const L0 = [
  [175347046, 0, 0], [3341656, 4.6692568, 6283.07585], [34894, 4.6261, 12566.1517], [3497, 2.7441, 5753.3849],
  [3418, 2.8289, 3.5231], [3136, 3.6277, 77713.7715], [2676, 4.4181, 7860.4194], [2343, 6.1352, 3930.2097],
  [1324, 0.7425, 11506.7698], [1273, 2.0371, 529.691], [1199, 1.1096, 1577.3435], [990, 5.233, 5884.927],
  [902, 2.045, 26.298], [857, 3.508, 398.149], [780, 1.179, 5223.694], [753, 2.533, 5507.553],
  [505, 4.583, 18849.228], [492, 4.205, 775.523], [357, 2.92, 0.067], [317, 5.849, 11790.629],
  [284, 1.899, 796.298], [271, 0.315, 10977.079], [243, 0.345, 5486.778], [206, 4.806, 2544.314],
  [205, 1.869, 5573.143], [202, 2.458, 6069.777], [156, 0.833, 213.299], [132, 3.411, 2942.463],
  [126, 1.083, 20.775], [115, 0.645, 0.98], [103, 0.636, 4694.003], [102, 0.976, 15720.839],
  [102, 4.267, 7.114], [99, 6.21, 2146.17], [98, 0.68, 155.42], [86, 5.98, 161000.69],
  [85, 1.3, 6275.96], [85, 3.67, 71430.7], [80, 1.81, 17260.15], [79, 3.04, 12036.46],
  [75, 1.76, 5088.63], [74, 3.5, 3154.69], [74, 4.68, 801.82], [70, 0.83, 9437.76],
  [62, 3.98, 8827.39], [61, 1.82, 7084.9], [57, 2.78, 6286.6], [56, 4.39, 14143.5],
  [56, 3.47, 6279.55], [52, 0.19, 12139.55], [52, 1.33, 1748.02], [51, 0.28, 5856.48],
  [49, 0.49, 1194.45], [41, 5.37, 8429.24], [41, 2.4, 19651.05], [39, 6.17, 10447.39],
  [37, 6.04, 10213.29], [37, 2.57, 1059.38], [36, 1.71, 2352.87], [36, 1.78, 6812.77],
  [33, 0.59, 17789.85], [30, 0.44, 83996.85], [30, 2.74, 1349.87], [25, 3.16, 4690.48],
];
const L1 = [
  [628331966747, 0, 0], [206059, 2.678235, 6283.07585], [4303, 2.6351, 12566.1517], [425, 1.59, 3.523],
  [119, 5.796, 26.298], [109, 2.966, 1577.344], [93, 2.59, 18849.23], [72, 1.14, 529.69], [68, 1.87, 398.15],
  [67, 4.41, 5507.55], [59, 2.89, 5223.69], [56, 2.17, 155.42], [45, 0.4, 796.3], [36, 0.47, 775.52],
  [29, 2.65, 7.11], [21, 5.34, 0.98], [19, 1.85, 5486.78], [19, 4.97, 213.3], [17, 2.99, 6275.96],
  [16, 0.03, 2544.31], [16, 1.43, 2146.17], [15, 1.21, 10977.08], [12, 2.83, 1748.02], [12, 3.26, 5088.63],
  [12, 5.27, 1194.45], [12, 2.08, 4694], [11, 0.77, 553.57], [10, 1.3, 6286.6], [10, 4.24, 1349.87],
  [9, 2.7, 242.73], [9, 5.64, 951.72], [8, 5.3, 2352.87], [6, 2.65, 9437.76], [6, 4.67, 4690.48],
];
const L2 = [
  [52919, 0, 0], [8720, 1.0721, 6283.0758], [309, 0.867, 12566.152], [27, 0.05, 3.52], [16, 5.19, 26.3],
  [16, 3.68, 155.42], [10, 0.76, 18849.23], [9, 2.06, 77713.77], [7, 0.83, 775.52], [5, 4.66, 1577.34],
  [4, 1.03, 7.11], [4, 3.44, 5573.14], [3, 5.14, 796.3], [3, 6.05, 5507.55], [3, 1.19, 242.73],
  [3, 6.12, 529.69], [3, 0.31, 398.15], [3, 2.28, 553.57], [2, 4.38, 5223.69], [2, 3.75, 0.98],
];
const L3 = [[289, 5.844, 6283.076], [35, 0, 0], [17, 5.49, 12566.15], [3, 5.2, 155.42], [1, 4.72, 3.52], [1, 5.3, 18849.23], [1, 5.97, 242.73]];
const L4 = [[114, 3.142, 0], [8, 4.13, 6283.08], [1, 3.84, 12566.15]];
const L5 = [[1, 3.14, 0]];
const B0 = [[280, 3.199, 84334.662], [102, 5.422, 5507.553], [80, 3.88, 5223.69], [44, 3.7, 2352.87], [32, 4, 1577.34]];
const B1 = [[9, 3.9, 5507.55], [6, 1.73, 5223.69]];
const R0 = [
  [100013989, 0, 0], [1670700, 3.0984635, 6283.07585], [13956, 3.05525, 12566.1517], [3084, 5.1985, 77713.7715],
  [1628, 1.1739, 5753.3849], [1576, 2.8469, 7860.4194], [925, 5.453, 11506.77], [542, 4.564, 3930.21],
  [472, 3.661, 5884.927], [346, 0.964, 5507.553], [329, 5.9, 5223.694], [307, 0.299, 5573.143],
  [243, 4.273, 11790.629], [212, 5.847, 1577.344], [186, 5.022, 10977.079], [175, 3.012, 18849.228],
  [110, 5.055, 5486.778], [98, 0.89, 6069.78], [86, 5.69, 15720.84], [86, 1.27, 161000.69],
  [65, 0.27, 17260.15], [63, 0.92, 529.69], [57, 2.01, 83996.85], [56, 5.24, 71430.7], [49, 3.25, 2544.31],
  [47, 2.58, 775.52], [45, 5.54, 9437.76], [43, 6.01, 6275.96], [39, 5.36, 4694], [38, 2.39, 8827.39],
  [37, 0.83, 19651.05], [37, 4.9, 12139.55], [36, 1.67, 12036.46], [35, 1.84, 2942.46], [33, 0.24, 7084.9],
  [32, 0.18, 5088.63], [32, 1.78, 398.15], [28, 1.21, 6286.6], [28, 1.9, 6279.55], [26, 4.59, 10447.39],
];
const R1 = [
  [103019, 1.10749, 6283.07585], [1721, 1.0644, 12566.1517], [702, 3.142, 0], [32, 1.02, 18849.23],
  [31, 2.84, 5507.55], [25, 1.32, 5223.69], [18, 1.42, 1577.34], [10, 5.91, 10977.08], [9, 1.42, 6275.96],
  [9, 0.27, 5486.78],
];
const R2 = [[4359, 5.7846, 6283.0758], [124, 5.579, 12566.152], [12, 3.14, 0], [9, 3.63, 77713.77], [6, 1.87, 5573.14], [3, 5.47, 18849.23]];
const R3 = [[145, 4.273, 6283.076], [7, 3.92, 12566.15]];
const R4 = [[4, 2.56, 6283.08]];

// ---- SPA Table A4.3 (nutation in longitude and obliquity): Y-term multipliers of X0..X4 and
// coefficients a, b, c, d (units 0.0001″). Same source as above (`NUTATION_YTERM_ARRAY`,
// `NUTATION_ABCD_ARRAY`). ----
const NUT_Y = [
  [0, 0, 0, 0, 1], [-2, 0, 0, 2, 2], [0, 0, 0, 2, 2], [0, 0, 0, 0, 2], [0, 1, 0, 0, 0], [0, 0, 1, 0, 0],
  [-2, 1, 0, 2, 2], [0, 0, 0, 2, 1], [0, 0, 1, 2, 2], [-2, -1, 0, 2, 2], [-2, 0, 1, 0, 0], [-2, 0, 0, 2, 1],
  [0, 0, -1, 2, 2], [2, 0, 0, 0, 0], [0, 0, 1, 0, 1], [2, 0, -1, 2, 2], [0, 0, -1, 0, 1], [0, 0, 1, 2, 1],
  [-2, 0, 2, 0, 0], [0, 0, -2, 2, 1], [2, 0, 0, 2, 2], [0, 0, 2, 2, 2], [0, 0, 2, 0, 0], [-2, 0, 1, 2, 2],
  [0, 0, 0, 2, 0], [-2, 0, 0, 2, 0], [0, 0, -1, 2, 1], [0, 2, 0, 0, 0], [2, 0, -1, 0, 1], [-2, 2, 0, 2, 2],
  [0, 1, 0, 0, 1], [-2, 0, 1, 0, 1], [0, -1, 0, 0, 1], [0, 0, 2, -2, 0], [2, 0, -1, 2, 1], [2, 0, 1, 2, 2],
  [0, 1, 0, 2, 2], [-2, 1, 1, 0, 0], [0, -1, 0, 2, 2], [2, 0, 0, 2, 1], [2, 0, 1, 0, 0], [-2, 0, 2, 2, 2],
  [-2, 0, 1, 2, 1], [2, 0, -2, 0, 1], [2, 0, 0, 0, 1], [0, -1, 1, 0, 0], [-2, -1, 0, 2, 1], [-2, 0, 0, 0, 1],
  [0, 0, 2, 2, 1], [-2, 0, 2, 0, 1], [-2, 1, 0, 2, 1], [0, 0, 1, -2, 0], [-1, 0, 1, 0, 0], [-2, 1, 0, 0, 0],
  [1, 0, 0, 0, 0], [0, 0, 1, 2, 0], [0, 0, -2, 2, 2], [-1, -1, 1, 0, 0], [0, 1, 1, 0, 0], [0, -1, 1, 2, 2],
  [2, -1, -1, 2, 2], [0, 0, 3, 2, 2], [2, -1, 0, 2, 2],
];
const NUT_ABCD = [
  [-171996, -174.2, 92025, 8.9], [-13187, -1.6, 5736, -3.1], [-2274, -0.2, 977, -0.5], [2062, 0.2, -895, 0.5],
  [1426, -3.4, 54, -0.1], [712, 0.1, -7, 0], [-517, 1.2, 224, -0.6], [-386, -0.4, 200, 0], [-301, 0, 129, -0.1],
  [217, -0.5, -95, 0.3], [-158, 0, 0, 0], [129, 0.1, -70, 0], [123, 0, -53, 0], [63, 0, 0, 0], [63, 0.1, -33, 0],
  [-59, 0, 26, 0], [-58, -0.1, 32, 0], [-51, 0, 27, 0], [48, 0, 0, 0], [46, 0, -24, 0], [-38, 0, 16, 0],
  [-31, 0, 13, 0], [29, 0, 0, 0], [29, 0, -12, 0], [26, 0, 0, 0], [-22, 0, 0, 0], [21, 0, -10, 0],
  [17, -0.1, 0, 0], [16, 0, -8, 0], [-16, 0.1, 7, 0], [-15, 0, 9, 0], [-13, 0, 7, 0], [-12, 0, 6, 0],
  [11, 0, 0, 0], [-10, 0, 5, 0], [-8, 0, 3, 0], [7, 0, -3, 0], [-7, 0, 0, 0], [-7, 0, 3, 0], [-7, 0, 3, 0],
  [6, 0, 0, 0], [6, 0, -3, 0], [6, 0, -3, 0], [-6, 0, 3, 0], [-6, 0, 3, 0], [5, 0, 0, 0], [-5, 0, 3, 0],
  [-5, 0, 3, 0], [-5, 0, 3, 0], [4, 0, 0, 0], [4, 0, 0, 0], [4, 0, 0, 0], [-4, 0, 0, 0], [-4, 0, 0, 0],
  [-4, 0, 0, 0], [3, 0, 0, 0], [-3, 0, 0, 0], [-3, 0, 0, 0], [-3, 0, 0, 0], [-3, 0, 0, 0], [-3, 0, 0, 0],
  [-3, 0, 0, 0], [-3, 0, 0, 0],
];

/** Flatten a term table to one Float64Array [A, B, C, A, B, C, ...] for a tight loop. */
function flat(rows: number[][]): Float64Array {
  return Float64Array.from(rows.flat());
}
const L_TABLES = [L0, L1, L2, L3, L4, L5].map(flat);
const B_TABLES = [B0, B1].map(flat);
const R_TABLES = [R0, R1, R2, R3, R4].map(flat);
const NUT_Y_FLAT = flat(NUT_Y);
const NUT_ABCD_FLAT = flat(NUT_ABCD);

const D2R = Math.PI / 180;
const R2D = 180 / Math.PI;

/** Eq 9–11: Σ A·cos(B + C·JME) for each series, combined as a polynomial in JME, ×1e-8. */
function earthSeries(tables: Float64Array[], jme: number): number {
  let result = 0;
  let power = 1;
  for (const table of tables) {
    let sum = 0;
    for (let k = 0; k < table.length; k += 3) sum += table[k] * Math.cos(table[k + 1] + table[k + 2] * jme);
    result += sum * power;
    power *= jme;
  }
  return result / 1e8;
}

function mod360(x: number): number {
  const r = x % 360;
  return r < 0 ? r + 360 : r;
}

/** Julian Day (UT) from milliseconds since the Unix epoch (Reda & Andreas 2004, eq 4, via the Unix epoch JD 2440587.5). */
export function julianDayFromUnixMs(ms: number): number {
  return ms / 86_400_000 + 2440587.5;
}

/** The time-only (site-independent) part of SPA: apparent geocentric sun (eqs 5–30). */
type Geocentric = {
  alphaDeg: number; // geocentric right ascension, eq 28
  sinDelta: number; // sine and cosine of the geocentric declination δ, eq 29
  cosDelta: number;
  nutationRaCorrDeg: number; // Δψ·cos ε, the nutation term of apparent sidereal time, eq 15
  radiusAu: number; // Earth–Sun distance R, eq 11
};

function geocentric(jd: number, deltaTSeconds: number): Geocentric {
  const jde = jd + deltaTSeconds / 86400; // eq 5
  const jce = (jde - 2451545) / 36525; // eq 6
  const jme = jce / 10; // eq 7
  const x = nutationArguments(jce);
  let dPsi = 0;
  let dEps = 0;
  for (let i = 0; i < 63; i++) {
    const y = i * 5;
    const arg = (x[0] * NUT_Y_FLAT[y] + x[1] * NUT_Y_FLAT[y + 1] + x[2] * NUT_Y_FLAT[y + 2] + x[3] * NUT_Y_FLAT[y + 3] + x[4] * NUT_Y_FLAT[y + 4]) * D2R;
    const c = i * 4;
    dPsi += (NUT_ABCD_FLAT[c] + NUT_ABCD_FLAT[c + 1] * jce) * Math.sin(arg);
    dEps += (NUT_ABCD_FLAT[c + 2] + NUT_ABCD_FLAT[c + 3] * jce) * Math.cos(arg);
  }
  // eq 9–11: L, B, R
  return finishGeocentric(jce, jme, earthSeries(L_TABLES, jme), earthSeries(B_TABLES, jme), earthSeries(R_TABLES, jme), dPsi, dEps);
}

/** Nutation arguments X0…X4 of eqs 15–19 (mean elongation of the Moon, anomalies of Sun and Moon, Moon's argument of latitude, ascending node), degrees. */
const nutX = new Float64Array(5);
function nutationArguments(jce: number): Float64Array {
  const jce2 = jce * jce;
  const jce3 = jce2 * jce;
  nutX[0] = 297.85036 + 445267.11148 * jce - 0.0019142 * jce2 + jce3 / 189474;
  nutX[1] = 357.52772 + 35999.05034 * jce - 0.0001603 * jce2 - jce3 / 300000;
  nutX[2] = 134.96298 + 477198.867398 * jce + 0.0086972 * jce2 + jce3 / 56250;
  nutX[3] = 93.27191 + 483202.017538 * jce - 0.0036825 * jce2 + jce3 / 327270;
  nutX[4] = 125.04452 - 1934.136261 * jce + 0.0020708 * jce2 + jce3 / 450000;
  return nutX;
}

/**
 * Eqs 13–30 from the Earth series (L, B in radians; R in AU) and the nutation sums
 * Σ(a + b·JCE)·sin(arg), Σ(c + d·JCE)·cos(arg) in units of 0.0001″.
 */
function finishGeocentric(jce: number, jme: number, lRad: number, bRad: number, r: number, dPsiSum: number, dEpsSum: number): Geocentric {
  const lDeg = mod360(lRad * R2D); // eq 9–10
  const bDeg = bRad * R2D; // eq 11 (latitude)
  const thetaDeg = mod360(lDeg + 180); // geocentric longitude, eq 13
  const betaDeg = -bDeg; // geocentric latitude, eq 14
  const dPsi = dPsiSum / 36_000_000; // eq 22, degrees
  const dEps = dEpsSum / 36_000_000; // eq 23, degrees

  // True obliquity of the ecliptic (eqs 24–25)
  const u = jme / 10;
  const eps0 =
    84381.448 +
    u * (-4680.93 + u * (-1.55 + u * (1999.25 + u * (-51.38 + u * (-249.67 + u * (-39.05 + u * (7.12 + u * (27.87 + u * (5.79 + u * 2.45)))))))));
  const epsDeg = eps0 / 3600 + dEps;

  const dTau = -20.4898 / (3600 * r); // aberration, eq 26
  const lambdaDeg = thetaDeg + dPsi + dTau; // apparent sun longitude, eq 27

  const lambda = lambdaDeg * D2R;
  const eps = epsDeg * D2R;
  const beta = betaDeg * D2R;
  const alphaDeg = mod360(Math.atan2(Math.sin(lambda) * Math.cos(eps) - Math.tan(beta) * Math.sin(eps), Math.cos(lambda)) * R2D); // eq 28
  const sinDelta = Math.sin(beta) * Math.cos(eps) + Math.cos(beta) * Math.sin(eps) * Math.sin(lambda); // eq 29

  return { alphaDeg, sinDelta, cosDelta: Math.sqrt(1 - sinDelta * sinDelta), nutationRaCorrDeg: dPsi * Math.cos(eps), radiusAu: r };
}

/**
 * eqs 9–11 at the equally spaced instants JME = jme0 + k·h (k = 0…count−1), into `out`. Each
 * term's cos(B + C·JME) advances by a fixed angle C·h from one instant to the next, so it is
 * carried forward by rotation — cos(x + d) = cos x·cos d − sin x·sin d, sin(x + d) = sin x·cos d +
 * cos x·sin d (angle-addition identities) — instead of a cosine per term and instant. Rounding
 * grows by about one unit in the last place per step: below 1e-13 of each term over a year.
 */
function earthSeriesAtSteps(tables: Float64Array[], jme0: number, h: number, count: number, out: Float64Array, sum: Float64Array): void {
  out.fill(0);
  for (let t = 0; t < tables.length; t++) {
    const table = tables[t];
    sum.fill(0);
    for (let k = 0; k < table.length; k += 3) {
      const a = table[k];
      const c = table[k + 2];
      if (c === 0) {
        const v = a * Math.cos(table[k + 1]);
        for (let n = 0; n < count; n++) sum[n] += v;
        continue;
      }
      const x0 = table[k + 1] + c * jme0;
      let co = Math.cos(x0);
      let si = Math.sin(x0);
      const cd = Math.cos(c * h);
      const sd = Math.sin(c * h);
      for (let n = 0; n < count; n++) {
        sum[n] += a * co;
        const co2 = co * cd - si * sd;
        si = si * cd + co * sd;
        co = co2;
      }
    }
    // Σ_t sum_t·JME^t (eq 10), as earthSeries does
    for (let n = 0; n < count; n++) {
      const jme = jme0 + n * h;
      let p = 1;
      for (let e = 0; e < t; e++) p *= jme;
      out[n] += sum[n] * p;
    }
  }
  for (let n = 0; n < count; n++) out[n] /= 1e8;
}

/**
 * The nutation sums of eqs 20–21 without a sine and cosine per term: each argument is an integer
 * combination Σ Y_j·X_j with |Y_j| ≤ 3, so its cosine and sine are products of cos/sin(m·X_j),
 * m = −2…3, built from cos/sin X_j by the double-angle and angle-addition identities.
 */
const NUT_MULT = new Float64Array(2 * 5 * 6); // [cos, sin] of m·X_j at ((j·6) + m + 2)·2
function nutationSums(jce: number, out: { dPsi: number; dEps: number }): void {
  const x = nutationArguments(jce);
  const t = NUT_MULT;
  for (let j = 0; j < 5; j++) {
    const a = x[j] * D2R;
    const c1 = Math.cos(a);
    const s1 = Math.sin(a);
    const c2 = c1 * c1 - s1 * s1;
    const s2 = 2 * s1 * c1;
    const b = j * 12;
    t[b] = c2; // m = −2
    t[b + 1] = -s2;
    t[b + 2] = c1; // m = −1
    t[b + 3] = -s1;
    t[b + 4] = 1; // m = 0
    t[b + 5] = 0;
    t[b + 6] = c1; // m = 1
    t[b + 7] = s1;
    t[b + 8] = c2; // m = 2
    t[b + 9] = s2;
    t[b + 10] = c2 * c1 - s2 * s1; // m = 3
    t[b + 11] = s2 * c1 + c2 * s1;
  }
  let dPsi = 0;
  let dEps = 0;
  for (let i = 0; i < 63; i++) {
    const y = i * 5;
    let co = 1;
    let si = 0;
    for (let j = 0; j < 5; j++) {
      const m = NUT_Y_FLAT[y + j];
      if (m === 0) continue;
      const q = j * 12 + (m + 2) * 2;
      const cm = t[q];
      const sm = t[q + 1];
      const co2 = co * cm - si * sm;
      si = si * cm + co * sm;
      co = co2;
    }
    const c = i * 4;
    dPsi += (NUT_ABCD_FLAT[c] + NUT_ABCD_FLAT[c + 1] * jce) * si;
    dEps += (NUT_ABCD_FLAT[c + 2] + NUT_ABCD_FLAT[c + 3] * jce) * co;
  }
  out.dPsi = dPsi;
  out.dEps = dEps;
}

/** Mean sidereal time at Greenwich, eq 12 (degrees, unreduced). */
function meanSiderealDeg(jd: number): number {
  const jc = (jd - 2451545) / 36525;
  return 280.46061837 + 360.98564736629 * (jd - 2451545) + jc * jc * (0.000387933 - jc / 38710000);
}

/** Site constants reused for every instant (eqs 33–37 parts that depend only on the site). */
type SiteTerms = {
  lonDeg: number;
  sinLat: number;
  cosLat: number;
  x: number; // eq 36
  y: number; // eq 37
  refractionFactor: number; // (P/1010)·(283/(273+T)), eq 42
  refraction: boolean;
  minElevationForRefractionDeg: number;
};

/** Apparent sun radius (0.26667°) and standard atmospheric refraction at sunrise/sunset (0.5667°), per SPA. */
const SUN_RADIUS_DEG = 0.26667;
const ATMOS_REFRACT_DEG = 0.5667;

function siteTerms(site: Required<SiteOptions>): SiteTerms {
  const lat = site.latitude * D2R;
  const u = Math.atan(0.99664719 * Math.tan(lat)); // eq 35
  const h = site.elevationM / 6378140;
  return {
    lonDeg: site.longitude,
    sinLat: Math.sin(lat),
    cosLat: Math.cos(lat),
    x: Math.cos(u) + h * Math.cos(lat),
    y: 0.99664719 * Math.sin(u) + h * Math.sin(lat),
    refractionFactor: (site.pressureMbar / 1010) * (283 / (273 + site.temperatureC)),
    refraction: site.refraction,
    minElevationForRefractionDeg: -(SUN_RADIUS_DEG + ATMOS_REFRACT_DEG),
  };
}

export type SunAngles = {
  /** Topocentric zenith angle, with refraction when requested (SPA θ, eq 44). */
  zenithDeg: number;
  /** Topocentric zenith angle without refraction (airless, 90 − e0). */
  airlessZenithDeg: number;
  /** Topocentric azimuth, eastward from north (SPA Φ, eq 46). */
  azimuthDeg: number;
  /** 90 − zenithDeg. */
  elevationDeg: number;
  /** Earth–Sun distance in astronomical units (SPA R). */
  earthSunDistanceAu: number;
  /** The apparent sun's unit vector (up, north, east parts): cos z, sin z·cos Φ, sin z·sin Φ. */
  cosZenith: number;
  sinZenithCosAz: number;
  sinZenithSinAz: number;
};

/** Site-dependent part of SPA: hour angle, parallax, elevation, refraction, azimuth (eqs 31–46). */
function topocentric(g: Geocentric, nuDeg: number, s: SiteTerms, out: SunAngles): void {
  const H = (nuDeg + s.lonDeg - g.alphaDeg) * D2R; // local hour angle, eq 32 (periodic, no reduction needed)
  topocentricFromHourAngle(Math.cos(H), Math.sin(H), g.sinDelta, g.cosDelta, g.radiusAu, s, out);
}

/** eqs 33–46 from the cosine and sine of the local hour angle H and the geocentric δ and R. */
function topocentricFromHourAngle(cosH: number, sinH: number, sinDelta: number, cosDelta: number, radiusAu: number, s: SiteTerms, out: SunAngles): void {
  // Equatorial horizontal parallax, eq 33. ξ < 2.5e-6 rad, so sin ξ = ξ to double precision.
  const sinXi = (8.794 / (3600 * radiusAu)) * D2R;
  const den = cosDelta - s.x * sinXi * cosH;
  // Δα, eq 38, is below 3e-6 rad: atan, sin and cos of it by their series (exact at double precision).
  const t = (-s.x * sinXi * sinH) / den;
  const dAlpha = t - (t * t * t) / 3;
  const cosDA = 1 - (dAlpha * dAlpha) / 2;
  const sinDA = dAlpha;
  // δ' = atan2(num, den), eq 39: its sine and cosine straight from the two arguments (den > 0).
  const num = (sinDelta - s.y * sinXi) * cosDA;
  const r = Math.sqrt(num * num + den * den);
  const sinDeltaP = num / r;
  const cosDeltaP = den / r;
  // H' = H − Δα, eq 40
  const cosHp = cosH * cosDA + sinH * sinDA;
  const sinHp = sinH * cosDA - cosH * sinDA;
  let sinE0 = s.sinLat * sinDeltaP + s.cosLat * cosDeltaP * cosHp; // eq 41
  if (sinE0 > 1) sinE0 = 1;
  else if (sinE0 < -1) sinE0 = -1;
  const e0 = Math.asin(sinE0) * R2D;
  let dE = 0;
  let sinE = sinE0;
  if (s.refraction && e0 >= s.minElevationForRefractionDeg) {
    dE = (s.refractionFactor * 1.02) / (60 * Math.tan((e0 + 10.3 / (e0 + 5.11)) * D2R)); // eq 42
    // sin(e0 + ΔE) by the angle-addition identity; ΔE < 0.012 rad, so its sine and cosine by
    // Taylor series to the 5th/4th power are exact at double precision (next terms < 1e-17).
    const d = dE * D2R;
    const d2 = d * d;
    const sinD = d * (1 - (d2 / 6) * (1 - d2 / 20));
    const cosD = 1 - (d2 / 2) * (1 - d2 / 12);
    sinE = sinE0 * cosD + Math.sqrt(1 - sinE0 * sinE0) * sinD;
  }
  const e = e0 + dE; // eq 43
  const gy = sinHp;
  const gx = cosHp * s.sinLat - (sinDeltaP / cosDeltaP) * s.cosLat;
  const gamma = Math.atan2(gy, gx) * R2D; // eq 45, Γ in [−180°, 180°]
  out.zenithDeg = 90 - e; // eq 44
  out.airlessZenithDeg = 90 - e0;
  out.elevationDeg = e;
  const az = gamma + 180; // eq 46, in [0°, 360°]
  out.azimuthDeg = az >= 360 ? az - 360 : az;
  out.earthSunDistanceAu = radiusAu;
  // Unit vector for the transposition loops, without further trig for the azimuth: Φ = Γ + 180°.
  const sinZ = Math.sqrt(1 - sinE * sinE);
  const gr = Math.sqrt(gx * gx + gy * gy);
  out.cosZenith = sinE;
  out.sinZenithCosAz = gr > 0 ? (-sinZ * gx) / gr : 0;
  out.sinZenithSinAz = gr > 0 ? (-sinZ * gy) / gr : 0;
}

/** A zeroed SunAngles to pass as `out`. */
export function newSunAngles(): SunAngles {
  return { zenithDeg: 0, airlessZenithDeg: 0, azimuthDeg: 0, elevationDeg: 0, earthSunDistanceAu: 1, cosZenith: 0, sinZenithCosAz: 0, sinZenithSinAz: 0 };
}

export type SiteOptions = {
  latitude: number;
  longitude: number;
  elevationM?: number;
  /** Annual mean local pressure for refraction, mbar. Default: from elevation (standard atmosphere). */
  pressureMbar?: number;
  /** Annual mean local temperature for refraction, °C. Default 12 °C. */
  temperatureC?: number;
  /** TT − UT in seconds. Default 69 s (close to the measured value for 2015–2025, IERS). */
  deltaTSeconds?: number;
  /** Apply SPA's atmospheric refraction (eq 42). Default true. */
  refraction?: boolean;
};

/** Default ΔT = TT − UT, seconds (observed ≈ 69 s over 2015–2025; IERS Bulletin A, from memory). */
export const DEFAULT_DELTA_T_SECONDS = 69;
/** Default annual mean temperature for refraction, °C. */
export const DEFAULT_REFRACTION_TEMPERATURE_C = 12;

/** Pressure at an elevation, standard atmosphere (as pvlib `atmosphere.alt2pres`, U.S. Standard Atmosphere 1976), mbar. */
export function pressureFromElevationMbar(elevationM: number): number {
  return (101325 * Math.pow(1 - 2.25577e-5 * elevationM, 5.25588)) / 100;
}

/** Valid ranges of SPA's inputs (Reda & Andreas 2004, Table 1; elevation limited to where people build). */
export const siteOptionsSchema = z.object({
  latitude: z.number().finite().min(-90).max(90),
  longitude: z.number().finite().min(-180).max(180),
  elevationM: z.number().finite().min(-500).max(9000).optional(),
  pressureMbar: z.number().finite().min(300).max(1100).optional(),
  temperatureC: z.number().finite().min(-90).max(70).optional(),
  deltaTSeconds: z.number().finite().min(-8000).max(8000).optional(),
  refraction: z.boolean().optional(),
});

function resolveSite(site: SiteOptions): Required<SiteOptions> {
  const s = parseOrThrow(siteOptionsSchema, site, "solar position");
  const elevationM = s.elevationM ?? 0;
  return {
    latitude: s.latitude,
    longitude: s.longitude,
    elevationM,
    pressureMbar: s.pressureMbar ?? pressureFromElevationMbar(elevationM),
    temperatureC: s.temperatureC ?? DEFAULT_REFRACTION_TEMPERATURE_C,
    deltaTSeconds: s.deltaTSeconds ?? DEFAULT_DELTA_T_SECONDS,
    refraction: s.refraction ?? true,
  };
}

/**
 * Full SPA for one instant (every periodic term evaluated; no interpolation).
 * Example (Reda & Andreas 2004, Table A5.1/A5.2): 2003-10-17T19:30:30Z, lat 39.742476,
 * lon −105.1786, 1830.14 m, 820 mbar, 11 °C, ΔT 67 s → zenith 50.11162°, azimuth 194.34024°.
 */
export function solarPosition(date: Date, site: SiteOptions): SunAngles {
  const ms = date.getTime();
  if (!Number.isFinite(ms)) throw new EngineInputError([{ path: "date", message: "is not a valid date" }], "solar position");
  const s = resolveSite(site);
  const jd = julianDayFromUnixMs(ms);
  const g = geocentric(jd, s.deltaTSeconds);
  const nu = meanSiderealDeg(jd) + g.nutationRaCorrDeg; // eq 15
  const out = newSunAngles();
  topocentric(g, nu, siteTerms(s), out);
  return out;
}

/**
 * Spacing of the full geocentric evaluations the fast evaluator interpolates between, days. The
 * apparent geocentric sun changes smoothly: its only short-period terms are nutation terms under
 * 0.0001° (the largest, of 13.7 days, is 0.23″), so 4-point Lagrange interpolation over 3-day
 * nodes stays within 1e-4° of the full algorithm (measured 2e-5°; solar-position.test.ts).
 */
export const GEOCENTRIC_NODE_SPACING_DAYS = 3;

/**
 * A fast evaluator for any instant within [startMs, endMs]: the geocentric terms are computed in
 * full at UT midnights every GEOCENTRIC_NODE_SPACING_DAYS (plus margins) and interpolated with a
 * 4-point Lagrange polynomial; the sidereal time and the topocentric terms are exact.
 */
export function createSunEvaluator(site: SiteOptions, startMs: number, endMs: number): (ms: number, out: SunAngles) => void {
  return evaluatorFor(sunNodes(resolveSite(site), startMs, endMs));
}

/** The geocentric nodes of a time span and the site constants (see createSunEvaluator). */
type SunNodes = {
  terms: SiteTerms;
  jd0: number;
  step: number;
  nodes: number;
  alpha: Float64Array;
  sinD: Float64Array;
  cosD: Float64Array;
  nutCorr: Float64Array;
  radius: Float64Array;
};

function sunNodes(s: Required<SiteOptions>, startMs: number, endMs: number): SunNodes {
  const step = GEOCENTRIC_NODE_SPACING_DAYS;
  const jd0 = Math.floor(julianDayFromUnixMs(startMs) - 0.5) + 0.5 - step; // a UT midnight one node before the start
  const nodes = Math.ceil((julianDayFromUnixMs(endMs) - jd0) / step) + 3;
  const [alpha, sinD, cosD, nutCorr, radius, work, lNodes, bNodes, rNodes] = columns(9, nodes);
  // eqs 9–11 at every node in one pass (JME advances by a fixed step), then eqs 13–30 per node
  const jme0 = (jd0 + s.deltaTSeconds / 86400 - 2451545) / 365250;
  const jmeStep = step / 365250;
  earthSeriesAtSteps(L_TABLES, jme0, jmeStep, nodes, lNodes, work);
  earthSeriesAtSteps(B_TABLES, jme0, jmeStep, nodes, bNodes, work);
  earthSeriesAtSteps(R_TABLES, jme0, jmeStep, nodes, rNodes, work);
  const nut = { dPsi: 0, dEps: 0 };
  let prevAlpha = 0;
  for (let k = 0; k < nodes; k++) {
    const jce = (jd0 + k * step + s.deltaTSeconds / 86400 - 2451545) / 36525;
    nutationSums(jce, nut);
    const g = finishGeocentric(jce, jce / 10, lNodes[k], bNodes[k], rNodes[k], nut.dPsi, nut.dEps);
    // unwrap right ascension so it is continuous for interpolation
    let a = g.alphaDeg;
    if (k > 0) {
      while (a - prevAlpha > 180) a -= 360;
      while (a - prevAlpha < -180) a += 360;
    }
    alpha[k] = a;
    prevAlpha = a;
    sinD[k] = g.sinDelta;
    cosD[k] = g.cosDelta;
    nutCorr[k] = g.nutationRaCorrDeg;
    radius[k] = g.radiusAu;
  }
  return { terms: siteTerms(s), jd0, step, nodes, alpha, sinD, cosD, nutCorr, radius };
}

/** `count` columns of `length` numbers carved from one buffer. */
function columns(count: number, length: number): Float64Array[] {
  const buf = new Float64Array(count * length);
  return Array.from({ length: count }, (_, k) => buf.subarray(k * length, (k + 1) * length));
}

/** The geocentric terms at Julian Day `jd`, 4-point Lagrange interpolation between the nodes, into `g`. */
function interpolateGeocentric(n: SunNodes, jd: number, g: Geocentric): void {
  const { alpha, sinD, cosD, nutCorr, radius } = n;
  const t = (jd - n.jd0) / n.step;
  let i = Math.floor(t);
  if (i < 1) i = 1;
  if (i > n.nodes - 3) i = n.nodes - 3;
  const f = t - i; // nodes at i-1, i, i+1, i+2; f in [0, 1) normally
  // Lagrange weights for nodes at −1, 0, 1, 2
  const wm1 = (-f * (f - 1) * (f - 2)) / 6;
  const w0 = ((f + 1) * (f - 1) * (f - 2)) / 2;
  const w1 = (-(f + 1) * f * (f - 2)) / 2;
  const w2 = ((f + 1) * f * (f - 1)) / 6;
  g.alphaDeg = wm1 * alpha[i - 1] + w0 * alpha[i] + w1 * alpha[i + 1] + w2 * alpha[i + 2];
  // sin δ and cos δ interpolated directly (smooth like δ itself), saving two trig calls per hour
  g.sinDelta = wm1 * sinD[i - 1] + w0 * sinD[i] + w1 * sinD[i + 1] + w2 * sinD[i + 2];
  g.cosDelta = wm1 * cosD[i - 1] + w0 * cosD[i] + w1 * cosD[i + 1] + w2 * cosD[i + 2];
  g.nutationRaCorrDeg = wm1 * nutCorr[i - 1] + w0 * nutCorr[i] + w1 * nutCorr[i + 1] + w2 * nutCorr[i + 2];
  g.radiusAu = wm1 * radius[i - 1] + w0 * radius[i] + w1 * radius[i + 1] + w2 * radius[i + 2];
}

function evaluatorFor(n: SunNodes): (ms: number, out: SunAngles) => void {
  const g: Geocentric = { alphaDeg: 0, sinDelta: 0, cosDelta: 1, nutationRaCorrDeg: 0, radiusAu: 1 };
  return (ms: number, out: SunAngles) => {
    const jd = julianDayFromUnixMs(ms);
    interpolateGeocentric(n, jd, g);
    topocentric(g, meanSiderealDeg(jd) + g.nutationRaCorrDeg, n.terms, out);
  };
}

const HOURS_PER_DAY = 24;

/**
 * Sun positions at `count` instants one hour apart from `firstMs`, the same values as the
 * evaluator gives one by one, into the columns of `out` (from index 0). The hour angle H
 * (eq 32) is nearly linear in time over a day — the sidereal time is, and the sun's right
 * ascension curves by under 0.001° from its chord in 24 hours — so for each run of 24 hours
 * cos H and sin H are carried by rotation along the chord (angle-addition identities, two trig
 * calls per day instead of 48) and corrected by the small departure δ from it: cos δ = 1 − δ²/2,
 * sin δ = δ − δ³/6 (Taylor series; |δ| < 2e-5 rad, so the dropped terms are below 1e-20).
 */
function fillHourly(n: SunNodes, firstMs: number, count: number, out: SunPositionsYear): void {
  const terms = n.terms;
  const g: Geocentric = { alphaDeg: 0, sinDelta: 0, cosDelta: 1, nutationRaCorrDeg: 0, radiusAu: 1 };
  const [hDeg, sinDelta, cosDelta, radius] = columns(4, HOURS_PER_DAY);
  const a = newSunAngles();
  const { zenithDeg, airlessZenithDeg, azimuthDeg, earthSunDistanceAu, cosZenith, sinZenithCosAz, sinZenithSinAz } = out;
  for (let d0 = 0; d0 < count; d0 += HOURS_PER_DAY) {
    const m = Math.min(HOURS_PER_DAY, count - d0);
    for (let k = 0; k < m; k++) {
      const jd = julianDayFromUnixMs(firstMs + (d0 + k) * MS_PER_HOUR);
      interpolateGeocentric(n, jd, g);
      hDeg[k] = meanSiderealDeg(jd) + g.nutationRaCorrDeg + terms.lonDeg - g.alphaDeg; // eq 32, as in topocentric()
      sinDelta[k] = g.sinDelta;
      cosDelta[k] = g.cosDelta;
      radius[k] = g.radiusAu;
    }
    const h0 = hDeg[0];
    const stepDeg = m > 1 ? (hDeg[m - 1] - h0) / (m - 1) : 0;
    let c = Math.cos(h0 * D2R);
    let sn = Math.sin(h0 * D2R);
    const cStep = Math.cos(stepDeg * D2R);
    const sStep = Math.sin(stepDeg * D2R);
    for (let k = 0; k < m; k++) {
      const dl = (hDeg[k] - h0 - k * stepDeg) * D2R; // departure from the chord, rad
      const dl2 = dl * dl;
      const cosDl = 1 - dl2 / 2;
      const sinDl = dl * (1 - dl2 / 6);
      topocentricFromHourAngle(c * cosDl - sn * sinDl, sn * cosDl + c * sinDl, sinDelta[k], cosDelta[k], radius[k], terms, a);
      const i = d0 + k;
      zenithDeg[i] = a.zenithDeg;
      airlessZenithDeg[i] = a.airlessZenithDeg;
      azimuthDeg[i] = a.azimuthDeg;
      earthSunDistanceAu[i] = a.earthSunDistanceAu;
      cosZenith[i] = a.cosZenith;
      sinZenithCosAz[i] = a.sinZenithCosAz;
      sinZenithSinAz[i] = a.sinZenithSinAz;
      const c2 = c * cStep - sn * sStep;
      sn = sn * cStep + c * sStep;
      c = c2;
    }
  }
}

/** Sun positions for the 8760 hours of a typical weather year (see `sunPositionsForYear`). */
export type SunPositionsYear = {
  /** Zenith with refraction (apparent), degrees. */
  zenithDeg: Float64Array;
  /** Zenith without refraction, degrees. */
  airlessZenithDeg: Float64Array;
  /** Azimuth eastward from north, degrees. */
  azimuthDeg: Float64Array;
  /** Earth–Sun distance, AU. */
  earthSunDistanceAu: Float64Array;
  /** Hour of the day (decimal, local standard time) at which each position was evaluated. */
  evaluatedAtLocalHour: Float64Array;
  /** The apparent sun's unit vector per hour: cos z, sin z·cos Φ, sin z·sin Φ (for the transposition). */
  cosZenith: Float64Array;
  sinZenithCosAz: Float64Array;
  sinZenithSinAz: Float64Array;
  /** Calendar year the typical year was placed in. */
  year: number;
};

export type YearSite = {
  latitude: number;
  longitude: number;
  elevationM: number;
  /** Local standard time − UTC, hours (e.g. −7 for Denver). */
  utcOffsetHours: number;
};

export type YearPositionOptions = {
  /** Calendar year the typical year is placed in (must be non-leap). Default 2019. */
  year?: number;
  deltaTSeconds?: number;
  refraction?: boolean;
  pressureMbar?: number;
  /** Annual mean air temperature for refraction (the weather file's mean is a good value). */
  temperatureC?: number;
  /**
   * For the hour in which the sun rises or sets, evaluate at the middle of the part of the hour
   * the sun is up instead of the hour's middle — the convention of NREL's hourly PV models
   * (PVWatts v5 / SAM; Dobos 2014 and Gilman et al. 2015, from memory). Default true.
   */
  sunUpMidpoint?: boolean;
};

const MS_PER_HOUR = 3_600_000;
/** Above this elevation at an hour's middle the sun cannot cross the horizon within ±30 min (it moves ≤ 15°/h); narrowed by latitude below. */
const HORIZON_GUARD_DEG = 8;

const yearSiteSchema = z.object({
  latitude: z.number().finite().min(-90).max(90),
  longitude: z.number().finite().min(-180).max(180),
  elevationM: z.number().finite().min(-500).max(9000),
  utcOffsetHours: z.number().finite().min(-12).max(14),
});

function isLeapYear(y: number): boolean {
  return (y % 4 === 0 && y % 100 !== 0) || y % 400 === 0;
}

/**
 * The sunrise and sunset hours of `out` (filled at the hours' middles) re-evaluated at the middle
 * of their sunlit part; every other hour is left as it is.
 */
function refineHorizonHours(nodes: SunNodes, yearStartMs: number, latitude: number, out: SunPositionsYear): void {
  const evaluate = evaluatorFor(nodes);
  const a = newSunAngles();
  let b = newSunAngles();
  let c = newSunAngles();
  let cAtHour = -1; // the hour whose start `c` holds (the previous guarded hour's end, when adjacent)
  // Near the horizon the sun's elevation changes by at most 15.04°·cos(latitude) per hour (plus
  // refraction's own change, under 1°): hours whose middle is farther from the horizon than half
  // of that cannot contain sunrise or sunset.
  const guardDeg = Math.min(HORIZON_GUARD_DEG, (15.05 * Math.cos(latitude * (Math.PI / 180))) / 2 + 1);
  for (let i = 0; i < HOURS_PER_YEAR; i++) {
    if (!(Math.abs(90 - out.zenithDeg[i]) < guardDeg)) continue;
    const hourStartMs = yearStartMs + i * MS_PER_HOUR;
    if (cAtHour !== i) evaluate(hourStartMs, c);
    evaluate(hourStartMs + MS_PER_HOUR, b);
    // this hour's end is the next hour's start
    const t = c;
    c = b;
    b = t;
    cAtHour = i + 1;
    const eStart = b.elevationDeg;
    const eEnd = c.elevationDeg;
    const upStart = eStart > 0;
    const upEnd = eEnd > 0;
    if (upStart === upEnd) continue;
    // Elevation is close to linear in time near the horizon: one secant step places the
    // crossing within seconds, which is ample for choosing an evaluation instant.
    const f = eStart / (eStart - eEnd);
    const crossMs = hourStartMs + f * MS_PER_HOUR;
    const evalMs = upStart ? (hourStartMs + crossMs) / 2 : (crossMs + hourStartMs + MS_PER_HOUR) / 2;
    evaluate(evalMs, a);
    out.zenithDeg[i] = a.zenithDeg;
    out.airlessZenithDeg[i] = a.airlessZenithDeg;
    out.azimuthDeg[i] = a.azimuthDeg;
    out.earthSunDistanceAu[i] = a.earthSunDistanceAu;
    out.cosZenith[i] = a.cosZenith;
    out.sinZenithCosAz[i] = a.sinZenithCosAz;
    out.sinZenithSinAz[i] = a.sinZenithSinAz;
    out.evaluatedAtLocalHour[i] = (i % 24) + (evalMs - hourStartMs) / MS_PER_HOUR;
  }
}

/**
 * 8760 sun positions for the typical year (hour 0 = 1 January 00:00–01:00 local standard time,
 * no 29 February), each at the middle of its hour — or, for sunrise and sunset hours, at the
 * middle of the sunlit part (see `sunUpMidpoint`). Local standard time → UT by the UTC offset.
 */
export function sunPositionsForYear(site: YearSite, options: YearPositionOptions = {}): SunPositionsYear {
  const s = parseOrThrow(yearSiteSchema, site, "sun positions");
  const year = options.year ?? 2019;
  if (!Number.isInteger(year) || year < 1900 || year > 2100 || isLeapYear(year)) {
    throw new EngineInputError([{ path: "year", message: "must be a non-leap year from 1900 to 2100" }], "sun positions");
  }
  const offsetMs = s.utcOffsetHours * MS_PER_HOUR;
  const yearStartMs = Date.UTC(year, 0, 1) - offsetMs;
  const nodes = sunNodes(
    resolveSite({
      latitude: s.latitude,
      longitude: s.longitude,
      elevationM: s.elevationM,
      deltaTSeconds: options.deltaTSeconds,
      refraction: options.refraction,
      pressureMbar: options.pressureMbar,
      temperatureC: options.temperatureC,
    }),
    yearStartMs - MS_PER_HOUR,
    yearStartMs + (HOURS_PER_YEAR + 1) * MS_PER_HOUR,
  );

  const n = HOURS_PER_YEAR;
  // one buffer for the eight columns: a single large allocation is much cheaper than five in V8
  const buf = new Float64Array(8 * n);
  const col = (k: number) => buf.subarray(k * n, (k + 1) * n);
  const out: SunPositionsYear = {
    zenithDeg: col(0),
    airlessZenithDeg: col(1),
    azimuthDeg: col(2),
    earthSunDistanceAu: col(3),
    evaluatedAtLocalHour: col(4),
    cosZenith: col(5),
    sinZenithCosAz: col(6),
    sinZenithSinAz: col(7),
    year,
  };
  // Every hour at its middle first; then the sunrise and sunset hours re-evaluated one by one.
  fillHourly(nodes, yearStartMs + MS_PER_HOUR / 2, n, out);
  for (let i = 0; i < n; i++) out.evaluatedAtLocalHour[i] = (i % 24) + 0.5;
  if (!(options.sunUpMidpoint ?? true)) return out;
  refineHorizonHours(nodes, yearStartMs, s.latitude, out);
  return out;
}

/** UTC instant (ms) of the start of hour i of the typical year placed in `year`. */
export function typicalHourStartMs(i: number, utcOffsetHours: number, year = 2019): number {
  return Date.UTC(year, 0, 1) - utcOffsetHours * MS_PER_HOUR + i * MS_PER_HOUR;
}
