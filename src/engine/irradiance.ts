/**
 * Irradiance on the plane of array (POA) from beam, diffuse and global horizontal irradiance.
 *
 *  - Extraterrestrial normal irradiance: Spencer, J.W. (1971), "Fourier series representation of
 *    the position of the sun", Search 2(5):172 — the eccentricity-correction series.
 *  - Relative air mass: Kasten, F. & Young, A.T. (1989), "Revised optical air mass tables and
 *    approximation formula", Applied Optics 28(22):4735–4738, eq. 3.
 *  - Sky diffuse, three models:
 *     isotropic — Liu & Jordan (1963);
 *     Hay & Davies (1980), "Calculation of the solar radiation incident on an inclined surface";
 *     Perez, R., Ineichen, P., Seals, R., Michalsky, J. & Stewart, R. (1990), "Modeling daylight
 *       availability and irradiance components from direct and global irradiance", Solar Energy
 *       44(5):271–289 — with its "all sites composite" F1/F2 coefficients (Table 6), the default.
 *  - Ground-reflected: isotropic ground, GHI·albedo·(1 − cos β)/2 (Liu & Jordan 1963).
 *  - Cover (glass) transmittance on the beam: Fresnel reflection + Bouguer absorption as used by
 *    PVWatts v5 (Dobos, A.P. (2014), "PVWatts Version 5 Manual", NREL/TP-6A20-62641, section 3.2,
 *    after De Soto et al. 2006), n = 1.526, K = 4 /m, L = 2 mm.
 *
 * Angles in degrees; azimuths eastward from north (180 = south).
 */
import type { SunPositionsYear } from "./solar-position";
import type { WeatherYear } from "./weather";
import { HOURS_PER_YEAR } from "./year-calendar";

const D2R = Math.PI / 180;

export type TranspositionModel = "perez" | "haydavies" | "isotropic";

/** Solar constant, W/m² (the value pvlib uses by default; Gueymard 2004 gives 1366.1). */
export const SOLAR_CONSTANT_W_M2 = 1366.1;

/** Spencer (1971): extraterrestrial normal irradiance on day of year `doy` (1–365), W/m². */
export function extraterrestrialNormal(doy: number, solarConstant = SOLAR_CONSTANT_W_M2): number {
  const b = (2 * Math.PI * (doy - 1)) / 365; // day angle
  return (
    solarConstant *
    (1.00011 + 0.034221 * Math.cos(b) + 0.00128 * Math.sin(b) + 0.000719 * Math.cos(2 * b) + 0.000077 * Math.sin(2 * b))
  );
}

/**
 * Kasten & Young (1989) relative air mass for an apparent zenith angle (degrees). The formula is
 * defined up to the horizon; below it the value at 90° (≈ 37.9) is returned so callers never see NaN.
 */
export function airMassKastenYoung(zenithDeg: number): number {
  const z = zenithDeg > 90 ? 90 : zenithDeg < 0 ? 0 : zenithDeg;
  return 1 / (Math.cos(z * D2R) + 0.50572 * Math.pow(96.07995 - z, -1.6364));
}

/** Cosine of the angle of incidence of the beam on a plane (tilt β, azimuth γ). */
export function cosIncidence(tiltDeg: number, azimuthDeg: number, zenithDeg: number, sunAzimuthDeg: number): number {
  const z = zenithDeg * D2R;
  const t = tiltDeg * D2R;
  const c = Math.cos(z) * Math.cos(t) + Math.sin(z) * Math.sin(t) * Math.cos((sunAzimuthDeg - azimuthDeg) * D2R);
  return c > 1 ? 1 : c < -1 ? -1 : c;
}

/** Angle of incidence, degrees (0–180). */
export function angleOfIncidenceDeg(tiltDeg: number, azimuthDeg: number, zenithDeg: number, sunAzimuthDeg: number): number {
  return Math.acos(cosIncidence(tiltDeg, azimuthDeg, zenithDeg, sunAzimuthDeg)) / D2R;
}

/** Isotropic sky (Liu & Jordan 1963): DHI·(1 + cos β)/2. */
export function isotropicSky(tiltDeg: number, dhi: number): number {
  return dhi * (1 + Math.cos(tiltDeg * D2R)) / 2;
}

/** Lower bound on cos(zenith) in Hay-Davies' ratio Rb (cos 89°), keeping it finite near the horizon. */
const HAY_MIN_COS_ZENITH = 0.01745;

/** Hay & Davies (1980) sky diffuse: DHI·[A·Rb + (1 − A)(1 + cos β)/2], A = DNI/DNI_extra. */
export function hayDaviesSky(
  tiltDeg: number,
  azimuthDeg: number,
  dhi: number,
  dni: number,
  dniExtra: number,
  zenithDeg: number,
  sunAzimuthDeg: number,
): number {
  const cosAoi = Math.max(cosIncidence(tiltDeg, azimuthDeg, zenithDeg, sunAzimuthDeg), 0);
  const rb = cosAoi / Math.max(Math.cos(zenithDeg * D2R), HAY_MIN_COS_ZENITH);
  const a = dniExtra > 0 ? Math.min(Math.max(dni / dniExtra, 0), 1) : 0;
  return Math.max(dhi * (1 - a) * (1 + Math.cos(tiltDeg * D2R)) / 2, 0) + Math.max(dhi * a * rb, 0);
}

/**
 * Perez et al. (1990), Table 6, "all sites composite": rows are the eight sky-clearness bins,
 * columns F11, F12, F13, F21, F22, F23.
 */
export const PEREZ_1990_ALL_SITES: readonly (readonly number[])[] = [
  [-0.008, 0.588, -0.062, -0.06, 0.072, -0.022],
  [0.13, 0.683, -0.151, -0.019, 0.066, -0.029],
  [0.33, 0.487, -0.221, 0.055, -0.064, -0.026],
  [0.568, 0.187, -0.295, 0.109, -0.152, -0.014],
  [0.873, -0.392, -0.362, 0.226, -0.462, 0.001],
  [1.132, -1.237, -0.412, 0.288, -0.823, 0.056],
  [1.06, -1.6, -0.359, 0.264, -1.127, 0.131],
  [0.678, -0.327, -0.25, 0.156, -1.377, 0.251],
];
/** Upper edges of the first seven sky-clearness (ε) bins, Perez et al. 1990, Table 1. */
const PEREZ_EPSILON_EDGES = [1.065, 1.23, 1.5, 1.95, 2.8, 4.5, 6.2];
/** κ in ε's zenith term, for zenith in radians (Perez et al. 1990, eq. 1). */
const PEREZ_KAPPA = 1.041;
/** Lower bound on cos(zenith) in the circumsolar term (cos 85°), Perez et al. 1990. */
const PEREZ_MIN_COS_ZENITH = Math.cos(85 * D2R);

/** Perez F1 (circumsolar) and F2 (horizon) brightening coefficients for one hour. */
export function perezCoefficients(dhi: number, dni: number, dniExtra: number, zenithDeg: number, airMass: number): { f1: number; f2: number } {
  if (!(dhi > 0) || zenithDeg >= 90 || !(dniExtra > 0)) return { f1: 0, f2: 0 };
  const z = zenithDeg * D2R;
  const kz3 = PEREZ_KAPPA * z * z * z;
  const eps = ((dhi + Math.max(dni, 0)) / dhi + kz3) / (1 + kz3); // sky clearness, eq. 1
  let bin = 0;
  while (bin < PEREZ_EPSILON_EDGES.length && eps >= PEREZ_EPSILON_EDGES[bin]) bin++;
  const delta = (dhi * airMass) / dniExtra; // sky brightness, eq. 2
  const c = PEREZ_1990_ALL_SITES[bin];
  return { f1: Math.max(c[0] + c[1] * delta + c[2] * z, 0), f2: c[3] + c[4] * delta + c[5] * z };
}

export type PerezParts = { total: number; isotropic: number; circumsolar: number; horizon: number };

/** Perez et al. (1990) sky diffuse on a tilted plane, with its three parts. */
export function perezSky(
  tiltDeg: number,
  azimuthDeg: number,
  dhi: number,
  dni: number,
  dniExtra: number,
  zenithDeg: number,
  sunAzimuthDeg: number,
  airMass: number,
): PerezParts {
  const { f1, f2 } = perezCoefficients(dhi, dni, dniExtra, zenithDeg, airMass);
  const a = Math.max(cosIncidence(tiltDeg, azimuthDeg, zenithDeg, sunAzimuthDeg), 0);
  const b = Math.max(Math.cos(zenithDeg * D2R), PEREZ_MIN_COS_ZENITH);
  const d = Math.max(dhi, 0);
  const isotropic = d * (1 - f1) * (1 + Math.cos(tiltDeg * D2R)) / 2;
  const circumsolar = (d * f1 * a) / b;
  const horizon = d * f2 * Math.sin(tiltDeg * D2R);
  const total = Math.max(isotropic + circumsolar + horizon, 0);
  return { total, isotropic, circumsolar, horizon };
}

/** Ground-reflected irradiance on the plane: GHI·albedo·(1 − cos β)/2. */
export function groundReflected(tiltDeg: number, ghi: number, albedo: number): number {
  return ghi * albedo * (1 - Math.cos(tiltDeg * D2R)) / 2;
}

/** PVWatts v5 cover parameters (Dobos 2014, section 3.2): glass refractive index, extinction K (1/m), thickness L (m). */
export const PVWATTS_COVER = { n: 1.526, kPerM: 4, thicknessM: 0.002 } as const;

/**
 * Beam transmittance of the module cover relative to normal incidence, from cos(AOI):
 * τ(θ) = exp(−K·L / cos θr)·[1 − ½(sin²(θr−θ)/sin²(θr+θ) + tan²(θr−θ)/tan²(θr+θ))], θr by Snell's
 * law, divided by τ(0) = exp(−K·L)·[1 − ((1−n)/(1+n))²] (Dobos 2014, eqs. in section 3.2).
 * Written with sines and cosines only so the hourly loop needs one sqrt pair and one exp.
 */
export function coverTransmittanceFromCos(cosAoi: number, cover: { n: number; kPerM: number; thicknessM: number } = PVWATTS_COVER): number {
  if (cosAoi <= 0) return 0; // beam from behind or along the plane
  if (cosAoi >= 1 - 1e-12) return 1;
  const { n, kPerM, thicknessM } = cover;
  const c = cosAoi;
  const s = Math.sqrt(1 - c * c);
  const sr = s / n;
  const cr = Math.sqrt(1 - sr * sr);
  const sinMinus = sr * c - cr * s; // sin(θr − θ)
  const sinPlus = sr * c + cr * s; // sin(θr + θ)
  const cosMinus = cr * c + sr * s; // cos(θr − θ)
  const cosPlus = cr * c - sr * s; // cos(θr + θ)
  const rPerp = (sinMinus / sinPlus) ** 2;
  const rPara = ((sinMinus * cosPlus) / (cosMinus * sinPlus)) ** 2;
  const kl = kPerM * thicknessM;
  const tau = Math.exp(-kl / cr) * (1 - (rPerp + rPara) / 2);
  const r0 = ((1 - n) / (1 + n)) ** 2;
  const tau0 = Math.exp(-kl) * (1 - r0);
  const iam = tau / tau0;
  return iam > 0 ? iam : 0;
}

/**
 * The PVWatts cover transmittance tabulated over cos(AOI) in [0, 1] (4,096 steps, linear
 * interpolation; within 1e-6 of the formula, checked in irradiance.test.ts) for the year loop,
 * where the formula's sqrt/exp work would otherwise be paid for every sunlit hour of every face.
 */
const COVER_TABLE_STEPS = 4096;
const COVER_TABLE = (() => {
  const t = new Float64Array(COVER_TABLE_STEPS + 2);
  for (let k = 0; k <= COVER_TABLE_STEPS + 1; k++) t[k] = coverTransmittanceFromCos(Math.min(k / COVER_TABLE_STEPS, 1));
  return t;
})();

/** Tabulated PVWatts cover transmittance from cos(AOI) (see COVER_TABLE). */
export function coverTransmittanceFast(cosAoi: number): number {
  if (cosAoi <= 0) return 0;
  const x = (cosAoi >= 1 ? 1 : cosAoi) * COVER_TABLE_STEPS;
  const k = x | 0;
  return COVER_TABLE[k] + (x - k) * (COVER_TABLE[k + 1] - COVER_TABLE[k]);
}

/** Same, from the angle of incidence in degrees (|AOI| ≥ 90° → 0). */
export function coverTransmittance(aoiDeg: number, cover = PVWATTS_COVER): number {
  if (Math.abs(aoiDeg) >= 90) return 0;
  return coverTransmittanceFromCos(Math.cos(aoiDeg * D2R), cover);
}

// ------------------------------------------------------------------ year-level fast path

/** Face-independent hourly terms, computed once per weather year and transposition model. */
export type SkyYear = {
  model: TranspositionModel;
  cosZenith: Float64Array;
  /** sin z·cos(sun azimuth), sin z·sin(sun azimuth): with cos z they make the sun's unit vector. */
  sinZcosAz: Float64Array;
  sinZsinAz: Float64Array;
  dni: Float64Array;
  dhi: Float64Array;
  ghi: Float64Array;
  albedo: Float64Array;
  /** Perez F1, F2 (perez) or the anisotropy index A (haydavies in f1); zero otherwise. */
  f1: Float64Array;
  f2: Float64Array;
  /** 1 / max(cos z, model's lower bound), for the circumsolar ratio. */
  invCosZClamped: Float64Array;
};

/**
 * `count` zeroed columns of `length` numbers carved from one buffer. One large allocation is far
 * cheaper in V8 than many 70 kB ones (measured ≈ 0.2 ms each), and the year loops allocate dozens.
 */
export function allocateColumns(count: number, length: number = HOURS_PER_YEAR): Float64Array[] {
  const buf = new Float64Array(count * length);
  const out: Float64Array[] = [];
  for (let k = 0; k < count; k++) out.push(buf.subarray(k * length, (k + 1) * length));
  return out;
}

/** Day of year (1–365) of each hour of the typical year. */
function dayOfYearOfHour(i: number): number {
  return Math.floor(i / 24) + 1;
}

/** Precompute the sky terms that do not depend on the plane (once per weather year and model). */
export function prepareSky(weather: Pick<WeatherYear, "dni" | "dhi" | "ghi" | "albedo">, sun: SunPositionsYear, model: TranspositionModel = "perez"): SkyYear {
  const n = HOURS_PER_YEAR;
  const [f1, f2, invCosZClamped] = allocateColumns(3, n);
  const sky: SkyYear = {
    model,
    cosZenith: sun.cosZenith,
    sinZcosAz: sun.sinZenithCosAz,
    sinZsinAz: sun.sinZenithSinAz,
    dni: weather.dni,
    dhi: weather.dhi,
    ghi: weather.ghi,
    albedo: weather.albedo,
    f1,
    f2,
    invCosZClamped,
  };
  const minCos = model === "perez" ? PEREZ_MIN_COS_ZENITH : HAY_MIN_COS_ZENITH;
  let doyPrev = -1;
  let etr = 0;
  for (let i = 0; i < n; i++) {
    const cz = sun.cosZenith[i];
    sky.invCosZClamped[i] = 1 / (cz > minCos ? cz : minCos);
    if (model === "isotropic" || cz <= 0 || !(weather.dhi[i] > 0)) continue;
    const doy = dayOfYearOfHour(i);
    if (doy !== doyPrev) {
      etr = extraterrestrialNormal(doy);
      doyPrev = doy;
    }
    if (model === "perez") {
      const c = perezCoefficients(weather.dhi[i], weather.dni[i], etr, sun.zenithDeg[i], airMassKastenYoung(sun.zenithDeg[i]));
      sky.f1[i] = c.f1;
      sky.f2[i] = c.f2;
    } else {
      const a = weather.dni[i] / etr;
      sky.f1[i] = a < 0 ? 0 : a > 1 ? 1 : a;
    }
  }
  return sky;
}

/** Hourly plane-of-array results for one plane. */
export type PlaneOfArray = {
  /** Total POA irradiance (beam + sky diffuse + ground), W/m². */
  poa: Float64Array;
  /** POA after the cover's beam transmittance (beam·IAM + diffuse + ground), W/m². */
  poaTransmitted: Float64Array;
  beam: Float64Array;
  skyDiffuse: Float64Array;
  ground: Float64Array;
};

/** Allocate the five hourly columns of a PlaneOfArray in one buffer. */
export function allocatePlaneOfArray(): PlaneOfArray {
  const [poa, poaTransmitted, beam, skyDiffuse, ground] = allocateColumns(5);
  return { poa, poaTransmitted, beam, skyDiffuse, ground };
}

/** Transpose one plane over the year (tight loop over the precomputed sky terms); fills `out` if given. */
export function planeOfArray(sky: SkyYear, tiltDeg: number, azimuthDeg: number, albedoOverride?: number, out: PlaneOfArray = allocatePlaneOfArray()): PlaneOfArray {
  const n = HOURS_PER_YEAR;
  const t = tiltDeg * D2R;
  const cosT = Math.cos(t);
  const sinT = Math.sin(t);
  const g = azimuthDeg * D2R;
  const nx = sinT * Math.cos(g); // plane normal, north/east/up components
  const ny = sinT * Math.sin(g);
  const isoView = (1 + cosT) / 2;
  const groundView = (1 - cosT) / 2;
  const { cosZenith, sinZcosAz, sinZsinAz, dni, dhi, ghi, albedo, f1, f2, invCosZClamped } = sky;
  const modelCode = sky.model === "perez" ? 0 : sky.model === "haydavies" ? 1 : 2;
  const useOverride = albedoOverride !== undefined;
  const albedoFixed = albedoOverride ?? 0;
  const { poa, poaTransmitted, beam: beamOut, skyDiffuse, ground } = out;
  for (let i = 0; i < n; i++) {
    const d = dhi[i];
    const gh = ghi[i];
    if (gh <= 0 && d <= 0 && dni[i] <= 0) {
      poa[i] = 0;
      poaTransmitted[i] = 0;
      beamOut[i] = 0;
      skyDiffuse[i] = 0;
      ground[i] = 0;
      continue;
    }
    const cz = cosZenith[i];
    let cosAoi = cz * cosT + sinZcosAz[i] * nx + sinZsinAz[i] * ny;
    if (cosAoi > 1) cosAoi = 1;
    const a = cosAoi > 0 ? cosAoi : 0;
    const beam = cz > 0 ? dni[i] * a : 0;
    let skyD: number;
    if (modelCode === 0) {
      const F1 = f1[i];
      skyD = d * ((1 - F1) * isoView + F1 * a * invCosZClamped[i] + f2[i] * sinT);
      if (skyD < 0) skyD = 0;
    } else if (modelCode === 1) {
      const A = f1[i];
      skyD = d * ((1 - A) * isoView + A * a * invCosZClamped[i]);
    } else {
      skyD = d * isoView;
    }
    const gr = gh * (useOverride ? albedoFixed : albedo[i]) * groundView;
    beamOut[i] = beam;
    skyDiffuse[i] = skyD;
    ground[i] = gr;
    poa[i] = beam + skyD + gr;
    poaTransmitted[i] = beam > 0 ? beam * coverTransmittanceFast(a) + skyD + gr : skyD + gr;
  }
  return out;
}
