// The job's materials as the packet (web and PDF) and the deal's Design tab show them: the roof
// layout of each face and the bill of materials. Shared by src/server and src/documents.
import type { BomLine } from "@/engine/bom";
import type { FaceLayout, FireCodeEdition } from "@/engine/roof-layout";

export type { BomLine, FaceLayout };

export type FaceSketch = {
  name: string;
  wanted: number;
  /** Null when the survey has no outline for this face (then no sketch, and the BOM assumes rows). */
  layout: (FaceLayout & { eaveM: number; slopeM: number; orientation: "portrait" | "landscape" }) | null;
  /** What the crew should know: the face cannot hold the design's modules, no outline, … */
  notes: string[];
};

export type PacketMaterials = {
  fireCode: { edition: FireCodeEdition; label: string; ridgeSetbackNote: string };
  site: { windMph: number | null; snowPsf: number | null; homeRunM: number | null };
  faces: FaceSketch[];
  bom: { lines: BomLine[]; problems: string[]; totalCents: number; unpriced: number };
  cautions: string[];
};

/** Cautions printed with every bill and layout. */
export const MATERIALS_CAUTIONS = [
  "Attachment spacing comes from the rail maker's span table for the site's wind speed and snow load; the engineer of record decides the structural design.",
  "Fire-code pathway and setback values are from memory of the named edition: check the edition the authority having jurisdiction adopted and its local amendments.",
  "Conductor sizes here are common-practice defaults until the electrical checks size them; lengths are estimates — measure on site.",
];

/** A face's layout in words (the sketch's text alternative). */
export function sketchText(f: FaceSketch): string {
  if (!f.layout) return `${f.name}: no outline measured; ${f.wanted} modules.`;
  const l = f.layout;
  const rows = l.rows.map((n, i) => `row ${i + 1}: ${n}`).join(", ");
  const kept = l.keepClear.map((k) => (k.kind === "ridge" ? `${Math.round(l.ridgeSetbackM * 1000) / 1000} m below the ridge` : k.kind === "pathway" ? "a pathway eave to ridge" : "a hip setback")).join("; ");
  return `${f.name}: ${l.eaveM} m eave × ${l.slopeM} m slope, ${l.orientation}; ${l.modules.length} of ${f.wanted} modules placed (${rows || "none"}); the face holds ${l.capacity}. Kept clear: ${kept || "nothing"}.`;
}
