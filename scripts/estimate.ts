/**
 * Command-line production estimate for one roof face (PVWatts v5 model, Perez 1990 sky).
 *
 *   npm run estimate -- --weather FILE [--format epw|tmy3|csv] [--lat --lon --elev --utc-offset]
 *     --tilt 20 --azimuth 180 --dc-kw 4 --module standard|premium|thin-film --mount roof|open-rack
 *     --losses 14.08 --inverter-eff 96 --dc-ac 1.2 [--albedo 0.2] [--model perez|haydavies|isotropic]
 *     [--json] [--hourly FILE.csv]
 *
 * Exit code 1 on bad input, with every problem listed.
 */
import { readFileSync, writeFileSync } from "node:fs";
import { parseArgs } from "node:util";
import { z } from "zod";
import { EngineInputError } from "../src/engine/errors";
import { estimateProduction } from "../src/engine/production";
import { detectWeatherFormat, parseWeather } from "../src/engine/weather";

const USAGE = `usage: npm run estimate -- --weather FILE [--format epw|tmy3|csv]
  [--lat DEG --lon DEG --elev M --utc-offset H]   (required for a generic CSV)
  --tilt DEG --azimuth DEG --dc-kw KW [--module standard|premium|thin-film] [--mount roof|open-rack]
  [--losses PCT] [--inverter-eff PCT] [--dc-ac RATIO] [--albedo 0-1] [--model perez|haydavies|isotropic]
  [--json] [--hourly OUT.csv]`;

const num = (name: string) =>
  z
    .string({ error: `--${name} is required` })
    .trim()
    .min(1, `--${name} needs a value`)
    .transform((s, ctx) => {
      const v = Number(s);
      if (!Number.isFinite(v)) {
        ctx.addIssue({ code: "custom", message: `--${name} must be a number, got "${s}"` });
        return z.NEVER;
      }
      return v;
    });

const argsSchema = z.object({
  weather: z.string({ error: "--weather FILE is required" }).min(1),
  format: z.enum(["epw", "tmy3", "csv"]).optional(),
  lat: num("lat").pipe(z.number().min(-90).max(90)).optional(),
  lon: num("lon").pipe(z.number().min(-180).max(180)).optional(),
  elev: num("elev").pipe(z.number().min(-500).max(9000)).optional(),
  "utc-offset": num("utc-offset").pipe(z.number().min(-12).max(14)).optional(),
  tilt: num("tilt").pipe(z.number().min(0).max(90)),
  azimuth: num("azimuth").pipe(z.number().min(0).max(360)),
  "dc-kw": num("dc-kw").pipe(z.number().gt(0).max(10_000)),
  module: z.enum(["standard", "premium", "thin-film"]).default("standard"),
  mount: z.enum(["roof", "open-rack"]).default("roof"),
  losses: num("losses").pipe(z.number().min(0).max(99)).default(14.08),
  "inverter-eff": num("inverter-eff").pipe(z.number().min(80).max(99.5)).default(96),
  "dc-ac": num("dc-ac").pipe(z.number().min(0.5).max(3)).default(1.2),
  albedo: num("albedo").pipe(z.number().min(0).max(1)).optional(),
  model: z.enum(["perez", "haydavies", "isotropic"]).default("perez"),
  json: z.boolean().default(false),
  hourly: z.string().min(1).optional(),
});

function fail(lines: string[]): never {
  for (const l of lines) console.error(`error: ${l}`);
  console.error(USAGE);
  process.exit(1);
}

/** Let "--lon -105.2" through: parseArgs would read the negative number as an option. */
function joinNegativeNumbers(argv: string[]): string[] {
  const out: string[] = [];
  for (let i = 0; i < argv.length; i++) {
    const next = argv[i + 1];
    if (argv[i].startsWith("--") && !argv[i].includes("=") && next !== undefined && /^-\d|^-\.\d/.test(next)) {
      out.push(`${argv[i]}=${next}`);
      i++;
    } else out.push(argv[i]);
  }
  return out;
}

function main(): void {
  let values: Record<string, string | boolean | undefined>;
  try {
    ({ values } = parseArgs({
      args: joinNegativeNumbers(process.argv.slice(2)),
      options: {
        weather: { type: "string" },
        format: { type: "string" },
        lat: { type: "string" },
        lon: { type: "string" },
        elev: { type: "string" },
        "utc-offset": { type: "string" },
        tilt: { type: "string" },
        azimuth: { type: "string" },
        "dc-kw": { type: "string" },
        module: { type: "string" },
        mount: { type: "string" },
        losses: { type: "string" },
        "inverter-eff": { type: "string" },
        "dc-ac": { type: "string" },
        albedo: { type: "string" },
        model: { type: "string" },
        json: { type: "boolean" },
        hourly: { type: "string" },
        help: { type: "boolean", short: "h" },
      },
      strict: true,
      allowPositionals: false,
    }));
  } catch (e) {
    fail([(e as Error).message]);
  }
  if (values.help) {
    console.log(USAGE);
    return;
  }
  const parsed = argsSchema.safeParse(values);
  if (!parsed.success) fail(parsed.error.issues.map((i) => (i.path.length ? `--${i.path.join(".")}: ${i.message}` : i.message)));
  const a = parsed.data;

  let text: string;
  try {
    text = readFileSync(a.weather, "utf8");
  } catch (e) {
    fail([`cannot read weather file ${a.weather}: ${(e as Error).message}`]);
  }
  const format = a.format ?? detectWeatherFormat(text);
  if (format === "csv") {
    const flags = { lat: "latitude", lon: "longitude", elev: "elevation (m)", "utc-offset": "UTC offset (h)" } as const;
    const missing = (Object.keys(flags) as (keyof typeof flags)[]).filter((k) => a[k] === undefined);
    if (missing.length) fail(missing.map((k) => `--${k} is required for a generic CSV weather file (the site's ${flags[k]})`));
  }
  const site = {
    ...(a.lat !== undefined && { latitude: a.lat }),
    ...(a.lon !== undefined && { longitude: a.lon }),
    ...(a.elev !== undefined && { elevationM: a.elev }),
    ...(a["utc-offset"] !== undefined && { utcOffsetHours: a["utc-offset"] }),
  };

  try {
    const weather = parseWeather(text, { format, site });
    // One face of equal modules; the module split does not change a string-inverter result.
    const dcW = a["dc-kw"] * 1000;
    const moduleCount = Math.max(1, Math.ceil(dcW / 1000));
    const result = estimateProduction(weather, {
      faces: [{ tiltDeg: a.tilt, azimuthDeg: a.azimuth, moduleCount, moduleWatts: dcW / moduleCount, moduleType: a.module, mount: a.mount }],
      inverter: { kind: "string", dcAcRatio: a["dc-ac"], efficiencyPct: a["inverter-eff"] },
      losses: { totalPct: a.losses },
      transposition: a.model,
      albedo: a.albedo,
    }, { faceHours: Boolean(a.hourly) });

    if (a.hourly) {
      const f = result.faces[0].hours;
      if (!f) throw new Error("face hours missing");
      const rows = ["month,day,hour,poa,t_cell,dc_w,ac_w"];
      for (let i = 0; i < result.hourlyAcW.length; i++) {
        rows.push(
          `${weather.month[i]},${weather.day[i]},${weather.hour[i]},${f.poa[i].toFixed(3)},${f.cellTempC[i].toFixed(3)},${result.hourlyDcW[i].toFixed(3)},${result.hourlyAcW[i].toFixed(3)}`,
        );
      }
      writeFileSync(a.hourly, rows.join("\n") + "\n");
    }

    const round = (v: number, d = 2) => Math.round(v * 10 ** d) / 10 ** d;
    if (a.json) {
      console.log(
        JSON.stringify({
          annualAcKwh: round(result.annualAcKwh),
          monthlyAcKwh: result.monthlyAcKwh.map((v) => round(v)),
          annualPoaKwhPerM2: round(result.annualPoaKwhPerM2),
        }),
      );
    } else {
      const months = ["Jan", "Feb", "Mar", "Apr", "May", "Jun", "Jul", "Aug", "Sep", "Oct", "Nov", "Dec"];
      console.log(`weather: ${weather.sourceLabel} (${format}), lat ${weather.site.latitude}, lon ${weather.site.longitude}, UTC${weather.site.utcOffsetHours >= 0 ? "+" : ""}${weather.site.utcOffsetHours}`);
      for (const note of weather.notes) console.log(`  note: ${note}`);
      console.log(`system: ${round(result.dcKw, 3)} kW DC, ${round(result.acKw, 3)} kW AC, losses ${round(result.lossPct)} %, ${a.model} sky`);
      console.log(`plane of array: ${round(result.annualPoaKwhPerM2, 1)} kWh/m² a year`);
      result.monthlyAcKwh.forEach((v, m) => console.log(`  ${months[m]}  ${v.toFixed(1).padStart(8)} kWh`));
      console.log(`annual AC: ${result.annualAcKwh.toFixed(1)} kWh (${result.kwhPerKw.toFixed(0)} kWh/kW; clipped ${result.clippedKwh.toFixed(1)} kWh)`);
      if (a.hourly) console.log(`hourly results written to ${a.hourly}`);
    }
  } catch (e) {
    if (e instanceof EngineInputError) fail(e.issues.map((i) => (i.path ? `${i.path}: ${i.message}` : i.message)));
    throw e;
  }
}

main();
