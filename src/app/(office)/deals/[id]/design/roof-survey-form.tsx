"use client";
// The roof survey beside the design: the site's wind and snow (the rail maker's span table row),
// the home run, the roof's plan-view area and each face's outline. The bill of materials and the
// roof layout below are built from it.
import { useState, type FormEvent } from "react";
import { optionsOf, SelectField } from "@/components/ui/field";
import { NumberInput } from "@/components/ui/number-input";
import { SaveRow } from "@/components/ui/status-message";
import { useSave } from "@/components/ui/use-save";
import { FACE_SIDE_LABELS, FACE_SIDES, ORIENTATION_LABELS, ORIENTATIONS, type RoofFaceOutline, type RoofSurveyValues } from "@/lib/schemas/roof-survey";
import type { FieldLabels } from "@/lib/validation-messages";

const LABELS: FieldLabels = {
  designWindMph: "Design wind speed (mph)",
  groundSnowPsf: "Ground snow load (psf)",
  homeRunM: "Home run (m)",
  roofPlanAreaM2: "Roof plan-view area (m²)",
  "faces.#": "Face {n}",
  "faces.#.eaveM": "Eave (m)",
  "faces.#.slopeM": "Slope (m)",
  "faces.#.ridgeM": "Ridge (m)",
};

type Face = { id: string; name: string };
type Draft = Omit<RoofSurveyValues, "faces"> & { faces: (Omit<RoofFaceOutline, "eaveM" | "slopeM" | "ridgeM"> & { eaveM: number | null; slopeM: number | null; ridgeM: number | null; measured: boolean })[] };

function draftOf(saved: RoofSurveyValues, faces: Face[]): Draft {
  return {
    ...saved,
    faces: faces.map((f) => {
      const o = saved.faces.find((s) => s.faceId === f.id);
      return o ? { ...o, measured: true } : { faceId: f.id, eaveM: null, slopeM: null, ridgeM: null, sides: "rake", orientation: "portrait", streetSide: false, measured: false };
    }),
  };
}

export function RoofSurveyForm({ dealId, faces, saved, canEdit }: { dealId: string; faces: Face[]; saved: RoofSurveyValues; canEdit: boolean }) {
  const [draft, setDraft] = useState<Draft>(() => draftOf(saved, faces));
  const [errors, setErrors] = useState<Record<string, string>>({});
  const save = useSave<Draft>({
    request: (d) => ({
      url: "/api/roof-surveys",
      method: "PUT",
      json: { dealId, ...d, faces: d.faces.filter((f) => f.measured).map(({ measured: _m, ...f }) => ({ ...f, ridgeM: f.sides === "rake" ? f.eaveM : f.ridgeM })) },
    }),
    success: "Roof survey saved: the layout and bill of materials below use it.",
    labels: LABELS,
    onFieldErrors: (fields) => setErrors(Object.fromEntries(Object.entries(fields).map(([k, v]) => [k, v[0]]))),
  });
  const setFace = (i: number, patch: Partial<Draft["faces"][number]>) => setDraft((d) => ({ ...d, faces: d.faces.map((f, k) => (k === i ? { ...f, ...patch } : f)) }));
  const onSubmit = (e: FormEvent) => {
    e.preventDefault();
    setErrors({});
    save.save(draft);
  };
  const site = (key: "designWindMph" | "groundSnowPsf" | "homeRunM" | "roofPlanAreaM2", storedDecimals = 0) => (
    <NumberInput id={`survey-${key}`} label={LABELS[key]} value={draft[key]} storedDecimals={storedDecimals} error={errors[key]} disabled={!canEdit} onValue={(v) => setDraft((d) => ({ ...d, [key]: v }))} />
  );
  return (
    <form onSubmit={onSubmit} className="card space-y-4 p-4" aria-labelledby="survey-heading" data-testid="roof-survey-form">
      <h2 id="survey-heading" className="text-lg font-semibold">
        Roof survey
      </h2>
      <p className="text-sm text-graphite-soft">
        Wind speed and ground snow load pick the row of the rail maker&apos;s span table; the engineer of record decides the structural design. Leave a value empty
        when it is not known: the bill then takes the table&apos;s shortest span and an assumed home run, and says so.
      </p>
      <div className="flex flex-wrap gap-4">
        {site("designWindMph")}
        {site("groundSnowPsf")}
        {site("homeRunM", 1)}
        {site("roofPlanAreaM2", 1)}
      </div>
      {draft.faces.map((f, i) => (
        <fieldset key={f.faceId} className="space-y-2 rounded-card border border-paper-line p-3">
          <legend className="px-1 font-medium">{faces[i]?.name ?? f.faceId}</legend>
          <label className="flex min-h-touch items-center gap-2 text-sm">
            <input type="checkbox" checked={f.measured} disabled={!canEdit} onChange={(e) => setFace(i, { measured: e.target.checked })} />
            Outline measured
          </label>
          {f.measured ? (
            <div className="flex flex-wrap items-end gap-4">
              <NumberInput id={`face-${i}-eave`} label={LABELS["faces.#.eaveM"]} value={f.eaveM} storedDecimals={2} error={errors[`faces.${i}.eaveM`]} disabled={!canEdit} onValue={(v) => setFace(i, { eaveM: v })} />
              <NumberInput id={`face-${i}-slope`} label={LABELS["faces.#.slopeM"]} value={f.slopeM} storedDecimals={2} error={errors[`faces.${i}.slopeM`]} disabled={!canEdit} onValue={(v) => setFace(i, { slopeM: v })} />
              <SelectField id={`face-${i}-sides`} label="Shape" value={f.sides} disabled={!canEdit} options={optionsOf(FACE_SIDES, FACE_SIDE_LABELS)} onChange={(e) => setFace(i, { sides: e.target.value as "rake" | "hip" })} />
              {f.sides === "hip" ? (
                <NumberInput id={`face-${i}-ridge`} label={LABELS["faces.#.ridgeM"]} value={f.ridgeM} storedDecimals={2} error={errors[`faces.${i}.ridgeM`]} disabled={!canEdit} onValue={(v) => setFace(i, { ridgeM: v })} />
              ) : null}
              <SelectField id={`face-${i}-orientation`} label="Modules" value={f.orientation} disabled={!canEdit} options={optionsOf(ORIENTATIONS, ORIENTATION_LABELS)} onChange={(e) => setFace(i, { orientation: e.target.value as "portrait" | "landscape" })} />
              <label className="flex min-h-touch items-center gap-2 text-sm">
                <input type="checkbox" checked={f.streetSide} disabled={!canEdit} onChange={(e) => setFace(i, { streetSide: e.target.checked })} />
                Street or driveway side
              </label>
            </div>
          ) : null}
        </fieldset>
      ))}
      {canEdit ? <SaveRow notice={save.notice} submit={{ label: "Save roof survey", pending: save.pending }} /> : null}
    </form>
  );
}
