// Demo balance-of-system parts of Tallgrass Bright Energy and a roof survey for every demo
// design, so each design gets a complete bill of materials and a roof layout. Makers, models
// and the span table are invented (in the range of residential rail makers' tables); validated by
// the app's own schemas, so a bad edit fails the seed instead of the page.
import { eq } from "drizzle-orm";
import { bosPart, design, roofSurvey } from "../../../src/db/schema";
import { bosPartSchema, type BosPartInput } from "../../../src/lib/schemas/bos";
import { roofSurveySchema, type RoofFaceOutline } from "../../../src/lib/schemas/roof-survey";
import type { SeedContext } from "../seed-demo";

export const order = 31;

const uid = (n: number) => `7a11a55e-0000-4000-8000-${String(n).padStart(12, "0")}`;
// Fixed ids (seeding is idempotent): parts …004001–004030, roof surveys …004101–.

const PARTS: BosPartInput[] = [
  { manufacturer: "Ridgeway Mounts", model: "RW-100 rail", details: { kind: "rail", stockLengthsMm: [4200, 5300], spanTable: "110/0:1830 110/30:1520 110/60:1220 140/0:1400 140/30:1220 140/60:1020 170/0:1120 170/30:1020" } },
  { manufacturer: "Ridgeway Mounts", model: "RW-100 splice", details: { kind: "splice" } },
  { manufacturer: "Ridgeway Mounts", model: "RW-FL flashed L-foot", details: { kind: "attachment" } },
  { manufacturer: "Ridgeway Mounts", model: "RW-MC mid clamp", details: { kind: "mid_clamp" } },
  { manufacturer: "Ridgeway Mounts", model: "RW-EC end clamp", details: { kind: "end_clamp" } },
  { manufacturer: "Quietline", model: "QS-1 shutdown unit", details: { kind: "mlpe", mlpeFunction: "rapid_shutdown", modulesPerUnit: 1 } },
  { manufacturer: "Boxwell", model: "BW-JB4 roof junction box", details: { kind: "combiner", inputs: 4, ratingA: 60 } },
  { manufacturer: "Boxwell", model: "BW-60N AC disconnect", details: { kind: "disconnect", ratingA: 60, maxVoltageV: 240, fusible: false } },
  { manufacturer: "Boxwell", model: "BW-B240 40 A 2-pole", details: { kind: "breaker", ratingA: 40, poles: 2 } },
  { manufacturer: "Boxwell", model: "BW-B260 60 A 2-pole", details: { kind: "breaker", ratingA: 60, poles: 2 } },
  { manufacturer: "Boxwell", model: "BW-B220 20 A 2-pole", details: { kind: "breaker", ratingA: 20, poles: 2 } },
  { manufacturer: "Boxwell", model: "BW-F25 string fuse", details: { kind: "fuse", ratingA: 25, maxVoltageV: 600 } },
  { manufacturer: "Coppervale", model: "PV wire 10 AWG", details: { kind: "conductor", material: "cu", insulation: "pv_wire", sizeAwg: "10" } },
  { manufacturer: "Coppervale", model: "THWN-2 12 AWG", details: { kind: "conductor", material: "cu", insulation: "thwn_2", sizeAwg: "12" } },
  { manufacturer: "Coppervale", model: "THWN-2 10 AWG", details: { kind: "conductor", material: "cu", insulation: "thwn_2", sizeAwg: "10" } },
  { manufacturer: "Coppervale", model: "THWN-2 8 AWG", details: { kind: "conductor", material: "cu", insulation: "thwn_2", sizeAwg: "8" } },
  { manufacturer: "Coppervale", model: "THWN-2 6 AWG", details: { kind: "conductor", material: "cu", insulation: "thwn_2", sizeAwg: "6" } },
  { manufacturer: "Steelrun", model: "EMT 3/4 in", details: { kind: "conduit", conduitType: "emt", tradeSize: "3/4" } },
  { manufacturer: "Signright", model: "SR-RS rapid shutdown sign", details: { kind: "label", purpose: "rapid_shutdown" } },
  { manufacturer: "Signright", model: "SR-DC PV DC source", details: { kind: "label", purpose: "dc_source" } },
  { manufacturer: "Signright", model: "SR-AC PV disconnect", details: { kind: "label", purpose: "ac_disconnect" } },
  { manufacturer: "Signright", model: "SR-BF backfed breaker", details: { kind: "label", purpose: "backfed_breaker" } },
  { manufacturer: "Signright", model: "SR-CM conduit marker", details: { kind: "label", purpose: "conduit_marking" } },
  { manufacturer: "Signright", model: "SR-DIR directory plaque", details: { kind: "label", purpose: "directory" } },
];

/** A face outline that holds `slots` portrait modules (1.134 × 1.722 m) under the 2018/2021 rules with room to spare. */
function outlineFor(faceId: string, slots: number, k: number): RoofFaceOutline {
  const cols = Math.min(slots, 7);
  const rows = Math.ceil(slots / cols);
  const eaveM = Math.round((cols * 1.154 + 0.9144 + 0.5) * 10) / 10;
  const slopeM = Math.round((rows * 1.742 + 0.9144 + 0.3) * 10) / 10;
  return { faceId, eaveM, slopeM, ridgeM: eaveM, sides: "rake", orientation: "portrait", streetSide: k === 0 };
}

export async function seed(ctx: SeedContext): Promise<void> {
  const { tx, companyId } = ctx;
  await tx.insert(bosPart).values(
    PARTS.map((p, i) => {
      const v = bosPartSchema.parse(p);
      return { id: uid(4001 + i), companyId, kind: v.details.kind, manufacturer: v.manufacturer, model: v.model, details: v.details, priceLineItemId: v.priceLineItemId };
    }),
  );
  const designs = await tx.select({ dealId: design.dealId, document: design.document }).from(design).where(eq(design.companyId, companyId));
  let n = 0;
  for (const d of designs) {
    const survey = roofSurveySchema.parse({
      designWindMph: 115,
      groundSnowPsf: 15,
      homeRunM: 12 + (n % 4) * 3,
      roofPlanAreaM2: null,
      faces: d.document.faces.map((f, k) => outlineFor(f.id, f.usableSlots, k)),
    });
    await tx.insert(roofSurvey).values({ id: uid(4101 + n), companyId, dealId: d.dealId, ...survey });
    n++;
  }

}
