import { eq } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { moduleModel } from "@/db/schema";
import {
  csvTextFromUpload,
  exportInvertersCsv,
  exportModulesCsv,
  importInvertersCsv,
  importModulesCsv,
  listInverters,
  listModules,
} from "@/server/catalog";
import { db } from "@/server/db";
import { HttpError } from "@/server/errors";
import { newCompany } from "../support/fixtures";

const DEMO_COMPANY_ID = "7a11a55e-0000-4000-8000-000000000001";
const HEADER = "manufacturer,model,stc_watts,voc_v,isc_a,vmp_v,imp_a,gamma_pmax_pct_per_c,beta_voc_pct_per_c,length_mm,width_mm,cell_technology,construction,encapsulant";
const row = (model: string, over: Partial<Record<"stc" | "vmp" | "beta" | "tech", string>> = {}) =>
  `Testfield,${model},${over.stc ?? "400"},37.5,13.6,${over.vmp ?? "31.2"},12.82,-0.30,${over.beta ?? "-0.25"},1722,1134,${over.tech ?? "topcon"},glass_glass,POE`;

describe("module CSV import", () => {
  it("all-or-nothing: a bad row is reported by line and column and nothing is imported", async () => {
    const owner = await newCompany("CSV Strict Solar");
    const csv = [HEADER, row("TF-1"), row("TF-2", { vmp: "39" }), "", row("TF-3", { tech: "amorphous" })].join("\r\n");
    const report = await importModulesCsv(owner, csv, "all_or_nothing");
    expect(report.applied).toBe(false);
    expect(report.rowsRead).toBe(3);
    expect(report.created).toEqual([]);
    expect(report.errors).toEqual([
      { line: 3, column: "vmp_v", message: expect.stringMatching(/Vmp .* below Voc/) },
      { line: 3, column: "stc_watts", message: expect.stringMatching(/Vmp × Imp \(500 W\) differ by more than 3 %/) },
      { line: 5, column: "cell_technology", message: expect.stringMatching(/Cell technology must be one of/) },
    ]);
    expect(await listModules(owner.companyId)).toEqual([]);
  });

  it("good rows only: imports the good rows in one go and still lists the bad ones", async () => {
    const owner = await newCompany("CSV Lenient Solar");
    const csv = [HEADER, row("TF-1"), row("TF-2", { stc: "abc" }), row("TF-3"), row("TF-1")].join("\n");
    const report = await importModulesCsv(owner, csv, "good_rows");
    expect(report.applied).toBe(true);
    expect(report.created.map((c) => [c.line, c.model])).toEqual([
      [2, "TF-1"],
      [4, "TF-3"],
    ]);
    expect(report.errors.map((e) => [e.line, e.column])).toEqual([
      [3, "stc_watts"],
      [5, "model"],
    ]);
    expect(report.errors[1].message).toMatch(/already on line 2/);
    expect((await listModules(owner.companyId)).map((m) => m.model)).toEqual(["TF-1", "TF-3"]);
  });

  it("an existing manufacturer and model is updated and reported as updated", async () => {
    const owner = await newCompany("CSV Upsert Solar");
    await importModulesCsv(owner, [HEADER, row("TF-1")].join("\n"), "all_or_nothing");
    const report = await importModulesCsv(owner, [HEADER, row("TF-1", { beta: "-0.27" }), row("TF-9")].join("\n"), "all_or_nothing");
    expect(report.updated.map((u) => u.model)).toEqual(["TF-1"]);
    expect(report.created.map((u) => u.model)).toEqual(["TF-9"]);
    const rows = await db().select().from(moduleModel).where(eq(moduleModel.companyId, owner.companyId));
    expect(rows.length).toBe(2);
    expect(rows.find((r) => r.model === "TF-1")?.betaVocPctPerC).toBe(-0.27);
  });

  it("refuses a file with a missing or unknown column, whatever the mode", async () => {
    const owner = await newCompany("CSV Header Solar");
    const noVoc = HEADER.replace("voc_v,", "") + ",colour";
    const report = await importModulesCsv(owner, [noVoc, "x"].join("\n"), "good_rows");
    expect(report.applied).toBe(false);
    expect(report.errors.map((e) => [e.line, e.column])).toEqual(
      expect.arrayContaining([
        [1, "colour"],
        [1, "voc_v"],
      ]),
    );
    expect(await listModules(owner.companyId)).toEqual([]);
  });

  it("refuses binary uploads by content, and reads a UTF-8 BOM", async () => {
    const pdf = new TextEncoder().encode("%PDF-1.7\n1 0 obj\n<<>>\nendobj\n");
    const err = await csvTextFromUpload(pdf).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(HttpError);
    expect((err as HttpError).status).toBe(415);
    const owner = await newCompany("CSV BOM Solar");
    const text = await csvTextFromUpload(new TextEncoder().encode(`\uFEFF${HEADER}\n${row("TF-1")}\n`));
    expect((await importModulesCsv(owner, text, "all_or_nothing")).created.length).toBe(1);
  });
});

describe("the Voc coefficient's unit and the series fuse rating", () => {
  const UNIT_HEADER = "manufacturer,model,stc_watts,voc_v,isc_a,vmp_v,imp_a,gamma_pmax_pct_per_c,voc_coeff,max_series_fuse_a,length_mm,width_mm,cell_technology,construction,encapsulant";
  const unitRow = (model: string, coeff: string, fuse = "25") => `Testfield,${model},400,37.5,13.6,31.2,12.82,-0.30,${coeff},${fuse},1722,1134,topcon,glass_glass,POE`;

  it("reads %/°C, mV/°C and V/°C (and /K), keeps the unit as typed and the engine's %/°C beside it", async () => {
    const owner = await newCompany("CSV Units Solar");
    const csv = [UNIT_HEADER, unitRow("TF-PCT", "-0.26 %/°C"), unitRow("TF-MV", "-97.5 mV/°C", "20"), unitRow("TF-V", "-0.0975 V/K", ""), unitRow("TF-BARE", "-0.28")].join("\n");
    const report = await importModulesCsv(owner, csv, "all_or_nothing");
    expect(report.errors).toEqual([]);
    const byModel = Object.fromEntries((await listModules(owner.companyId)).map((m) => [m.model, m]));
    expect(byModel["TF-PCT"]).toMatchObject({ vocCoeff: { value: -0.26, unit: "%/°C" }, betaVocPctPerC: -0.26, maxSeriesFuseA: 25 });
    // −97.5 mV/°C of a 37.5 V Voc = −0.26 %/°C.
    expect(byModel["TF-MV"]).toMatchObject({ vocCoeff: { value: -97.5, unit: "mV/°C" }, betaVocPctPerC: -0.26, maxSeriesFuseA: 20 });
    expect(byModel["TF-V"]).toMatchObject({ vocCoeff: { value: -0.0975, unit: "V/°C" }, betaVocPctPerC: -0.26, maxSeriesFuseA: null });
    expect(byModel["TF-BARE"]).toMatchObject({ vocCoeff: { value: -0.28, unit: "%/°C" }, betaVocPctPerC: -0.28 });
  });

  it("refuses a coefficient without a readable unit, one whose unit makes it implausible, and a row with none", async () => {
    const owner = await newCompany("CSV Bad Units Solar");
    const noCoeff = UNIT_HEADER.replace(",voc_coeff", "");
    const report = await importModulesCsv(owner, [UNIT_HEADER, unitRow("TF-1", "-0.26 furlongs"), unitRow("TF-2", "-97.5 %/°C"), unitRow("TF-3", "-0.26 mV/°C")].join("\n"), "good_rows");
    expect(report.created).toEqual([]);
    expect(report.errors).toEqual([
      { line: 2, column: "voc_coeff", message: expect.stringMatching(/voc_coeff must be a number with its unit/) },
      { line: 2, column: "voc_coeff", message: "Enter the Voc temperature coefficient with its unit" },
      { line: 3, column: "voc_coeff", message: expect.stringMatching(/-97\.5 %\/°C is -97\.5 %\/°C of the 37\.5 V Voc; expected -0\.6 to -0\.1 %\/°C/) },
      { line: 4, column: "voc_coeff", message: expect.stringMatching(/-0\.26 mV\/°C is -0\.001 %\/°C/) },
    ]);
    const none = await importModulesCsv(owner, [noCoeff, "Testfield,TF-4,400,37.5,13.6,31.2,12.82,-0.30,25,1722,1134,topcon,glass_glass,POE"].join("\n"), "good_rows");
    expect(none.errors).toEqual([{ line: 2, column: "voc_coeff", message: "Enter the Voc temperature coefficient with its unit" }]);
  });
});

describe("CSV round trip", () => {
  it("export → import into another company → export gives the same file, for modules and inverters", async () => {
    const modulesCsv = await exportModulesCsv(DEMO_COMPANY_ID);
    const invertersCsv = await exportInvertersCsv(DEMO_COMPANY_ID);
    expect(modulesCsv.split("\r\n")[0]).toBe(HEADER.replace("beta_voc_pct_per_c", "beta_voc_pct_per_c,voc_coeff,max_series_fuse_a") + ",active");
    expect(modulesCsv.split("\r\n").length).toBe(5);

    const other = await newCompany("Round Trip Solar");
    const m = await importModulesCsv(other, modulesCsv, "all_or_nothing");
    const i = await importInvertersCsv(other, invertersCsv, "all_or_nothing");
    expect(m.errors).toEqual([]);
    expect(i.errors).toEqual([]);
    expect(m.created.length).toBe(4);
    expect(i.created.length).toBe(3);
    expect(await exportModulesCsv(other.companyId)).toBe(modulesCsv);
    expect(await exportInvertersCsv(other.companyId)).toBe(invertersCsv);

    const strip = <T extends { id: string; companyId: string; createdAt: Date; updatedAt: Date }>({ id, companyId, createdAt, updatedAt, ...rest }: T) => {
      void [id, companyId, createdAt, updatedAt];
      return rest;
    };
    expect((await listModules(other.companyId)).map(strip)).toEqual((await listModules(DEMO_COMPANY_ID)).map(strip));
    expect((await listInverters(other.companyId)).map(strip)).toEqual((await listInverters(DEMO_COMPANY_ID)).map(strip));

    // Importing the same file again updates every row and creates none.
    const again = await importModulesCsv(other, modulesCsv, "all_or_nothing");
    expect(again.updated.length).toBe(4);
    expect(again.created.length).toBe(0);
  });

  it("an inverter row with the other kind's columns filled is reported", async () => {
    const owner = await newCompany("CSV Kind Solar");
    const csv = [
      "manufacturer,model,kind,ac_watts,efficiency_pct,max_dc_voltage_v,mppt_min_v,mppt_max_v,max_input_current_a,mppt_count,dc_input_min_v,dc_input_max_v,modules_per_unit",
      "T,M1,micro,320,96.5,600,,,,,16,60,1",
    ].join("\n");
    const report = await importInvertersCsv(owner, csv, "all_or_nothing");
    expect(report.errors).toEqual([{ line: 2, column: "max_dc_voltage_v", message: expect.stringMatching(/Leave max_dc_voltage_v empty for a micro/) }]);
  });
});
