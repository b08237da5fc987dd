"use client";
import { useState } from "react";
import { SaveRow, SelectField } from "@/components/ui/field";
import { useSave } from "@/components/ui/use-save";
import { SERVICE_PANEL_LABELS, SERVICE_VOLTAGES, type ServicePanelInput } from "@/lib/schemas/electrical";

// Ratings residential panels come in, A (common practice; the panel's label says which).
const RATINGS = [60, 100, 125, 150, 175, 200, 225, 300, 400];
const ratingOptions = [{ value: "", label: "Not known yet" }, ...RATINGS.map((a) => ({ value: String(a), label: `${a} A` }))];
const voltageOptions = [{ value: "", label: "Not known yet" }, ...SERVICE_VOLTAGES.map((v) => ({ value: String(v), label: v === 240 ? "120/240 V split phase" : "120/208 V" }))];
const num = (v: string) => (v === "" ? null : Number(v));

type Panel = { serviceBusbarA: number | null; serviceMainBreakerA: number | null; serviceVoltageV: number | null };

/** The household's service panel: the electrical design's interconnection check (NEC 705.12) reads it. */
export function ServicePanelForm({ dealId, initial, readOnly }: { dealId: string; initial: Panel; readOnly: boolean }) {
  const text = (v: number | null) => (v === null ? "" : String(v));
  const [panel, setPanel] = useState({ serviceBusbarA: text(initial.serviceBusbarA), serviceMainBreakerA: text(initial.serviceMainBreakerA), serviceVoltageV: text(initial.serviceVoltageV) });
  const [errors, setErrors] = useState<Record<string, string[]>>({});
  const save = useSave<ServicePanelInput>({
    request: (json) => ({ url: `/api/deals/${dealId}/service-panel`, method: "PUT", json }),
    labels: SERVICE_PANEL_LABELS,
    success: "Saved.",
    onFieldErrors: setErrors,
    onSaved: () => setErrors({}),
  });
  const set = (k: keyof typeof panel) => (e: React.ChangeEvent<HTMLSelectElement>) => setPanel((p) => ({ ...p, [k]: e.target.value }));
  const submit = (e: React.FormEvent) => {
    e.preventDefault();
    save.save({ serviceBusbarA: num(panel.serviceBusbarA), serviceMainBreakerA: num(panel.serviceMainBreakerA), serviceVoltageV: num(panel.serviceVoltageV) as ServicePanelInput["serviceVoltageV"] });
  };
  return (
    <form className="card h-fit space-y-3 p-5 text-sm" aria-labelledby="service-panel-title" onSubmit={submit}>
      <h2 id="service-panel-title" className="font-semibold">Service panel</h2>
      <p className="text-graphite-soft">From the panel&apos;s label or the site survey. The electrical checks need both ratings; a design without them stays a draft.</p>
      <fieldset disabled={readOnly || save.pending} className="grid gap-3 sm:grid-cols-3">
        <SelectField id="service-busbar" label={SERVICE_PANEL_LABELS.serviceBusbarA} options={ratingOptions} value={panel.serviceBusbarA} onChange={set("serviceBusbarA")} error={errors.serviceBusbarA?.[0]} />
        <SelectField id="service-main" label={SERVICE_PANEL_LABELS.serviceMainBreakerA} options={ratingOptions} value={panel.serviceMainBreakerA} onChange={set("serviceMainBreakerA")} error={errors.serviceMainBreakerA?.[0]} />
        <SelectField id="service-voltage" label={SERVICE_PANEL_LABELS.serviceVoltageV} options={voltageOptions} value={panel.serviceVoltageV} onChange={set("serviceVoltageV")} error={errors.serviceVoltageV?.[0]} />
      </fieldset>
      {readOnly ? null : <SaveRow notice={save.notice} submit={{ label: "Save service panel", pending: save.pending, quiet: true }} />}
    </form>
  );
}
