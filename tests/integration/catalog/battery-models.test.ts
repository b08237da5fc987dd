import { describe, expect, it } from "vitest";
import { createBattery, exportBatteriesCsv, getBatteryOrThrow, importBatteriesCsv, listBatteries, patchBattery } from "@/server/battery-catalog";
import { newCompany, rejects } from "../support/fixtures";

const HEADER = "manufacturer,model,usable_kwh,continuous_kw,peak_kw,round_trip_efficiency_pct,depth_of_discharge_pct,warranty_years,warranty_throughput_mwh,coupling";
const row = (model: string, over: Partial<Record<"peak" | "coupling" | "throughput", string>> = {}) => `Testvolt,${model},13.5,5,${over.peak ?? "7"},90,100,10,${over.throughput ?? "37.8"},${over.coupling ?? "ac"}`;

describe("battery catalog CSV (the modules' and inverters' import machinery)", () => {
  it("all-or-nothing: bad rows are named by line and column, and nothing is written", async () => {
    const owner = await newCompany("Battery CSV Strict Solar");
    const report = await importBatteriesCsv(owner, [HEADER, row("TV-1"), row("TV-2", { peak: "4" }), row("TV-3", { coupling: "hybrid" })].join("\n"), "all_or_nothing");
    expect(report.applied).toBe(false);
    expect(report.errors).toEqual([
      { line: 3, column: "peak_kw", message: "Peak power (4 kW) cannot be below the continuous power (5 kW)" },
      { line: 4, column: "coupling", message: "Coupling must be ac or dc" },
    ]);
    expect(await listBatteries(owner.companyId)).toEqual([]);
  });

  it("imports, updates by manufacturer and model on a second file, and exports what it read", async () => {
    const owner = await newCompany("Battery CSV Round Trip Solar");
    const first = await importBatteriesCsv(owner, [HEADER, row("TV-1"), row("TV-2", { throughput: "", coupling: "dc" })].join("\r\n"), "all_or_nothing");
    expect(first.created.map((c) => [c.line, c.model])).toEqual([
      [2, "TV-1"],
      [3, "TV-2"],
    ]);
    const second = await importBatteriesCsv(owner, [`${HEADER},active`, `${row("TV-1", { peak: "8" })},false`].join("\n"), "all_or_nothing");
    expect([second.created.length, second.updated.map((u) => u.model)]).toEqual([0, ["TV-1"]]);
    const rows = await listBatteries(owner.companyId);
    expect(rows.map((r) => [r.model, r.peakKw, r.active, r.warrantyThroughputMwh, r.coupling])).toEqual([
      ["TV-1", 8, false, 37.8, "ac"],
      ["TV-2", 7, true, null, "dc"],
    ]);
    expect(await listBatteries(owner.companyId, { activeOnly: true })).toHaveLength(1);
    const csv = await exportBatteriesCsv(owner.companyId);
    expect(csv.split("\r\n")).toEqual([`${HEADER},active`, `${row("TV-1", { peak: "8" })},false`, `${row("TV-2", { throughput: "", coupling: "dc" })},true`]);
    // The exported file imports back unchanged.
    const again = await importBatteriesCsv(owner, csv, "all_or_nothing");
    expect([again.created.length, again.updated.length, again.errors]).toEqual([0, 2, []]);
  });

  it("keeps each company's batteries to itself, and refuses a duplicate model", async () => {
    const owner = await newCompany("Battery Tenancy Solar");
    const other = await newCompany("Battery Other Solar");
    const b = await createBattery(owner, { manufacturer: "Testvolt", model: "TV-9", usableKwh: 10, continuousKw: 5, peakKw: 7, roundTripEfficiencyPct: 90, depthOfDischargePct: 95, warrantyYears: 10, coupling: "dc" });
    await rejects(getBatteryOrThrow(other.companyId, b.id), 404);
    await rejects(patchBattery(other, b.id, { active: false }), 404);
    await createBattery(owner, { manufacturer: "Testvolt", model: "TV-10", usableKwh: 10, continuousKw: 5, peakKw: 7, roundTripEfficiencyPct: 90, depthOfDischargePct: 95, warrantyYears: 10, coupling: "ac" });
    await rejects(patchBattery(owner, b.id, { model: "TV-10" }), 409, "duplicate_model");
    expect((await patchBattery(owner, b.id, { usableKwh: 12 })).usableKwh).toBe(12);
  });
});
