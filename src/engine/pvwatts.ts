/**
 * The PVWatts v5 performance model: Dobos, A.P. (2014), "PVWatts Version 5 Manual",
 * NREL/TP-6A20-62641, National Renewable Energy Laboratory.
 *
 *  - Cell temperature (section 3.3): the transient heat-balance model of Fuentes, M.K. (1987),
 *    "A Simplified Thermal Model for Flat-Plate Photovoltaic Arrays", SAND85-0330 (eqs. 3–8, 22,
 *    24, Table 3), with installed NOCT (INOCT) 45 °C for open rack and 49 °C for roof mount.
 *  - DC power (section 3.4): P_dc = P_dc0·(1 + γ(T_cell − 25))·I_tr/1000, before system losses.
 *  - System losses (section 3.5): 1 − Π(1 − l_i) over the loss categories.
 *  - Inverter (section 3.6): η = (η_nom/η_ref)·(−0.0162ζ − 0.0059/ζ + 0.9858), ζ = P_dc/P_dc0,
 *    P_dc0 = P_ac0/η_nom, output limited to P_ac0 (clipping) and to ≥ 0.
 */
import { z } from "zod";
import { parseOrThrow } from "./errors";

/** Temperature coefficient of power by module type, 1/°C (Dobos 2014, module type table; table number from memory: Table 2). */
export const MODULE_GAMMA_PER_C = {
  standard: -0.0047,
  premium: -0.0035,
  "thin-film": -0.002,
} as const;
export type ModuleType = keyof typeof MODULE_GAMMA_PER_C;
export const MODULE_TYPES = Object.keys(MODULE_GAMMA_PER_C) as ModuleType[];

/** Installed nominal operating cell temperature by mounting, °C (Dobos 2014, section 3.3). */
export const MOUNT_INOCT_C = {
  "open-rack": 45,
  roof: 49,
} as const;
export type MountType = keyof typeof MOUNT_INOCT_C;
export const MOUNT_TYPES = Object.keys(MOUNT_INOCT_C) as MountType[];

/** PVWatts v5 default loss breakdown, % (Dobos 2014, system loss table; from memory: Table 3). Combined: 14.08 %. */
export const DEFAULT_LOSSES_PCT = {
  soiling: 2,
  shading: 3,
  snow: 0,
  mismatch: 2,
  wiring: 2,
  connections: 0.5,
  lightInducedDegradation: 1.5,
  nameplateRating: 1,
  age: 0,
  availability: 3,
} as const;
export type LossBreakdown = { [K in keyof typeof DEFAULT_LOSSES_PCT]: number };

const pct = z.number().finite().min(0).max(100);
export const lossBreakdownSchema = z
  .object({
    soiling: pct,
    shading: pct,
    snow: pct,
    mismatch: pct,
    wiring: pct,
    connections: pct,
    lightInducedDegradation: pct,
    nameplateRating: pct,
    age: pct,
    availability: pct,
  })
  .partial();

/** Combined system loss, % = 100·(1 − Π(1 − l_i/100)) (Dobos 2014, section 3.5). Unlisted categories take the defaults. */
export function combinedLossPct(losses: Partial<LossBreakdown> = {}): number {
  const l = { ...DEFAULT_LOSSES_PCT, ...parseOrThrow(lossBreakdownSchema, losses, "losses") };
  let keep = 1;
  for (const v of Object.values(l)) keep *= 1 - v / 100;
  return 100 * (1 - keep);
}

/** PVWatts DC power, W, before system losses (Dobos 2014, section 3.4, T_ref = 25 °C). */
export function pvwattsDc(poaTransmitted: number, cellTempC: number, pdc0W: number, gammaPerC: number): number {
  return (poaTransmitted / 1000) * pdc0W * (1 + gammaPerC * (cellTempC - 25));
}

/** PVWatts v5 inverter defaults: nominal and reference efficiencies (Dobos 2014, section 3.6). */
export const PVWATTS_ETA_NOMINAL = 0.96;
export const PVWATTS_ETA_REFERENCE = 0.9637;

/**
 * PVWatts inverter: AC power, W, for DC input `pdcW` to an inverter whose DC rating is
 * `pdc0W` = P_ac0/η_nom. Clipped to P_ac0 = η_nom·pdc0W; never negative.
 */
export function pvwattsInverter(pdcW: number, pdc0W: number, etaNominal = PVWATTS_ETA_NOMINAL, etaReference = PVWATTS_ETA_REFERENCE): number {
  if (!(pdcW > 0) || !(pdc0W > 0)) return 0;
  const pac0 = etaNominal * pdc0W;
  const zeta = pdcW / pdc0W;
  const eta = (etaNominal / etaReference) * (-0.0162 * zeta - 0.0059 / zeta + 0.9858);
  const ac = eta * pdcW;
  return ac > pac0 ? pac0 : ac > 0 ? ac : 0;
}

// ---------------------------------------------------------------- Fuentes (1987) cell temperature

/** Fuentes 1987 constants as used by PVWatts (Fuentes 1987, Table 3 and appendix program). */
const FUENTES = {
  stefanBoltzmann: 5.669e-8, // W/(m²·K⁴), value in Fuentes' program
  emissivity: 0.84,
  absorptivity: 0.83,
  /** Hydraulic diameter of the module, m (Fuentes' 0.5 m). */
  lengthM: 0.5,
  /** Heat capacity per area, J/(m²·K), before the INOCT adjustment (Fuentes eq. 26–27). */
  capacity0: 11000,
  /** Module tilt used in the free-convection term; Fuentes (and PVWatts) fix it at 30°. */
  tiltDeg: 30,
  /** PVWatts: module centre 5 m above ground, wind measured at 9.144 m (30 ft) — the power-law profile of eq. 22. */
  moduleHeightM: 5,
  windHeightM: 9.144,
  /** Heat-balance iterations per hour (Fuentes' program uses 10); stops early once converged. */
  maxIterations: 10,
  toleranceK: 1e-6,
} as const;

const T_NOCT_AMBIENT_K = 293.15; // 20 °C NOCT ambient
const T_NOCT_SKY_K = 282.21; // sky temperature at NOCT conditions, Fuentes 1987
const NOCT_IRRADIANCE = 800; // W/m²
const KELVIN = 273.15;

/** Convective coefficient, Fuentes 1987 eqs. 10–19: free and forced (laminar/turbulent) combined. */
function convection(tave: number, windMod: number, dT: number, sinTilt: number, turbulentAllowed: boolean): number {
  const L = FUENTES.lengthM;
  const dens = (0.003484 * 101325) / tave;
  const visc = (0.24237e-6 * Math.pow(tave, 0.76)) / dens;
  const cond = 2.1695e-4 * Math.pow(tave, 0.84);
  const re = (windMod * L) / visc;
  const hForced =
    turbulentAllowed && re > 1.2e5
      ? ((0.0282 / Math.pow(re, 0.2)) * dens * windMod * 1007) / Math.pow(0.71, 0.4)
      : ((0.86 / Math.sqrt(re)) * dens * windMod * 1007) / Math.pow(0.71, 0.67);
  const grashof = ((9.8 / tave) * dT * L * L * L * sinTilt) / (visc * visc);
  const hFree = (0.21 * Math.pow(grashof * 0.71, 0.32) * cond) / L;
  return Math.cbrt(hFree * hFree * hFree + hForced * hForced * hForced);
}

/** The INOCT-dependent constants of the model (computed once per mounting). */
function fuentesSetup(inoctC: number) {
  const { stefanBoltzmann: sb, emissivity: em, absorptivity: ab } = FUENTES;
  const sinTilt = Math.sin((FUENTES.tiltDeg * Math.PI) / 180);
  const tinoct = inoctC + KELVIN;
  const ta = T_NOCT_AMBIENT_K;
  // Convective coefficient at NOCT (1 m/s wind), then ground-temperature and convection ratios.
  const hconvNoct = convection((tinoct + ta) / 2, 1, tinoct - ta, sinTilt, false);
  const hground = em * sb * (tinoct * tinoct + ta * ta) * (tinoct + ta);
  const backrat =
    (ab * NOCT_IRRADIANCE - em * sb * (tinoct ** 4 - T_NOCT_SKY_K ** 4) - hconvNoct * (tinoct - ta)) / ((hground + hconvNoct) * (tinoct - ta));
  let tground = Math.pow(tinoct ** 4 - backrat * (tinoct ** 4 - ta ** 4), 0.25);
  tground = Math.min(Math.max(tground, ta), tinoct);
  const tgrat = (tground - ta) / (tinoct - ta);
  const convrat = (ab * NOCT_IRRADIANCE - em * sb * (2 * tinoct ** 4 - T_NOCT_SKY_K ** 4 - tground ** 4)) / (hconvNoct * (tinoct - ta));
  // High INOCT means coupling to the roof: more thermal mass (Fuentes eqs. 26–27).
  const cap = tinoct > 321.15 ? FUENTES.capacity0 * (1 + (tinoct - 321.15) / 12) : FUENTES.capacity0;
  return { sinTilt, tgrat, convrat, cap };
}

/**
 * Hourly cell temperature, °C, by Fuentes (1987) as in PVWatts v5, for a year (or any series of
 * equal `stepHours`). As in NREL's implementation, a dark hour (POA ≤ 0) sets the module to air
 * temperature, so the heat balance restarts from ambient each morning.
 */
export function fuentesCellTemperature(
  poa: ArrayLike<number>,
  tempAirC: ArrayLike<number>,
  windSpeedMs: ArrayLike<number>,
  inoctC: number,
  out: Float64Array = new Float64Array(poa.length),
  stepHours = 1,
): Float64Array {
  const { sinTilt, tgrat, convrat, cap } = fuentesSetup(inoctC);
  const sb = FUENTES.stefanBoltzmann;
  const em = FUENTES.emissivity;
  const windFactor = Math.pow(FUENTES.moduleHeightM / FUENTES.windHeightM, 0.2);
  const dtSeconds = stepHours * 3600;
  let tmod0 = T_NOCT_AMBIENT_K;
  let sun0 = 0;
  for (let i = 0; i < poa.length; i++) {
    const tamb = tempAirC[i] + KELVIN;
    if (!(poa[i] > 0)) {
      out[i] = tempAirC[i];
      tmod0 = tamb;
      sun0 = 0;
      continue;
    }
    const sun = poa[i] * FUENTES.absorptivity;
    const tsky = 0.68 * (0.0552 * Math.pow(tamb, 1.5)) + 0.32 * tamb; // eq. 24
    const windMod = windSpeedMs[i] * windFactor + 1e-4; // eq. 22 (+ small floor as in Fuentes' program)
    let tmod = tmod0;
    for (let j = 0; j < FUENTES.maxIterations; j++) {
      const hconv = convrat * convection((tmod + tamb) / 2, windMod, Math.abs(tmod - tamb), sinTilt, true);
      const hsky = em * sb * (tmod * tmod + tsky * tsky) * (tmod + tsky); // eq. 3
      const tground = tamb + tgrat * (tmod - tamb);
      const hground = em * sb * (tmod * tmod + tground * tground) * (tmod + tground); // eq. 4
      const hsum = hconv + hsky + hground;
      const eigen = (-hsum / cap) * dtSeconds; // eq. 8
      const ex = eigen > -10 ? Math.exp(eigen) : 0;
      // eq. 7: response to a linear change of absorbed irradiance over the step
      const next = tmod0 * ex + ((1 - ex) * (hconv * tamb + hsky * tsky + hground * tground + sun0 + (sun - sun0) / eigen) + sun - sun0) / hsum;
      const done = Math.abs(next - tmod) < FUENTES.toleranceK;
      tmod = next;
      if (done) break;
    }
    out[i] = tmod - KELVIN;
    tmod0 = tmod;
    sun0 = sun;
  }
  return out;
}
