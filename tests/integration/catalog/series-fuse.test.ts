// The catalog's maximum series fuse rating reaches the string check: a design whose parallel
// strings can back-feed more than the rating fails NEC 690.9(A) in the job packet the crew reads
// (GET /api/jobs/<id>/packet, signed in), and passes once the rating covers it. Real MariaDB.
import { NextRequest } from "next/server";
import { beforeAll, describe, expect, it } from "vitest";
import type { CheckLine } from "@/engine/string-check";
import type { Member } from "@/server/session";
import { newCompany } from "../support/fixtures";
import { signedInHeaders } from "../support/sign-in";

let owner: Member;
let headers: Record<string, string>;
let moduleId: string;
let jobId: string;

beforeAll(async () => {
  const { createModule, createInverter } = await import("@/server/catalog");
  const { createLead } = await import("@/server/deals");
  const { saveDesign } = await import("@/server/designs");
  const { createJobForDeal } = await import("@/server/jobs");
  const { db } = await import("@/server/db");
  owner = await newCompany("Series Fuse Solar");
  headers = await signedInHeaders(owner);
  moduleId = (
    await createModule(owner, {
      manufacturer: "Testline",
      model: "TL-400F",
      stcWatts: 400,
      vocV: 37.5,
      iscA: 13.6,
      vmpV: 31.3,
      impA: 12.78,
      gammaPmaxPctPerC: -0.3,
      vocCoeff: { value: -97.5, unit: "mV/°C" },
      maxSeriesFuseA: 25,
      lengthMm: 1722,
      widthMm: 1134,
      cellTechnology: "topcon",
      construction: "glass_glass",
      encapsulant: "POE",
    })
  ).id;
  // One MPPT input: the plan's three strings sit in parallel on it.
  const inverterId = (
    await createInverter(owner, { kind: "string", manufacturer: "Testline", model: "TI-1MPPT", acWatts: 7600, efficiencyPct: 97.5, maxDcVoltageV: 600, mpptMinV: 200, mpptMaxV: 480, maxInputCurrentA: 60, mpptCount: 1 } as Parameters<
      typeof createInverter
    >[1])
  ).id;
  const { dealId } = await createLead(owner, {
    name: "Fuseworth household",
    contactName: "Faye Fuseworth",
    email: "faye@fuseworth.example",
    street: "3 Breaker Lane",
    city: "Greensboro",
    region: "NC",
    postalCode: "27405",
    latitude: 36.1,
    longitude: -79.8,
    source: "Website",
  } as Parameters<typeof createLead>[1]);
  await saveDesign(owner, {
    dealId,
    document: {
      moduleId,
      inverterId,
      faces: [{ id: "south", name: "South", tiltDeg: 25, azimuthDeg: 180, usableSlots: 30, solarAccessPct: 95, moduleCount: 24 }],
      weather: { kind: "nearest" },
      stringPlan: { stringSizes: [8, 8, 8], lowestTempC: -10, highestTempC: 35 },
    },
  });
  jobId = await db().transaction((tx) => createJobForDeal(tx, { companyId: owner.companyId, dealId, proposalId: null }));
}, 120_000);

async function maxCurrentLine(): Promise<CheckLine> {
  const { GET } = await import("@/app/api/jobs/[id]/packet/route");
  const res = await GET(new NextRequest(`http://localhost/api/jobs/${jobId}/packet`, { headers }), { params: Promise.resolve({ id: jobId }) });
  expect(res.status).toBe(200);
  const { data } = (await res.json()) as { data: { stringPlan: { check: { results: { result: { checks: CheckLine[] } }[] } } } };
  return data.stringPlan.check.results[0].result.checks.find((c) => c.id === "max-current")!;
}

describe("NEC 690.9(A) with the catalog's series fuse rating", () => {
  it("fails when two strings can back-feed more than the module's rating, and passes once the rating covers it", async () => {
    // (3 − 1) × 13.6 A × 1.25 = 34 A into one faulted string, against a 25 A rating.
    let line = await maxCurrentLine();
    expect(line).toMatchObject({ status: "fail", limit: 25, value: 51 });
    expect(line.detail).toBe("(3 − 1) × 13.6 A × 1.25 = 34 A against the module's 25 A series fuse rating: each string needs its own fuse");

    const { patchModule } = await import("@/server/catalog");
    await patchModule(owner, moduleId, { maxSeriesFuseA: 35 });
    line = await maxCurrentLine();
    expect(line).toMatchObject({ status: "pass", limit: 35 });
  });
});
