// The job packet's shape, shared by the server (src/server/jobs) and the PDF renderer
// (src/documents), which must not import the server.
import type { job, Stage } from "@/db/schema";
import type { ElectricalDesign } from "@/engine/electrical/design";
import type { StringPlanCheck } from "@/lib/offer-figures";
import type { Drawing } from "@/lib/single-line-diagram";
import type { JobChecklistItem } from "@/lib/schemas/jobs";
import type { PacketMaterials } from "@/lib/job-materials";

export type JobRecord = typeof job.$inferSelect;

export type JobView = Omit<JobRecord, "checklist"> & {
  checklist: JobChecklistItem[];
  stage: Stage;
  householdName: string;
  crewName: string | null;
};

export type JobPhotoView = {
  id: string;
  jobId: string;
  mimeType: string;
  widthPx: number;
  heightPx: number;
  sizeBytes: number;
  caption: string | null;
  uploadedByName: string | null;
  createdAt: Date;
};

export type PacketFace = { name: string; tiltDeg: number; azimuthDeg: number; moduleCount: number };
export type PacketBomLine = { item: string; detail: string; quantity: number; unit: string };
/** The packet's electrical design, its single-line diagram and the company's designer for the "checked by" line. */
export type PacketElectrical = { design: ElectricalDesign; drawing: Drawing; checkedBy: string | null };
export type JobPacket = {
  job: JobView;
  company: { name: string; licenseNumber: string | null };
  customer: { name: string; contactName: string | null; phone: string | null; email: string | null; secondContactName: string | null; secondContactPhone: string | null };
  site: { street: string; city: string; region: string; postalCode: string; latitude: number; longitude: number; mapUri: string; utilityName: string | null };
  /** Where the equipment comes from: the signed proposal's chosen offer, or the deal's design. */
  source: { kind: "proposal"; label: string } | { kind: "design"; label: string } | { kind: "none"; label: string };
  faces: PacketFace[];
  system: { moduleCount: number; kwDc: number; kwAc: number | null } | null;
  bom: PacketBomLine[];
  /** Roof layout per face and the full bill of materials (null without equipment to build). */
  materials: PacketMaterials | null;
  stringPlan: {
    lowestTempC: number;
    highestTempC: number;
    stringSizes: number[];
    check: StringPlanCheck;
    notes: string[];
  } | null;
  electrical: PacketElectrical | null;
  cautions: string[];
  sitePhotos: { id: string; fileName: string; mimeType: string }[];
  photos: JobPhotoView[];
  crewName: string | null;
};

/**
 * The job's visits as the crew reads them: the planned day, and what was recorded as done
 * (survey done, inspection passed) beside it, e.g. "done Tue, Jun 3, 2031 (planned Mon, Jun 2, 2031)".
 * `day` formats a calendar day the way the caller's page or PDF does.
 */
export function visitLines(
  j: Pick<JobRecord, "surveyDate" | "surveyDoneOn" | "installDate" | "inspectionOn" | "inspectionPassedOn">,
  day: (iso: string) => string,
): { label: string; text: string }[] {
  const line = (label: string, planned: string | null, done: string | null, doneWord: string) => {
    if (!done) return { label, text: planned ? day(planned) : "not set" };
    return { label, text: `${doneWord} ${day(done)}${planned && planned !== done ? ` (planned ${day(planned)})` : ""}` };
  };
  return [
    line("Site survey", j.surveyDate, j.surveyDoneOn, "done"),
    line("Install", j.installDate, null, ""),
    line("Inspection", j.inspectionOn, j.inspectionPassedOn, "passed"),
  ];
}
