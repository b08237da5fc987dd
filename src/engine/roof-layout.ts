// Roof layout sketch: modules placed in rows inside one roof face's outline, keeping the fire
// code's access pathways and setbacks clear. Coordinates are metres in the roof plane: x along
// the eave from its left end, y up the slope from the eave. Pure: no framework, no database.

/** Fire-code editions a company may lay out to (residential roofs). */
export const FIRE_CODE_EDITIONS = ["2015", "2018", "2021"] as const;
export type FireCodeEdition = (typeof FIRE_CODE_EDITIONS)[number];

const IN = 0.0254;

/**
 * Residential access rules per edition. VALUES FROM MEMORY — check the edition the authority
 * having jurisdiction adopted and its local amendments before relying on them.
 * - 2015 IFC 605.11.3.2: 36 in pathways eave to ridge (two per slope on a single-ridge roof, one
 *   per slope on a hip roof), modules 18 in from hips and valleys, 36 in below the ridge.
 * - 2018 IRC R324.6 / IFC 1204.2.1 and 2021 IRC R324.6 / IFC 1205.2.1: one 36 in pathway from the
 *   lowest edge to the ridge per roof plane with modules; ridge setback 18 in on both sides when the
 *   array covers at most 33 % of the roof's plan-view area, 36 in when it covers more.
 */
export const FIRE_CODE_RULES: Record<FireCodeEdition, { label: string; pathwayM: number; pathwaysGable: number; pathwaysHip: number; hipSetbackM: number; ridgeSetbackSmallM: number; ridgeSetbackLargeM: number; largeShare: number | null }> = {
  "2015": { label: "2015 IFC 605.11.3.2", pathwayM: 36 * IN, pathwaysGable: 2, pathwaysHip: 1, hipSetbackM: 18 * IN, ridgeSetbackSmallM: 36 * IN, ridgeSetbackLargeM: 36 * IN, largeShare: null },
  "2018": { label: "2018 IRC R324.6 / IFC 1204.2.1", pathwayM: 36 * IN, pathwaysGable: 1, pathwaysHip: 1, hipSetbackM: 0, ridgeSetbackSmallM: 18 * IN, ridgeSetbackLargeM: 36 * IN, largeShare: 0.33 },
  "2021": { label: "2021 IRC R324.6 / IFC 1205.2.1", pathwayM: 36 * IN, pathwaysGable: 1, pathwaysHip: 1, hipSetbackM: 0, ridgeSetbackSmallM: 18 * IN, ridgeSetbackLargeM: 36 * IN, largeShare: 0.33 },
};

/** Gap between neighbouring modules (the clamp), m: common practice about 20 mm. */
export const MODULE_GAP_M = 0.02;

export type FaceOutline = { eaveM: number; slopeM: number; ridgeM: number; sides: "rake" | "hip" };
export type LayoutModule = { x: number; y: number; w: number; h: number; row: number };
export type Point = { x: number; y: number };
export type FaceLayout = {
  outline: Point[];
  /** Pathway bands (eave to ridge) and the ridge setback band, as polygons. */
  keepClear: { kind: "pathway" | "ridge" | "hip"; polygon: Point[] }[];
  modules: LayoutModule[];
  /** Modules per row, eave first. */
  rows: number[];
  /** Module size along the row and up the slope, m. */
  moduleAlongRowM: number;
  moduleUpSlopeM: number;
  capacity: number;
  wanted: number;
  fits: boolean;
  ridgeSetbackM: number;
};

/** The ridge setback for the array's share of the roof's plan-view area; no area known → the larger (stated by the caller). */
export function ridgeSetbackFor(edition: FireCodeEdition, arrayPlanM2: number, roofPlanM2: number | null): number {
  const r = FIRE_CODE_RULES[edition];
  if (r.largeShare === null) return r.ridgeSetbackLargeM;
  if (roofPlanM2 === null || roofPlanM2 <= 0) return r.ridgeSetbackLargeM;
  return arrayPlanM2 / roofPlanM2 > r.largeShare ? r.ridgeSetbackLargeM : r.ridgeSetbackSmallM;
}

/**
 * Lays `wanted` modules out on one face, rows from the eave up, each row centred between the
 * face's side boundaries (the outline moved in by the pathway or hip setback, measured square to
 * the edge). Fills every row it can; `capacity` says how many fit, `fits` whether the design's count does.
 */
export function layoutFace(input: {
  outline: FaceOutline;
  module: { lengthMm: number; widthMm: number };
  orientation: "portrait" | "landscape";
  wanted: number;
  edition: FireCodeEdition;
  ridgeSetbackM: number;
}): FaceLayout {
  const { outline: o, edition, ridgeSetbackM } = input;
  const rules = FIRE_CODE_RULES[edition];
  const long = input.module.lengthMm / 1000;
  const short = input.module.widthMm / 1000;
  const [w, h] = input.orientation === "portrait" ? [short, long] : [long, short];
  const inset = o.sides === "hip" ? (o.eaveM - o.ridgeM) / 2 : 0;
  // Horizontal distance that keeps `d` metres square to a side edge leaning by `inset` over the slope.
  const lean = Math.hypot(inset, o.slopeM) / o.slopeM;
  const pathways = o.sides === "hip" ? rules.pathwaysHip : rules.pathwaysGable;
  const sideClear = (side: 0 | 1) => Math.max(o.sides === "hip" ? rules.hipSetbackM : 0, pathways > side ? rules.pathwayM : 0);
  const leftD = sideClear(0) * lean;
  const rightD = sideClear(1) * lean;
  const xLeft = (y: number) => (inset * y) / o.slopeM + leftD;
  const xRight = (y: number) => o.eaveM - (inset * y) / o.slopeM - rightD;
  const top = o.slopeM - ridgeSetbackM;

  const modules: LayoutModule[] = [];
  const rows: number[] = [];
  let capacity = 0;
  for (let row = 0, y = 0; y + h <= top + 1e-9; row++, y += h + MODULE_GAP_M) {
    // The narrowest place of the row is its upper edge (the face narrows towards the ridge).
    const left = xLeft(y + h);
    const span = xRight(y + h) - left;
    const fit = Math.max(0, Math.floor((span + MODULE_GAP_M + 1e-9) / (w + MODULE_GAP_M)));
    capacity += fit;
    const take = Math.min(fit, input.wanted - modules.length);
    if (take > 0) {
      const used = take * w + (take - 1) * MODULE_GAP_M;
      const x0 = left + (span - used) / 2;
      for (let c = 0; c < take; c++) modules.push({ x: x0 + c * (w + MODULE_GAP_M), y, w, h, row });
      rows.push(take);
    }
  }

  const outlinePts: Point[] = [
    { x: 0, y: 0 },
    { x: o.eaveM, y: 0 },
    { x: o.eaveM - inset, y: o.slopeM },
    { x: inset, y: o.slopeM },
  ];
  const keepClear: FaceLayout["keepClear"] = [];
  const band = (kind: "pathway" | "hip", left: boolean, d: number) => {
    if (d <= 0) return;
    const poly = left
      ? [{ x: 0, y: 0 }, { x: d, y: 0 }, { x: inset + d, y: o.slopeM }, { x: inset, y: o.slopeM }]
      : [{ x: o.eaveM - d, y: 0 }, { x: o.eaveM, y: 0 }, { x: o.eaveM - inset, y: o.slopeM }, { x: o.eaveM - inset - d, y: o.slopeM }];
    keepClear.push({ kind, polygon: poly });
  };
  band(pathways > 0 ? "pathway" : "hip", true, leftD);
  band(pathways > 1 ? "pathway" : "hip", false, rightD);
  if (ridgeSetbackM > 0) {
    const yb = top;
    keepClear.push({ kind: "ridge", polygon: [{ x: (inset * yb) / o.slopeM, y: yb }, { x: o.eaveM - (inset * yb) / o.slopeM, y: yb }, { x: o.eaveM - inset, y: o.slopeM }, { x: inset, y: o.slopeM }] });
  }
  return { outline: outlinePts, keepClear, modules, rows, moduleAlongRowM: w, moduleUpSlopeM: h, capacity, wanted: input.wanted, fits: capacity >= input.wanted, ridgeSetbackM };
}
