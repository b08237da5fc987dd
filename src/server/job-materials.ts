import "server-only";
import { buildBom, type BomFace, type BomInput, type BomPart } from "@/engine/bom";
import type { ElectricalDesign } from "@/engine/electrical/design";
import { FIRE_CODE_RULES, layoutFace, ridgeSetbackFor } from "@/engine/roof-layout";
import { enginesSpares } from "@/lib/schemas/packet-settings";
import { MATERIALS_CAUTIONS, type FaceSketch, type PacketMaterials } from "@/lib/job-materials";
import { listBosParts } from "@/server/bos-catalog";
import { getInverterOrThrow, getModuleOrThrow, type InverterModel, type ModuleModel } from "@/server/catalog";
import type { DealScope } from "@/server/deal-scope";
import { getDesignForDeal } from "@/server/designs";
import { dealElectrical } from "@/server/electrical";
import { getPriceBook } from "@/server/price-book";
import { getPacketSettings, getRoofSurvey } from "@/server/roof-survey";

/** Rows assumed on a face with no measured outline (our assumption): up to this many modules a row. */
const ASSUMED_ROW = 7;

export type MaterialsInput = {
  companyId: string;
  dealId: string;
  /** The faces to build (the signed offer's or the design's), with the design's face ids where known. */
  faces: { id: string | null; name: string; tiltDeg: number; moduleCount: number }[];
  mod: ModuleModel;
  inv: InverterModel;
  inverterUnits: number;
  stringSizes: number[] | null;
  /** The electrical design of the same equipment: its conductor sizes replace the BOM's defaults. */
  electrical?: ElectricalDesign | null;
};

/**
 * The conductors the electrical checks sized (NEC 690.8, Table 310.16, 250.122), per BOM circuit
 * role: the largest PV source circuit for the roof run (PV wire) and the home run (THWN-2), the
 * inverter output (or the largest microinverter branch) for the AC run, and the largest grounding
 * conductor. Roles the design did not size keep the BOM's common-practice default.
 */
export function bomConductors(design: ElectricalDesign | null): BomInput["conductors"] {
  if (!design) return undefined;
  const sized = design.circuits.filter((c) => c.size !== null);
  const largest = (cs: typeof sized) => cs.reduce<(typeof sized)[number] | null>((best, c) => (best === null || c.maxCurrentA > best.maxCurrentA ? c : best), null);
  const dc = largest(sized.filter((c) => c.kind === "dc"));
  const ac = sized.find((c) => c.id === "inverter-output") ?? largest(sized.filter((c) => c.kind === "ac"));
  const egc = largest(sized.filter((c) => c.egcSize !== null).map((c) => ({ ...c, maxCurrentA: c.ocpdA ?? c.maxCurrentA })));
  const out: NonNullable<BomInput["conductors"]> = {};
  if (dc?.size) {
    out.dc_roof = { sizeAwg: dc.size, material: dc.material, insulation: "pv_wire" };
    out.dc_home_run = { sizeAwg: dc.size, material: dc.material, insulation: "thwn_2" };
  }
  if (ac?.size) out.ac_output = { sizeAwg: ac.size, material: ac.material, insulation: "thwn_2" };
  if (egc?.egcSize) out.egc = { sizeAwg: egc.egcSize, material: "cu", insulation: "thwn_2" };
  return out;
}

const round2 = (v: number) => Math.round(v * 100) / 100;

/** The roof layout of each face and the bill of materials, from the design, the roof survey, the BOS catalog and the price book. */
export async function packetMaterials(input: MaterialsInput): Promise<PacketMaterials> {
  const { companyId, mod, inv } = input;
  const [survey, settings, parts, book] = await Promise.all([getRoofSurvey(companyId, input.dealId), getPacketSettings(companyId), listBosParts(companyId, true), getPriceBook(companyId)]);
  const edition = settings.fireCodeEdition;
  const faces = input.faces.filter((f) => f.moduleCount > 0);
  const moduleM2 = (mod.lengthMm / 1000) * (mod.widthMm / 1000);
  const arrayPlanM2 = faces.reduce((s, f) => s + f.moduleCount * moduleM2 * Math.cos((f.tiltDeg * Math.PI) / 180), 0);
  const ridgeM = ridgeSetbackFor(edition, arrayPlanM2, survey.roofPlanAreaM2);
  const rules = FIRE_CODE_RULES[edition];
  const ridgeSetbackNote =
    rules.largeShare === null
      ? `${round2(ridgeM)} m below the ridge (${rules.label})`
      : survey.roofPlanAreaM2 === null
        ? `${round2(ridgeM)} m below the ridge: the roof's plan-view area is not measured, so the larger setback applies`
        : `${round2(ridgeM)} m below the ridge: the array covers ${Math.round((arrayPlanM2 / survey.roofPlanAreaM2) * 100)} % of the roof's plan-view area (limit ${rules.largeShare * 100} %)`;

  const sketches: FaceSketch[] = [];
  const bomFaces: BomFace[] = [];
  for (const f of faces) {
    const outline = f.id ? survey.faces.find((o) => o.faceId === f.id) : undefined;
    if (!outline) {
      const rows = Array.from({ length: Math.ceil(f.moduleCount / ASSUMED_ROW) }, (_, i) => Math.min(ASSUMED_ROW, f.moduleCount - i * ASSUMED_ROW));
      const along = mod.widthMm / 1000;
      sketches.push({ name: f.name, wanted: f.moduleCount, layout: null, notes: [`No outline measured for this face: the bill assumes portrait rows of up to ${ASSUMED_ROW} modules.`] });
      bomFaces.push({ name: f.name, rows, moduleAlongRowM: along, eaveM: ASSUMED_ROW * along, slopeM: rows.length * (mod.lengthMm / 1000) });
      continue;
    }
    const layout = layoutFace({ outline, module: mod, orientation: outline.orientation, wanted: f.moduleCount, edition, ridgeSetbackM: ridgeM });
    const notes: string[] = [];
    const rows = [...layout.rows];
    if (!layout.fits) {
      notes.push(`This face holds ${layout.capacity} modules with the ${rules.label} pathways and setbacks; the design puts ${f.moduleCount} here. Ask the office before mounting.`);
      rows.push(f.moduleCount - layout.modules.length);
    }
    sketches.push({ name: f.name, wanted: f.moduleCount, layout: { ...layout, eaveM: outline.eaveM, slopeM: outline.slopeM, orientation: outline.orientation }, notes });
    bomFaces.push({ name: f.name, rows, moduleAlongRowM: layout.moduleAlongRowM, eaveM: outline.eaveM, slopeM: outline.slopeM });
  }

  const prices = new Map(book.lineItems.map((l) => [l.id, l.amountCents]));
  const bomParts: BomPart[] = parts.map((p) => ({
    id: p.id,
    kind: p.kind,
    name: `${p.manufacturer} ${p.model}`,
    details: p.details as Record<string, unknown>,
    unitCents: p.priceLineItemId ? (prices.get(p.priceLineItemId) ?? null) : null,
  }));
  const moduleCount = faces.reduce((s, f) => s + f.moduleCount, 0);
  const bom = buildBom({
    faces: bomFaces,
    module: { name: `${mod.manufacturer} ${mod.model}, ${mod.stcWatts} W STC`, count: moduleCount, iscA: mod.iscA },
    inverter: { name: `${inv.manufacturer} ${inv.model}, ${inv.acWatts} W AC`, kind: inv.kind, units: input.inverterUnits, acWattsEach: inv.acWatts },
    strings: input.stringSizes,
    site: { windMph: survey.designWindMph, snowPsf: survey.groundSnowPsf, homeRunM: survey.homeRunM },
    parts: bomParts,
    spares: enginesSpares(settings),
    conductors: bomConductors(input.electrical ?? null),
  });
  return {
    fireCode: { edition, label: rules.label, ridgeSetbackNote },
    site: { windMph: survey.designWindMph, snowPsf: survey.groundSnowPsf, homeRunM: survey.homeRunM },
    faces: sketches,
    bom,
    cautions: MATERIALS_CAUTIONS,
  };
}

/** The Design tab's view: the saved design's layout and bill of materials (null before a design is saved). */
export async function designMaterials(scope: DealScope): Promise<PacketMaterials | null> {
  const saved = await getDesignForDeal(scope);
  if (!saved) return null;
  const doc = saved.document;
  const companyId = scope.member.companyId;
  const [mod, inv] = await Promise.all([getModuleOrThrow(companyId, doc.moduleId).catch(() => null), getInverterOrThrow(companyId, doc.inverterId).catch(() => null)]);
  if (!mod || !inv) return null;
  const moduleCount = doc.faces.reduce((s, f) => s + f.moduleCount, 0);
  const inverterUnits = inv.kind === "micro" ? Math.ceil(moduleCount / Math.max(1, inv.modulesPerUnit ?? 1)) : doc.inverterCount;
  return packetMaterials({
    companyId,
    dealId: scope.dealId,
    faces: doc.faces.map((f) => ({ id: f.id, name: f.name, tiltDeg: f.tiltDeg, moduleCount: f.moduleCount })),
    mod,
    inv,
    inverterUnits,
    stringSizes: doc.stringPlan?.stringSizes ?? null,
    electrical: await dealElectrical(scope, doc),
  });
}
