"use client";
import { useState } from "react";
import { Field, SaveRow, SelectField } from "@/components/ui/field";
import { useSave } from "@/components/ui/use-save";
import { NEC_EDITIONS } from "@/engine/electrical/nec-tables";
import { ELECTRICAL_SETTINGS_LABELS, type ElectricalSettings, type ElectricalSettingsInput } from "@/lib/schemas/electrical";

/** The NEC edition the electrical checks follow, and the designer named on the job packet's "checked by" line. */
export function ElectricalSettingsForm({ companyId, initial }: { companyId: string; initial: ElectricalSettings }) {
  const [values, setValues] = useState({ necEdition: initial.necEdition as string, designerName: initial.designerName ?? "" });
  const [errors, setErrors] = useState<Record<string, string[]>>({});
  const save = useSave<ElectricalSettingsInput>({ request: (json) => ({ url: `/api/companies/${companyId}/electrical`, method: "PATCH", json }), labels: ELECTRICAL_SETTINGS_LABELS, success: "Electrical design settings saved.", onFieldErrors: setErrors, onSaved: () => setErrors({}) });
  const submit = (e: React.FormEvent) => {
    e.preventDefault();
    save.save({ necEdition: values.necEdition as ElectricalSettings["necEdition"], designerName: values.designerName });
  };
  return (
    <form className="card mt-6 space-y-3 p-5" aria-labelledby="electrical-settings-title" onSubmit={submit}>
      <h2 id="electrical-settings-title" className="text-lg font-semibold">Electrical design</h2>
      <p className="text-sm text-graphite-soft">
        The National Electrical Code edition your jurisdictions enforce: the checks name their sections in it (the busbar rule, the rooftop temperature adder and others moved between editions). The
        designer is printed on the job packet&apos;s &quot;checked by&quot; line; a licensed professional and the authority having jurisdiction decide.
      </p>
      <fieldset disabled={save.pending} className="grid gap-3 sm:grid-cols-2">
        <SelectField id="nec-edition" label={ELECTRICAL_SETTINGS_LABELS.necEdition} options={NEC_EDITIONS.map((e) => ({ value: e, label: `NEC ${e} (NFPA 70)` }))} value={values.necEdition} onChange={(e) => setValues((v) => ({ ...v, necEdition: e.target.value }))} error={errors.necEdition?.[0]} />
        <Field id="designer-name" label={ELECTRICAL_SETTINGS_LABELS.designerName} hint="Leave empty to leave the line blank for a signature." value={values.designerName} onChange={(e) => setValues((v) => ({ ...v, designerName: e.target.value }))} error={errors.designerName?.[0]} autoComplete="name" />
      </fieldset>
      <SaveRow notice={save.notice} submit={{ label: "Save electrical settings", pending: save.pending, quiet: true }} />
    </form>
  );
}
