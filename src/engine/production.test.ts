import { readFileSync } from "node:fs";
import { fileURLToPath } from "node:url";
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { EngineInputError } from "./errors";
import { estimateProduction, productionByYear, productionInYear, type SystemDesign } from "./production";
import { parseWeather } from "./weather";
import { readCsvRecords } from "./csv";

const root = fileURLToPath(new URL("../../", import.meta.url));

// NREL PVWatts hourly result, Denver (tests/fixtures/weather/README.md): 4 kW DC, standard module,
// open rack, tilt 20°, azimuth 180°, losses 14.08 %, inverter 96 %, DC/AC 1.2, lat 39.73,
// lon −105.18, 1819.6 m. Columns: month, day, hour, beam, diffuse, air temp, wind, POA, cell temp, DC, AC.
const records = readCsvRecords(readFileSync(root + "tests/fixtures/weather/pvwatts-8760-rackmount-denver.csv", "utf8"));
const start = records.findIndex((r) => r.cells.slice(0, 3).join(",") === "Month,Day,Hour") + 1;
const ref = records.slice(start, start + 8760).map((r) => r.cells.map(Number));
const denverSite = { latitude: 39.73, longitude: -105.18, elevationM: 1819.6, utcOffsetHours: -7 };
// The file's own beam, diffuse, temperature and wind as a generic hourly CSV (no GHI column: derived).
const denverCsv = ["month,day,hour,dni,dhi,temp_air,wind_speed", ...ref.map((r) => r.slice(0, 7).join(","))].join("\n");
const denver = parseWeather(denverCsv, { site: denverSite, sourceLabel: "PVWatts Denver inputs" });
const denverSystem: SystemDesign = {
  faces: [{ tiltDeg: 20, azimuthDeg: 180, moduleCount: 10, moduleWatts: 400, moduleType: "standard", mount: "open-rack" }],
  inverter: { kind: "string", dcAcRatio: 1.2, efficiencyPct: 96 },
  losses: { totalPct: 14.08 },
};

function rmseMbe(model: ArrayLike<number>, col: number): { rmse: number; mbe: number } {
  let se = 0;
  let sb = 0;
  for (let i = 0; i < 8760; i++) {
    const d = model[i] - ref[i][col];
    se += d * d;
    sb += d;
  }
  return { rmse: Math.sqrt(se / 8760), mbe: sb / 8760 };
}

describe("reproduces the NREL PVWatts hourly result for Denver (open rack, 4 kW)", () => {
  const r = estimateProduction(denver, denverSystem, { faceHours: true });
  const refAnnualAc = ref.reduce((s, x) => s + x[10], 0) / 1000; // 6,023.67 kWh (file's Totals row)
  const refMonthly = new Array<number>(12).fill(0);
  for (const x of ref) refMonthly[x[0] - 1] += x[10] / 1000;

  it("annual AC within ±2 % of 6,023.67 kWh", () => {
    expect(refAnnualAc).toBeCloseTo(6023.67124, 3);
    const err = r.annualAcKwh / refAnnualAc - 1;
    console.log(`Denver annual AC ${r.annualAcKwh.toFixed(2)} kWh vs PVWatts ${refAnnualAc.toFixed(2)} kWh (${(err * 100).toFixed(2)} %)`);
    expect(Math.abs(err)).toBeLessThan(0.02);
  });

  it("every month within ±4 %", () => {
    const errs = r.monthlyAcKwh.map((v, m) => v / refMonthly[m] - 1);
    console.log(`Denver monthly AC error %: ${errs.map((e) => (e * 100).toFixed(2)).join(" ")}`);
    for (const e of errs) expect(Math.abs(e)).toBeLessThan(0.04);
  });

  it("hourly POA, cell temperature and AC errors (recorded)", () => {
    const f = r.faces[0].hours;
    if (!f) throw new Error("face hours missing");
    const poa = rmseMbe(f.poa, 7);
    const dc = rmseMbe(f.dcW, 9);
    const ac = rmseMbe(r.hourlyAcW, 10);
    let tMae = 0;
    let day = 0;
    for (let i = 0; i < 8760; i++) if (ref[i][7] > 0) (tMae += Math.abs(f.cellTempC[i] - ref[i][8])), day++;
    tMae /= day;
    console.log(
      `Denver hourly: POA RMSE ${poa.rmse.toFixed(2)} W/m², MBE ${poa.mbe.toFixed(3)} W/m²; ` +
        `cell temp MAE ${tMae.toFixed(3)} °C; DC RMSE ${dc.rmse.toFixed(2)} W; AC RMSE ${ac.rmse.toFixed(2)} W, MBE ${ac.mbe.toFixed(3)} W`,
    );
    expect(Math.abs(r.annualPoaKwhPerM2 / 1930.893574 - 1)).toBeLessThan(0.02); // file's POA total, Wh/m² → kWh/m²
    expect(poa.rmse).toBeLessThan(10);
    expect(ac.rmse).toBeLessThan(30); // 4 kW system: under 1 % of nameplate
  });

  it("other transposition models are available and land near Perez", () => {
    for (const transposition of ["haydavies", "isotropic"] as const) {
      const o = estimateProduction(denver, { ...denverSystem, transposition });
      expect(Math.abs(o.annualAcKwh / r.annualAcKwh - 1)).toBeLessThan(0.05);
    }
  });
});

describe("several roof faces, microinverters, solar access", () => {
  const gso = parseWeather(readFileSync(root + "src/engine/data/tmy3-723170-greensboro-nc.csv", "utf8"));
  const face = { tiltDeg: 25, azimuthDeg: 180, moduleCount: 10, moduleWatts: 400 };

  it("sums faces: two identical faces give twice one face", () => {
    const one = estimateProduction(gso, { faces: [face], inverter: { kind: "micro", acWattsPerModule: 350 } });
    const two = estimateProduction(gso, { faces: [face, { ...face, name: "garage" }], inverter: { kind: "micro", acWattsPerModule: 350 } });
    expect(two.annualAcKwh).toBeCloseTo(2 * one.annualAcKwh, 6);
    expect(two.faces[1].name).toBe("garage");
    expect(two.acKw).toBeCloseTo(7, 9);
  });

  it("east and west faces produce less than south; a 3-face string system clips above its AC rating never", () => {
    const r = estimateProduction(gso, {
      faces: [face, { ...face, azimuthDeg: 90 }, { ...face, azimuthDeg: 270, moduleType: "premium" }],
      inverter: { kind: "string", acKw: 9 },
    });
    expect(r.faces[1].annualDcKwh).toBeLessThan(r.faces[0].annualDcKwh);
    expect(r.faces[2].annualDcKwh).toBeLessThan(r.faces[0].annualDcKwh);
    expect(Math.max(...r.hourlyAcW)).toBeLessThanOrEqual(9000 + 1e-9);
    expect(r.monthlyAcKwh.reduce((s, v) => s + v, 0)).toBeCloseTo(r.annualAcKwh, 6);
    // Greensboro, 12 kW: specific yield of a mixed-orientation roof is typically 1,100–1,500 kWh/kW.
    expect(r.kwhPerKw).toBeGreaterThan(1000);
    expect(r.kwhPerKw).toBeLessThan(1600);
  });

  it("clips at a small string inverter and reports the clipped energy", () => {
    const r = estimateProduction(gso, { faces: [face], inverter: { kind: "string", acKw: 2 } });
    expect(Math.max(...r.hourlyAcW)).toBeCloseTo(2000, 6);
    expect(r.clippedKwh).toBeGreaterThan(0);
  });

  it("applies solar access: annual value and 12 monthly values", () => {
    const full = estimateProduction(gso, { faces: [face] });
    const half = estimateProduction(gso, { faces: [{ ...face, solarAccessPct: 50 }] });
    expect(half.faces[0].annualPoaKwhPerM2).toBeCloseTo(full.faces[0].annualPoaKwhPerM2 / 2, 6);
    const winterShade = estimateProduction(gso, { faces: [{ ...face, solarAccessPct: [50, 50, 100, 100, 100, 100, 100, 100, 100, 100, 100, 50] }] });
    expect(winterShade.monthlyAcKwh[5]).toBeCloseTo(full.monthlyAcKwh[5], 6);
    expect(winterShade.monthlyAcKwh[0]).toBeLessThan(full.monthlyAcKwh[0] * 0.6);
  });

  it("face hours only on request; scratch reuse never leaks between calls", () => {
    const a = estimateProduction(gso, { faces: [face, { ...face, azimuthDeg: 90 }] });
    expect(a.faces[0].hours).toBeUndefined();
    const b = estimateProduction(gso, { faces: [face, { ...face, azimuthDeg: 90 }] }, { faceHours: true });
    const c = estimateProduction(gso, { faces: [{ ...face, azimuthDeg: 270 }] });
    expect(b.faces[1].hours?.dcW.reduce((s, v) => s + v, 0)).toBeCloseTo(b.faces[1].annualDcKwh * 1000, 3);
    expect(a.annualAcKwh).toBeCloseTo(b.annualAcKwh, 9);
    expect(c.annualAcKwh).not.toBeCloseTo(a.annualAcKwh, 0);
    expect(b.faces[0].monthlyDcKwh.reduce((s, v) => s + v, 0)).toBeCloseTo(b.faces[0].annualDcKwh, 6);
  });

  it("a catalog module's temperature coefficient overrides the module type", () => {
    const std = estimateProduction(gso, { faces: [{ ...face, moduleType: "standard" }] });
    const cat = estimateProduction(gso, { faces: [{ ...face, gammaPctPerC: -0.47 }] });
    expect(cat.annualAcKwh).toBeCloseTo(std.annualAcKwh, 6);
  });

  it("names every bad field", () => {
    try {
      estimateProduction(gso, {
        faces: [{ tiltDeg: 95, azimuthDeg: 180, moduleCount: 0, moduleWatts: 400, solarAccessPct: [100, 100] }],
        inverter: { kind: "string", efficiencyPct: 150 },
      });
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(EngineInputError);
      const paths = (e as EngineInputError).issues.map((i) => i.path);
      expect(paths).toEqual(expect.arrayContaining(["faces.0.tiltDeg", "faces.0.moduleCount", "faces.0.solarAccessPct", "inverter.efficiencyPct"]));
    }
  });

  it("never yields NaN or Infinity for valid designs", () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0, max: 90, noNaN: true }),
        fc.double({ min: 0, max: 360, noNaN: true }),
        fc.integer({ min: 1, max: 60 }),
        fc.double({ min: 0, max: 100, noNaN: true }),
        fc.constantFrom("roof" as const, "open-rack" as const),
        fc.constantFrom("perez" as const, "haydavies" as const, "isotropic" as const),
        (tiltDeg, azimuthDeg, moduleCount, access, mount, transposition) => {
          const r = estimateProduction(gso, { faces: [{ tiltDeg, azimuthDeg, moduleCount, moduleWatts: 420, solarAccessPct: access, mount }], transposition }, { faceHours: true });
          return Number.isFinite(r.annualAcKwh) && r.hourlyAcW.every(Number.isFinite) && (r.faces[0].hours?.cellTempC.every(Number.isFinite) ?? false);
        },
      ),
      { numRuns: 25 },
    );
  });
});

describe("degradation (Jordan & Kurtz 2013 median 0.5 %/yr)", () => {
  it("year n = first year × (1 − 0.005)^(n − 1)", () => {
    expect(productionInYear(1000, 1)).toBe(1000);
    expect(productionInYear(1000, 2)).toBeCloseTo(995, 9);
    expect(productionInYear(1000, 25)).toBeCloseTo(1000 * 0.995 ** 24, 9);
    expect(productionByYear(1000, 3, 1)).toEqual([1000, 990, 980.1]);
    expect(() => productionInYear(-1, 0, 50)).toThrow(/firstYearKwh[\s\S]*year[\s\S]*degradationPctPerYear/);
  });
});
