// The job packet's electrical design (issue #20 items 3, 4, 6): a string-inverter design and a
// microinverter design, each built into the packet (web shape and PDF) with its circuits, the
// single-line diagram on a tabloid page, the "checked by" line and the caution.
import { PDFDocument } from "pdf-lib";
import { beforeAll, describe, expect, it } from "vitest";
import type { Member } from "@/server/session";
import { newDeal, newWorld, setServicePanel, type World } from "../proposals/support";

type S = { jobs: typeof import("@/server/jobs"); db: typeof import("@/server/db"); designs: typeof import("@/server/designs"); catalog: typeof import("@/server/catalog"); electrical: typeof import("@/server/electrical") };
let s: S;
let w: World;

beforeAll(async () => {
  s = { jobs: await import("@/server/jobs"), db: await import("@/server/db"), designs: await import("@/server/designs"), catalog: await import("@/server/catalog"), electrical: await import("@/server/electrical") };
  w = await newWorld("Packet Electrical Solar");
  await s.electrical.saveElectricalSettings(w.owner, { necEdition: "2020", designerName: "Dana Designer" });
}, 180_000);

async function jobFor(by: Member, dealId: string): Promise<string> {
  return s.db.transaction((tx) => s.jobs.createJobForDeal(tx, { companyId: by.companyId, dealId, proposalId: null }));
}

async function pdfText(bytes: Uint8Array): Promise<string> {
  const { extractText, getDocumentProxy } = await import("unpdf");
  return (await extractText(await getDocumentProxy(new Uint8Array(bytes)), { mergePages: true })).text;
}

describe("job packet: electrical design and single-line diagram", () => {
  it("a string-inverter design: circuits sized, interconnection checked, diagram on a tabloid page, checked-by line", async () => {
    const { dealId } = await newDeal(w); // 20 × TL-400 (Isc 13.6 A) as 2 × 10 on one 7.6 kW inverter; 200 A / 200 A panel
    const jobId = await jobFor(w.owner, dealId);
    const packet = await s.jobs.getJobPacket(w.owner, jobId);
    const e = packet.electrical!;
    expect(e.design.status).toBe("pass");
    expect(e.design.edition).toBe("2020");
    // 690.8(A)(1): 13.6 A × 1.25 = 17 A; (B)(1): 21.25 A → 12 AWG Cu (25 A at 75 °C); (B)(2) at 35 °C, 4 conductors: 30 × 0.96 × 0.8 = 23.04 A ≥ 17 A
    expect(e.design.circuits[0]).toMatchObject({ kind: "dc", maxCurrentA: 17, size: "12", ocpdA: null });
    // 7600 W ÷ 240 V = 31.67 A; × 1.25 = 39.58 A → 40 A breaker, 8 AWG Cu; 40 + 200 ≤ 240 (120 % rule)
    expect(e.design.circuits.at(-1)).toMatchObject({ kind: "ac", size: "8", ocpdA: 40, egcSize: "10" });
    expect(e.design.interconnection?.method).toBe("load-side (120 % rule)");
    expect(e.checkedBy).toBe("Dana Designer");
    expect(e.drawing.description.join(" ")).toMatch(/2 strings of 10/);
    expect(packet.cautions.join(" ")).toMatch(/licensed professional.*authority having jurisdiction/);
    // The bill of materials wires what these checks sized (12 AWG DC, 8 AWG AC, 10 AWG grounding),
    // not its own common-practice defaults (which would give 10 AWG for the DC circuits).
    const wires = packet.materials!.bom.lines.filter((l) => l.kind === "conductor").map((l) => l.detail);
    expect(wires).toEqual(expect.arrayContaining([expect.stringMatching(/12 AWG Cu PV-WIRE \(sized by the electrical design\)/), expect.stringMatching(/12 AWG Cu THWN-2 \(sized by the electrical design\)/), expect.stringMatching(/8 AWG Cu THWN-2 \(sized by the electrical design\)/), expect.stringMatching(/10 AWG Cu THWN-2 \(sized by the electrical design\)/)]));

    const { bytes } = await s.jobs.getJobPacketPdf(w.owner, jobId, new Date("2031-06-01T12:00:00Z"));
    const doc = await PDFDocument.load(bytes);
    const sizes = doc.getPages().map((p) => [Math.round(p.getWidth()), Math.round(p.getHeight())]);
    expect(sizes).toContainEqual([1224, 792]); // tabloid landscape: the single-line diagram
    expect(sizes).toContainEqual([612, 792]);
    const text = await pdfText(bytes);
    for (const expected of ["Electrical design", "NEC 2020. Result: PASS", "Checked by: Dana Designer", "Single-line diagram: Testwell household, NEC 2020", "utility meter", "PV breaker 40 A", "Labels to fit", "690.56(C)", "authority having jurisdiction"]) {
      expect(text).toContain(expected);
    }
  });

  it("a microinverter design: AC branch circuits and a combiner, no DC labels; a missing panel shows as incomplete", async () => {
    const micro = await s.catalog.createInverter(w.owner, { kind: "micro", manufacturer: "Testline", model: "TM-300", acWatts: 300, efficiencyPct: 96.5, dcInputMinV: 16, dcInputMaxV: 60, modulesPerUnit: 1 } as Parameters<typeof s.catalog.createInverter>[1]);
    const { dealId } = await newDeal(w);
    await s.designs.saveDesign(w.rep, {
      dealId,
      document: { moduleId: w.moduleId, inverterId: micro.id, faces: [{ id: "south", name: "South", tiltDeg: 25, azimuthDeg: 180, usableSlots: 30, solarAccessPct: 95, moduleCount: 26 }], weather: { kind: "nearest" }, stringPlan: null },
    });
    const jobId = await jobFor(w.owner, dealId);
    const e = (await s.jobs.getJobPacket(w.owner, jobId)).electrical!;
    // 300 W ÷ 240 V = 1.25 A a unit; 20 A ÷ (1.25 × 1.25) = 12.8 → 12 a branch; 26 units → 3 branches (9, 9, 8)
    expect(e.design.branches).toEqual([{ units: 9, count: 2 }, { units: 8, count: 1 }]);
    expect(e.design.circuits.at(-1)).toMatchObject({ id: "ac-combiner-output", maxCurrentA: 32.5, ocpdA: 45 }); // 26 × 1.25 A; × 1.25 = 40.63 A → 45 A
    expect(e.design.labels.some((l) => l.id === "dc-source")).toBe(false);
    const text = await pdfText((await s.jobs.getJobPacketPdf(w.owner, jobId, new Date("2031-06-01T12:00:00Z"))).bytes);
    expect(text).toContain("AC combiner panel");
    expect(text).toContain("3 branch breakers × 15 A"); // 9 × 1.25 A = 11.25 A; × 1.25 = 14.06 A → 15 A (240.6(A))

    await setServicePanel(w.rep, dealId, { serviceBusbarA: null, serviceMainBreakerA: null, serviceVoltageV: null });
    const incomplete = (await s.jobs.getJobPacket(w.owner, jobId)).electrical!;
    expect(incomplete.design.status).toBe("incomplete");
    expect(incomplete.drawing.description.join(" ")).toContain("not checked: ratings missing");
  });
});
