// Balance-of-system parts against a real MariaDB: CSV import of every kind with its own columns,
// refusals by line and column, the export read back by the import, and tenancy.
import { describe, expect, it } from "vitest";
import { exportBosCsv, getBosPartOrThrow, importBosCsv, listBosParts, setBosPartActive } from "@/server/bos-catalog";
import { newCompany, rejects } from "../support/fixtures";

const HEADER = "manufacturer,model,kind,stock_lengths_mm,span_table,modules_per_unit,mlpe_function,rating_a,poles,material,insulation,size_awg,conduit_type,trade_size,purpose";
const RAIL = "Testrack,TR-1,rail,4200 5300,110/0:1830 140/30:1220,,,,,,,,,,";
const MLPE = "Testshut,TS-1,mlpe,,,1,rapid_shutdown,,,,,,,,";
const BREAKER = "Testbox,TB-40,breaker,,,,,40,2,,,,,,";
const WIRE = "Testwire,TW-10,conductor,,,,,,,cu,pv_wire,10,,,";
const CONDUIT = "Testpipe,TP-34,conduit,,,,,,,,,,emt,3/4,";
const LABEL = "Testsign,TS-RS,label,,,,,,,,,,,,rapid_shutdown";

describe("balance-of-system CSV", () => {
  it("imports each kind with its own fields and exports what the import reads back", async () => {
    const owner = await newCompany("BOS CSV Solar");
    const report = await importBosCsv(owner, [HEADER, RAIL, MLPE, BREAKER, WIRE, CONDUIT, LABEL].join("\r\n"), "all_or_nothing");
    expect(report.errors).toEqual([]);
    expect(report.created.map((c) => c.model)).toEqual(["TR-1", "TS-1", "TB-40", "TW-10", "TP-34", "TS-RS"]);
    const parts = await listBosParts(owner.companyId);
    const rail = parts.find((p) => p.model === "TR-1")!;
    expect(rail.details).toEqual({
      kind: "rail",
      stockLengthsMm: [4200, 5300],
      spanTable: [
        { windMph: 110, snowPsf: 0, maxSpanMm: 1830 },
        { windMph: 140, snowPsf: 30, maxSpanMm: 1220 },
      ],
    });
    expect(parts.find((p) => p.model === "TW-10")!.details).toEqual({ kind: "conductor", material: "cu", insulation: "pv_wire", sizeAwg: "10" });

    const csv = await exportBosCsv(owner.companyId);
    expect(csv).toContain("4200 5300");
    expect(csv).toContain("110/0:1830 140/30:1220");
    // The export goes back in unchanged: every row is an update, none is new, none is bad.
    const again = await importBosCsv(owner, csv, "all_or_nothing");
    expect(again.errors).toEqual([]);
    expect(again.created).toEqual([]);
    expect(again.updated).toHaveLength(6);
  });

  it("refuses by line and column: another kind's column, a span table typed wrong, an unknown kind", async () => {
    const owner = await newCompany("BOS Refusal Solar");
    const csv = [
      HEADER,
      "Testbox,TB-20,breaker,,,,,20,2,cu,,,,,", // material belongs to conductors
      "Testrack,TR-2,rail,4200,110-0-1830,,,,,,,,,,", // span table not wind/snow:span
      "Testbox,TB-X,switchboard,,,,,,,,,,,,",
      RAIL,
    ].join("\n");
    const report = await importBosCsv(owner, csv, "all_or_nothing");
    expect(report.applied).toBe(false);
    expect(report.errors).toEqual([
      { line: 2, column: "material", message: "Leave material empty for a breaker part" },
      { line: 3, column: "span_table", message: expect.stringMatching(/Span table entry "110-0-1830" must read wind\/snow:span/) },
      { line: 4, column: "kind", message: expect.stringMatching(/Kind must be one of: rail, splice/) },
    ]);
    expect(await listBosParts(owner.companyId)).toEqual([]);
    const lenient = await importBosCsv(owner, csv, "good_rows");
    expect(lenient.created.map((c) => [c.line, c.model])).toEqual([[5, "TR-1"]]);
  });

  it("keeps each company's parts to itself and deactivates instead of deleting", async () => {
    const owner = await newCompany("BOS Tenancy Solar");
    const other = await newCompany("BOS Other Solar");
    await importBosCsv(owner, [HEADER, BREAKER].join("\n"), "all_or_nothing");
    const [part] = await listBosParts(owner.companyId);
    await rejects(getBosPartOrThrow(other.companyId, part.id), 404);
    await rejects(setBosPartActive(other, part.id, false), 404);
    await setBosPartActive(owner, part.id, false);
    expect(await listBosParts(owner.companyId, true)).toEqual([]);
    expect(await listBosParts(owner.companyId)).toHaveLength(1);
  });
});
