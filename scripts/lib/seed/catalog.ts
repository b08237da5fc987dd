// Demo equipment catalog for Tallgrass Bright Energy: four modules and three inverters.
// Manufacturers and models are invented; the values are in the range of current
// residential datasheets (Vmp × Imp within 0.1 % of the rating). The maximum series fuse ratings
// and the Voc coefficients' units are invented too (datasheets print %/°C, mV/°C or V/°C).
import { inverterModel, moduleModel } from "../../../src/db/schema";
import { vocCoefficientPctPerC } from "../../../src/engine/module-coefficients";
import type { SeedContext } from "../seed-demo";

export const order = 10;

/** Fixed ids (seeding is idempotent): modules …001001–001004, inverters …001011–001013. */
const uid = (n: number) => `7a11a55e-0000-4000-8000-${String(n).padStart(12, "0")}`;

export const DEMO_MODULE_IDS = { topcon410: uid(1001), perc395: uid(1002), hjt430: uid(1003), backContact370: uid(1004) } as const;
export const DEMO_INVERTER_IDS = { string7600: uid(1011), string11400: uid(1012), micro320: uid(1013) } as const;

/** A Voc coefficient typed in mV/°C or V/°C, with the %/°C figure the catalog form would store beside it. */
function absoluteVocCoeff(value: number, unit: "mV/°C" | "V/°C", vocV: number) {
  const pct = Math.round(vocCoefficientPctPerC(value, unit, vocV) * 1e5) / 1e5;
  return { betaVocPctPerC: pct, vocCoeffValue: value, vocCoeffUnit: unit === "mV/°C" ? ("mv_per_c" as const) : ("v_per_c" as const) };
}

export async function seed(ctx: SeedContext): Promise<void> {
  const companyId = ctx.companyId;
  await ctx.tx.insert(moduleModel).values([
    {
      id: DEMO_MODULE_IDS.topcon410,
      companyId,
      manufacturer: "Prairieline",
      model: "PL-410T",
      stcWatts: 410,
      vocV: 38.2,
      iscA: 13.75,
      vmpV: 31.6,
      impA: 12.98,
      gammaPmaxPctPerC: -0.3,
      betaVocPctPerC: -0.25,
      vocCoeffValue: -0.25,
      maxSeriesFuseA: 25,
      lengthMm: 1722,
      widthMm: 1134,
      cellTechnology: "topcon",
      construction: "glass_glass",
      encapsulant: "POE",
    },
    {
      id: DEMO_MODULE_IDS.perc395,
      companyId,
      manufacturer: "Northmeadow",
      model: "NM-395M",
      stcWatts: 395,
      vocV: 41.0,
      iscA: 12.18,
      vmpV: 34.2,
      impA: 11.55,
      gammaPmaxPctPerC: -0.35,
      betaVocPctPerC: -0.27,
      vocCoeffValue: -0.27,
      maxSeriesFuseA: 20,
      lengthMm: 1879,
      widthMm: 1045,
      cellTechnology: "mono_perc",
      construction: "glass_backsheet",
      encapsulant: "EVA",
    },
    {
      id: DEMO_MODULE_IDS.hjt430,
      companyId,
      manufacturer: "Ashgrove Solar",
      model: "AG-430H",
      stcWatts: 430,
      vocV: 40.3,
      iscA: 13.4,
      vmpV: 33.9,
      impA: 12.69,
      gammaPmaxPctPerC: -0.26,
      ...absoluteVocCoeff(-97, "mV/°C", 40.3),
      maxSeriesFuseA: 25,
      lengthMm: 1762,
      widthMm: 1134,
      cellTechnology: "heterojunction",
      construction: "glass_glass",
      encapsulant: "POE",
    },
    {
      id: DEMO_MODULE_IDS.backContact370,
      companyId,
      manufacturer: "Kestrel Bay",
      model: "KB-370BC",
      stcWatts: 370,
      vocV: 43.6,
      iscA: 10.75,
      vmpV: 36.9,
      impA: 10.03,
      gammaPmaxPctPerC: -0.29,
      ...absoluteVocCoeff(-0.105, "V/°C", 43.6),
      maxSeriesFuseA: 20,
      lengthMm: 1690,
      widthMm: 1046,
      cellTechnology: "back_contact",
      construction: "glass_backsheet",
      encapsulant: "EVA",
    },
  ]);
  await ctx.tx.insert(inverterModel).values([
    // 600 V max DC: the NEC 690.7 limit for one- and two-family dwellings.
    {
      id: DEMO_INVERTER_IDS.string7600,
      companyId,
      manufacturer: "Ridgewater",
      model: "RW-7600S",
      kind: "string",
      acWatts: 7600,
      efficiencyPct: 97.5,
      maxDcVoltageV: 600,
      mpptMinV: 100,
      mpptMaxV: 550,
      maxInputCurrentA: 14,
      mpptCount: 2,
    },
    {
      id: DEMO_INVERTER_IDS.string11400,
      companyId,
      manufacturer: "Ridgewater",
      model: "RW-11400S",
      kind: "string",
      acWatts: 11400,
      efficiencyPct: 97.5,
      maxDcVoltageV: 600,
      mpptMinV: 100,
      mpptMaxV: 550,
      maxInputCurrentA: 14,
      mpptCount: 3,
    },
    {
      id: DEMO_INVERTER_IDS.micro320,
      companyId,
      manufacturer: "Lumenfield",
      model: "LF-320M",
      kind: "micro",
      acWatts: 320,
      efficiencyPct: 96.5,
      dcInputMinV: 16,
      dcInputMaxV: 60,
      modulesPerUnit: 1,
    },
  ]);
}
