// The job packet's bill of materials and roof layout against a real MariaDB: a string-inverter
// design and a microinverter design, each with a roof survey and the company's BOS parts, read
// through GET /api/jobs/<id>/packet (signed in) and printed in the packet PDF.
import { NextRequest } from "next/server";
import { beforeAll, describe, expect, it } from "vitest";
import type { JobPacket } from "@/lib/job-packet";
import type { Member } from "@/server/session";
import { newCompany } from "../support/fixtures";
import { signedInHeaders } from "../support/sign-in";

let owner: Member;
let headers: Record<string, string>;
let stringJob: string;
let microJob: string;

const PARTS_CSV = [
  "manufacturer,model,kind,price_line_item,stock_lengths_mm,span_table,mlpe_function,modules_per_unit,rating_a,poles,material,insulation,size_awg,conduit_type,trade_size,purpose",
  "Testrack,TR-1,rail,rail-stock,4200 5300,110/0:1830 110/30:1520 140/30:1220,,,,,,,,,,",
  "Testrack,TR-S,splice,,,,,,,,,,,,,",
  "Testrack,TR-A,attachment,attachment,,,,,,,,,,,,",
  "Testrack,TR-M,mid_clamp,,,,,,,,,,,,,",
  "Testrack,TR-E,end_clamp,,,,,,,,,,,,,",
  "Testshut,TS-1,mlpe,,,,rapid_shutdown,1,,,,,,,,",
  "Testbox,TB-40,breaker,,,,,,40,2,,,,,,",
  "Testbox,TB-20,breaker,,,,,,20,2,,,,,,",
  "Testwire,PV-10,conductor,,,,,,,,cu,pv_wire,10,,,",
  "Testpipe,EMT-34,conduit,,,,,,,,,,,emt,3/4,",
].join("\n");

beforeAll(async () => {
  const { createModule, createInverter } = await import("@/server/catalog");
  const { importBosCsv } = await import("@/server/bos-catalog");
  const { savePriceBook } = await import("@/server/price-book");
  const { emptyPriceBook } = await import("@/lib/schemas/price-book");
  const { createLead } = await import("@/server/deals");
  const { saveDesign } = await import("@/server/designs");
  const { saveRoofSurvey, savePacketSettings } = await import("@/server/roof-survey");
  const { openDeal } = await import("@/server/deal-scope");
  const { createJobForDeal } = await import("@/server/jobs");
  const { db } = await import("@/server/db");
  owner = await newCompany("Packet BOM Solar");
  headers = await signedInHeaders(owner);
  const moduleId = (
    await createModule(owner, { manufacturer: "Testline", model: "TL-410", stcWatts: 410, vocV: 38.2, iscA: 13.75, vmpV: 31.6, impA: 12.98, gammaPmaxPctPerC: -0.3, vocCoeff: { value: -0.25, unit: "%/°C" }, maxSeriesFuseA: 25, lengthMm: 1722, widthMm: 1134, cellTechnology: "topcon", construction: "glass_glass", encapsulant: "POE" })
  ).id;
  const stringInv = (await createInverter(owner, { kind: "string", manufacturer: "Testline", model: "TI-7680", acWatts: 7680, efficiencyPct: 97.5, maxDcVoltageV: 600, mpptMinV: 200, mpptMaxV: 480, maxInputCurrentA: 30, mpptCount: 2 } as Parameters<typeof createInverter>[1])).id;
  const microInv = (await createInverter(owner, { kind: "micro", manufacturer: "Testline", model: "TM-320", acWatts: 320, efficiencyPct: 97, dcInputMinV: 16, dcInputMaxV: 60, modulesPerUnit: 1 } as Parameters<typeof createInverter>[1])).id;
  expect((await importBosCsv(owner, PARTS_CSV, "all_or_nothing")).errors).toEqual([]);
  await savePriceBook(owner, { ...emptyPriceBook(), lineItems: [{ id: "rail-stock", name: "Rail, one stock length", amountCents: 6_500 }, { id: "attachment", name: "Attachment", amountCents: 1_200 }] });
  await savePacketSettings(owner, { fireCodeEdition: "2018", spares: { attachment: { mode: "count", count: 2 }, mid_clamp: { mode: "percent", percent: 10 } } });

  const lead = (name: string) =>
    createLead(owner, { name, contactName: `Pat ${name}`, email: "pat@example.com", street: "3 Rail Lane", city: "Greensboro", region: "NC", postalCode: "27405", latitude: 36.1, longitude: -79.8, source: "Website" } as Parameters<typeof createLead>[1]);

  // String design: 10 modules on one gable face (10 m × 6 m), one string of 10; a second face the survey left unmeasured.
  const a = await lead("Railton household");
  await saveDesign(owner, {
    dealId: a.dealId,
    document: {
      moduleId,
      inverterId: stringInv,
      faces: [
        { id: "south", name: "South", tiltDeg: 25, azimuthDeg: 180, usableSlots: 30, solarAccessPct: 95, moduleCount: 10 },
        { id: "west", name: "West", tiltDeg: 25, azimuthDeg: 270, usableSlots: 10, solarAccessPct: 90, moduleCount: 4 },
      ],
      weather: { kind: "nearest" },
      stringPlan: { stringSizes: [7, 7], lowestTempC: -10, highestTempC: 35 },
    },
  });
  await saveRoofSurvey(await openDeal(owner, a.dealId), {
    designWindMph: 105,
    groundSnowPsf: 20,
    homeRunM: 12,
    roofPlanAreaM2: 150,
    faces: [{ faceId: "south", eaveM: 10, slopeM: 6, ridgeM: 10, sides: "rake", orientation: "portrait", streetSide: true }],
  });
  stringJob = await db().transaction((tx) => createJobForDeal(tx, { companyId: owner.companyId, dealId: a.dealId, proposalId: null }));

  // Micro design: 24 modules on a hip face that holds fewer under the fire code.
  const b = await lead("Microby household");
  await saveDesign(owner, {
    dealId: b.dealId,
    document: { moduleId, inverterId: microInv, faces: [{ id: "hip", name: "Hip south", tiltDeg: 22, azimuthDeg: 180, usableSlots: 24, solarAccessPct: 95, moduleCount: 24 }], weather: { kind: "nearest" } },
  });
  await saveRoofSurvey(await openDeal(owner, b.dealId), {
    designWindMph: null,
    groundSnowPsf: null,
    homeRunM: null,
    roofPlanAreaM2: null,
    faces: [{ faceId: "hip", eaveM: 12, slopeM: 5, ridgeM: 4, sides: "hip", orientation: "landscape", streetSide: false }],
  });
  microJob = await db().transaction((tx) => createJobForDeal(tx, { companyId: owner.companyId, dealId: b.dealId, proposalId: null }));
}, 120_000);

async function packetOf(jobId: string): Promise<JobPacket> {
  const { GET } = await import("@/app/api/jobs/[id]/packet/route");
  const res = await GET(new NextRequest(`http://localhost/api/jobs/${jobId}/packet`, { headers }), { params: Promise.resolve({ id: jobId }) });
  expect(res.status).toBe(200);
  return ((await res.json()) as { data: JobPacket }).data;
}

describe("the packet's bill of materials and roof layout", () => {
  it("string design: racking from the layout's rows at the span for 105 mph / 20 psf, devices, wire and prices", async () => {
    const m = (await packetOf(stringJob)).materials!;
    expect(m.fireCode).toMatchObject({ edition: "2018" });
    // Array plan area = 14 × 1.722 × 1.134 × cos 25° = 24.8 m² of 150 m² = 17 % ≤ 33 % → 18 in (0.457 m).
    expect(m.fireCode.ridgeSetbackNote).toMatch(/^0\.46 m below the ridge: the array covers 17 %/);
    const south = m.faces.find((f) => f.name === "South")!;
    // 9.0856 m between the pathway and the far rake → 7 a row: rows 7 + 3.
    expect(south.layout).toMatchObject({ rows: [7, 3], capacity: 21, fits: true });
    const west = m.faces.find((f) => f.name === "West")!;
    expect(west.layout).toBeNull();
    expect(west.notes[0]).toMatch(/No outline measured/);
    const line = (kind: string) => m.bom.lines.find((l) => l.kind === kind)!;
    // Runs: 7 → 7 × 1.134 + 6 × 0.02 + 0.1 = 8.158 m → 4 200 + 4 200; 3 → 3.542 m → 4 200; West (assumed) 4 → 4.696 m → 5 300.
    // Pieces: 2 × (2 + 1 + 1) = 8; splices 2 × 1 = 2.
    expect(line("rail")).toMatchObject({ needed: 8, unitCents: 6_500, totalCents: 52_000 });
    expect(line("splice")).toMatchObject({ needed: 2 });
    // Span 1 520 mm: ⌈8 158 ÷ 1 520⌉ + 1 = 7, ⌈3 542 ÷ 1 520⌉ + 1 = 4, ⌈4 696 ÷ 1 520⌉ + 1 = 5 → 2 × 16 = 32, + 2 spares.
    expect(line("attachment")).toMatchObject({ needed: 32, spares: 2, quantity: 34, totalCents: 34 * 1_200 });
    // Mid clamps 2 × (6 + 2 + 3) = 22 + ⌈2.2⌉ = 3 spares; end clamps 4 × 3 rows = 12.
    expect(line("mid_clamp")).toMatchObject({ needed: 22, spares: 3 });
    expect(line("end_clamp")).toMatchObject({ needed: 12 });
    expect(line("mlpe")).toMatchObject({ needed: 14 });
    // 7 680 W ÷ 240 V = 32 A × 1.25 = 40 A breaker.
    expect(line("breaker")).toMatchObject({ needed: 1, detail: "Testbox TB-40, 40 A" });
    expect(line("conduit")).toMatchObject({ needed: 16, detail: "Testpipe EMT-34" });
    expect(m.bom.totalCents).toBe(52_000 + 34 * 1_200);
    expect(m.bom.problems).toEqual([]);
  });

  it("micro design: warns when the hip face cannot hold the design, counts branch circuits and no rapid-shutdown units", async () => {
    const m = (await packetOf(microJob)).materials!;
    const face = m.faces[0];
    // Worked in src/engine/roof-layout.test.ts: rows 5, 4, 3 → 12 of 24 (2018: unknown plan area → 36 in at the ridge leaves the same 3 rows).
    expect(face.layout).toMatchObject({ capacity: 12, fits: false });
    expect(face.notes[0]).toMatch(/This face holds 12 modules .* the design puts 24 here/);
    expect(m.fireCode.ridgeSetbackNote).toMatch(/not measured, so the larger setback applies/);
    const breaker = m.bom.lines.find((l) => l.kind === "breaker")!;
    // 24 × 320 W ÷ 240 V = 32 A → ⌈32 ÷ 16⌉ = 2 branch circuits on 20 A breakers.
    expect(breaker).toMatchObject({ needed: 2, detail: "Testbox TB-20, 20 A" });
    expect(m.bom.lines.some((l) => l.kind === "mlpe")).toBe(false);
    // Without site loads, the table's shortest span (1 220 mm), said so.
    expect(m.bom.lines.find((l) => l.kind === "attachment")!.basis).toMatch(/site wind\/snow not given: the table's shortest span, 1220 mm/);
  });

  it("prints the layout and the bill in the packet PDF", async () => {
    const { getJobPacketPdf } = await import("@/server/jobs");
    const { bytes } = await getJobPacketPdf(owner, stringJob, new Date("2031-06-01T12:00:00Z"));
    const { extractText, getDocumentProxy } = await import("unpdf");
    const { text } = await extractText(await getDocumentProxy(new Uint8Array(bytes)), { mergePages: true });
    for (const expected of ["Roof layout", "2018 IRC R324.6", "South: 10 m eave × 6 m slope, portrait; 10 of 10 modules placed", "Bill of materials", "Racking rail", "Testrack TR-1", "Roof attachment", "How each quantity was counted", "engineer of record"]) {
      expect(text).toContain(expected);
    }
  });
});

describe("the demo's designs", () => {
  it("each get a complete bill of materials: every line a catalog part, no problems, every face laid out and holding its modules", async () => {
    const { db } = await import("@/server/db");
    const { deal, design, membership, user } = await import("@/db/schema");
    const { and, eq } = await import("drizzle-orm");
    const { openDeal } = await import("@/server/deal-scope");
    const { designMaterials } = await import("@/server/job-materials");
    const DEMO_COMPANY_ID = "7a11a55e-0000-4000-8000-000000000001";
    const [o] = await db()
      .select({ userId: user.id, name: user.name, email: user.email, membershipId: membership.id })
      .from(membership)
      .innerJoin(user, eq(user.id, membership.userId))
      .where(and(eq(membership.companyId, DEMO_COMPANY_ID), eq(user.email, "owner@tallgrass.example")));
    const demoOwner: Member = { ...o, companyId: DEMO_COMPANY_ID, companyName: "Tallgrass Bright Energy", role: "owner" };
    const rows = await db().select({ dealId: design.dealId }).from(design).innerJoin(deal, eq(deal.id, design.dealId)).where(eq(design.companyId, DEMO_COMPANY_ID));
    expect(rows.length).toBeGreaterThanOrEqual(12);
    for (const { dealId } of rows) {
      const m = (await designMaterials(await openDeal(demoOwner, dealId)))!;
      expect(m.bom.problems, dealId).toEqual([]);
      const missing = m.bom.lines.filter((l) => l.partId === null && l.kind !== "module" && l.kind !== "inverter");
      expect(missing.map((l) => `${l.item}: ${l.detail}`), dealId).toEqual([]);
      for (const f of m.faces) expect(f.layout?.fits, `${dealId} ${f.name}`).toBe(true);
    }
  });
});
