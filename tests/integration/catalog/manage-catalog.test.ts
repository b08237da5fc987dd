import { and, eq } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { inverterModel, moduleModel } from "@/db/schema";
import { inverterModelSchema, moduleModelSchema, type ModuleModelInput } from "@/lib/schemas/catalog";
import {
  createInverter,
  createModule,
  getInverterOrThrow,
  getModuleOrThrow,
  listActiveInverters,
  listActiveModules,
  listInverters,
  listModules,
  patchInverter,
  patchModule,
  setModuleActive,
  updateModule,
} from "@/server/catalog";
import { db } from "@/server/db";
import { newCompany, rejects } from "../support/fixtures";

const DEMO_COMPANY_ID = "7a11a55e-0000-4000-8000-000000000001";


const goodModule: ModuleModelInput = {
  manufacturer: "Testfield",
  model: "TF-400",
  stcWatts: 400,
  vocV: 37.5,
  iscA: 13.6,
  vmpV: 31.2,
  impA: 12.82,
  gammaPmaxPctPerC: -0.3,
  betaVocPctPerC: -0.25,
  lengthMm: 1722,
  widthMm: 1134,
  cellTechnology: "topcon",
  construction: "glass_glass",
  encapsulant: "POE",
};

describe("module schema", () => {
  it("accepts a plausible datasheet", () => {
    expect(moduleModelSchema.safeParse(goodModule).success).toBe(true);
  });

  it("names the field for each physical slip", () => {
    const cases: [Partial<ModuleModelInput>, string, RegExp][] = [
      [{ vmpV: 38 }, "vmpV", /Vmp .* below Voc/],
      [{ impA: 14 }, "impA", /Imp .* below Isc/],
      [{ stcWatts: 430 }, "stcWatts", /3 %/],
      [{ gammaPmaxPctPerC: 0.3 }, "gammaPmaxPctPerC", /Pmax temperature coefficient/],
      [{ betaVocPctPerC: -2.5 }, "betaVocPctPerC", /Voc temperature coefficient/],
      [{ lengthMm: 900 }, "lengthMm", /efficiency/],
      [{ vocV: Number.NaN }, "vocV", /Enter Voc as a number/],
    ];
    for (const [change, field, message] of cases) {
      const r = moduleModelSchema.safeParse({ ...goodModule, ...change });
      expect(r.success, field).toBe(false);
      const issue = r.error?.issues.find((i) => i.path[0] === field);
      expect(issue?.message, field).toMatch(message);
    }
  });

  it("checks the MPPT window of a string inverter and the DC range of a micro", () => {
    const s = inverterModelSchema.safeParse({ kind: "string", manufacturer: "T", model: "S1", acWatts: 7600, efficiencyPct: 97, maxDcVoltageV: 500, mpptMinV: 100, mpptMaxV: 550, maxInputCurrentA: 14, mpptCount: 2 });
    expect(s.error?.issues.find((i) => i.path[0] === "mpptMaxV")?.message).toMatch(/cannot exceed the max DC voltage/);
    const s2 = inverterModelSchema.safeParse({ kind: "string", manufacturer: "T", model: "S1", acWatts: 7600, efficiencyPct: 97, maxDcVoltageV: 600, mpptMinV: 400, mpptMaxV: 300, maxInputCurrentA: 14, mpptCount: 2 });
    expect(s2.error?.issues.find((i) => i.path[0] === "mpptMinV")?.message).toMatch(/below the MPPT maximum/);
    const m = inverterModelSchema.safeParse({ kind: "micro", manufacturer: "T", model: "M1", acWatts: 320, efficiencyPct: 96.5, dcInputMinV: 60, dcInputMaxV: 16, modulesPerUnit: 1 });
    expect(m.error?.issues.find((i) => i.path[0] === "dcInputMinV")?.message).toMatch(/below the DC input maximum/);
  });

  it("the demo catalog passes its own checks", async () => {
    const modules = await listModules(DEMO_COMPANY_ID);
    const inverters = await listInverters(DEMO_COMPANY_ID);
    expect(modules.length).toBe(4);
    expect(inverters.length).toBe(3);
    for (const m of modules) expect(moduleModelSchema.safeParse(m).error?.issues ?? [], m.model).toEqual([]);
    for (const inv of inverters) {
      const input = Object.fromEntries(Object.entries(inv).filter(([, v]) => v !== null));
      expect(inverterModelSchema.safeParse(input).error?.issues ?? [], inv.model).toEqual([]);
    }
  });
});

describe("catalog writes", () => {
  it("creates, refuses a duplicate pair with 409, updates and checks the merged record", async () => {
    const owner = await newCompany("Catalog Writes Solar");
    const created = await createModule(owner, goodModule);
    expect(created).toMatchObject({ companyId: owner.companyId, manufacturer: "Testfield", stcWatts: 400, active: true });
    const dup = await rejects(createModule(owner, goodModule), 409);
    expect(dup.fields?.model?.[0]).toMatch(/already in the catalog/);

    const updated = await updateModule(owner, created.id, { ...goodModule, encapsulant: "" });
    expect(updated.encapsulant).toBeNull();

    // A patch that breaks Vmp < Voc is refused as a whole and changes nothing.
    const bad = await rejects(patchModule(owner, created.id, { vmpV: 40 }), 422);
    expect(bad.fields?.vmpV?.[0]).toMatch(/below Voc/);
    expect((await getModuleOrThrow(owner.companyId, created.id)).vmpV).toBe(31.2);

    const patched = await patchModule(owner, created.id, { model: "TF-400b" });
    expect(patched.model).toBe("TF-400b");
  });

  it("deactivation hides a module from new designs but keeps it readable", async () => {
    const owner = await newCompany("Deactivate Solar");
    const m = await createModule(owner, goodModule);
    await setModuleActive(owner, m.id, false);
    expect((await listActiveModules(owner.companyId)).map((r) => r.id)).not.toContain(m.id);
    expect((await getModuleOrThrow(owner.companyId, m.id)).active).toBe(false);
    await patchModule(owner, m.id, { active: true });
    expect((await listActiveModules(owner.companyId)).map((r) => r.id)).toContain(m.id);
  });

  it("stores a micro inverter without string fields, and a kind change through a patch is checked whole", async () => {
    const owner = await newCompany("Inverter Solar");
    const micro = await createInverter(owner, { kind: "micro", manufacturer: "T", model: "M1", acWatts: 320, efficiencyPct: 96.5, dcInputMinV: 16, dcInputMaxV: 60, modulesPerUnit: 1 });
    expect(micro.maxDcVoltageV).toBeNull();
    expect((await listActiveInverters(owner.companyId)).length).toBe(1);
    const err = await rejects(patchInverter(owner, micro.id, { kind: "string" }), 422);
    expect(Object.keys(err.fields ?? {})).toContain("maxDcVoltageV");
    const asString = await patchInverter(owner, micro.id, { kind: "string", acWatts: 3800, maxDcVoltageV: 600, mpptMinV: 100, mpptMaxV: 550, maxInputCurrentA: 14, mpptCount: 1 });
    expect(asString).toMatchObject({ kind: "string", dcInputMinV: null, modulesPerUnit: null, mpptCount: 1 });
  });
});

describe("tenancy", () => {
  it("another company's module or inverter is not found, for reads and writes", async () => {
    const a = await newCompany("Tenant A Solar");
    const b = await newCompany("Tenant B Solar");
    const m = await createModule(a, goodModule);
    const inv = await createInverter(a, { kind: "micro", manufacturer: "T", model: "M1", acWatts: 320, efficiencyPct: 96.5, dcInputMinV: 16, dcInputMaxV: 60, modulesPerUnit: 1 });
    await rejects(getModuleOrThrow(b.companyId, m.id), 404);
    await rejects(getInverterOrThrow(b.companyId, inv.id), 404);
    await rejects(setModuleActive(b, m.id, false), 404);
    await rejects(patchModule(b, m.id, { stcWatts: 401 }), 404);
    expect(await listModules(b.companyId)).toEqual([]);
    // Company B may add the same manufacturer and model: the pair is unique per company.
    await createModule(b, goodModule);
    const [row] = await db().select().from(moduleModel).where(and(eq(moduleModel.id, m.id), eq(moduleModel.companyId, a.companyId)));
    expect(row.active).toBe(true);
    expect((await db().select().from(inverterModel).where(eq(inverterModel.companyId, b.companyId))).length).toBe(0);
  });
});
