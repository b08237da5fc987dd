// The roof survey of a deal (table roof_survey): site loads for the racking's span table, the
// home-run length, the roof's plan-view area, and each design face's outline, measured in the
// roof plane. Shared by the Design tab's survey form and PUT /api/roof-surveys.
import { z } from "zod";

const num = (label: string, min: number, max: number, unit: string) =>
  z
    .number({ error: `Enter ${label} as a number (${unit})` })
    .finite(`Enter ${label} as a number (${unit})`)
    .min(min, `${label} must be at least ${min} ${unit}`)
    .max(max, `${label} must be at most ${max} ${unit}`);

export const FACE_SIDES = ["rake", "hip"] as const;
export const FACE_SIDE_LABELS: Record<(typeof FACE_SIDES)[number], string> = { rake: "Gable (rake edges, rectangle)", hip: "Hip (sloped sides, trapezoid)" };
export const ORIENTATIONS = ["portrait", "landscape"] as const;
export const ORIENTATION_LABELS: Record<(typeof ORIENTATIONS)[number], string> = { portrait: "Portrait", landscape: "Landscape" };

/**
 * One face's outline in the roof plane: the eave's length, the slope length from eave to ridge,
 * and the ridge's length (equal to the eave on a gable face, shorter on a hip face; 0 makes a
 * triangle). Hip faces narrow evenly on both sides.
 */
export const roofFaceOutlineSchema = z
  .object({
    faceId: z.string().trim().min(1).max(40),
    eaveM: num("Eave length", 1, 60, "m"),
    slopeM: num("Slope length", 1, 30, "m"),
    ridgeM: num("Ridge length", 0, 60, "m"),
    sides: z.enum(FACE_SIDES, { error: "Sides must be rake or hip" }),
    orientation: z.enum(ORIENTATIONS, { error: "Orientation must be portrait or landscape" }),
    /** Whether this face is on the street or driveway side (the fire code wants one pathway there). */
    streetSide: z.boolean().default(false),
  })
  .refine((f) => f.ridgeM <= f.eaveM, { path: ["ridgeM"], message: "The ridge cannot be longer than the eave" })
  .refine((f) => f.sides === "hip" || f.ridgeM === f.eaveM, { path: ["ridgeM"], message: "A gable face's ridge is as long as its eave" });
export type RoofFaceOutline = z.output<typeof roofFaceOutlineSchema>;

export const roofSurveyFacesSchema = z.array(roofFaceOutlineSchema).max(24, "At most 24 roof faces");

export const roofSurveySchema = z.object({
  /** Ultimate design wind speed, mph (ASCE 7 map value the building department names). */
  designWindMph: z.number().int("Wind speed must be whole mph").min(85, "Wind speed must be at least 85 mph").max(200, "Wind speed must be at most 200 mph").nullable(),
  /** Ground snow load, psf (ASCE 7 / the local amendment). */
  groundSnowPsf: z.number().int("Snow load must be whole psf").min(0, "Snow load must be 0 psf or more").max(150, "Snow load must be at most 150 psf").nullable(),
  /** Conductor run from the array's junction box to the inverter / service, m. */
  homeRunM: num("Home run", 1, 200, "m").nullable(),
  /** The whole roof's plan-view area, m² (the ridge setback depends on the array's share). */
  roofPlanAreaM2: num("Roof plan area", 10, 2000, "m²").nullable(),
  faces: roofSurveyFacesSchema,
});
export type RoofSurveyValues = z.output<typeof roofSurveySchema>;

/** PUT /api/roof-surveys: the deal and its whole survey (one per deal; saving replaces it). */
export const saveRoofSurveySchema = roofSurveySchema.extend({ dealId: z.string().uuid("Unknown deal") });

export const EMPTY_ROOF_SURVEY: RoofSurveyValues = { designWindMph: null, groundSnowPsf: null, homeRunM: null, roofPlanAreaM2: null, faces: [] };
