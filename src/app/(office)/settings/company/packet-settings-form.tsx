"use client";
// Job packet settings: the fire-code edition the roof layout keeps pathways and setbacks by, and
// the spares each bill of materials adds per kind of part (a percentage or a count).
import { useState, type FormEvent } from "react";
import { optionsOf, SelectField } from "@/components/ui/field";
import { NumberInput } from "@/components/ui/number-input";
import { SaveRow } from "@/components/ui/status-message";
import { useSave } from "@/components/ui/use-save";
import { FIRE_CODE_EDITIONS, FIRE_CODE_LABELS, SPARE_KIND_LABELS, SPARE_KINDS, type FireCodeEdition, type PacketSettings, type Spare } from "@/lib/schemas/packet-settings";
import type { FieldLabels } from "@/lib/validation-messages";

type Kind = (typeof SPARE_KINDS)[number];
type Row = { mode: "none" | "percent" | "count"; value: number | null };
const MODES = ["none", "percent", "count"] as const;
const MODE_LABELS: Record<(typeof MODES)[number], string> = { none: "No spares", percent: "Percent", count: "Count" };
const LABELS: FieldLabels = { fireCodeEdition: "Fire-code edition", ...Object.fromEntries(SPARE_KINDS.map((k) => [`spares.${k}`, `Spares of ${SPARE_KIND_LABELS[k].toLowerCase()}`])) };

const rowOf = (s: Spare | undefined): Row => (!s ? { mode: "none", value: null } : s.mode === "percent" ? { mode: "percent", value: s.percent } : { mode: "count", value: s.count });

export function PacketSettingsForm({ initial }: { initial: PacketSettings }) {
  const [edition, setEdition] = useState<FireCodeEdition>(initial.fireCodeEdition);
  const [rows, setRows] = useState<Record<Kind, Row>>(() => Object.fromEntries(SPARE_KINDS.map((k) => [k, rowOf(initial.spares[k])])) as Record<Kind, Row>);
  const [errors, setErrors] = useState<Record<string, string>>({});
  const save = useSave<PacketSettings>({
    request: (json) => ({ url: "/api/packet-settings", method: "PUT", json }),
    success: "Packet settings saved: new bills of materials and layouts use them.",
    labels: LABELS,
    onFieldErrors: (fields) => setErrors(Object.fromEntries(Object.entries(fields).map(([k, v]) => [k.split(".").slice(0, 2).join("."), v[0]]))),
  });
  const onSubmit = (e: FormEvent) => {
    e.preventDefault();
    setErrors({});
    const spares: PacketSettings["spares"] = {};
    for (const k of SPARE_KINDS) {
      const r = rows[k];
      if (r.mode === "percent") spares[k] = { mode: "percent", percent: r.value ?? Number.NaN };
      if (r.mode === "count") spares[k] = { mode: "count", count: r.value ?? Number.NaN };
    }
    save.save({ fireCodeEdition: edition, spares });
  };
  return (
    <form onSubmit={onSubmit} className="card mt-8 space-y-4 p-5" aria-labelledby="packet-settings-heading" data-testid="packet-settings">
      <h2 id="packet-settings-heading" className="text-lg font-semibold">
        Job packet
      </h2>
      <SelectField
        id="fire-code-edition"
        label="Fire-code edition for roof pathways and setbacks"
        hint="Values from memory of each edition: check the edition your authority having jurisdiction adopted and its amendments."
        value={edition}
        options={optionsOf(FIRE_CODE_EDITIONS, FIRE_CODE_LABELS)}
        onChange={(e) => setEdition(e.target.value as FireCodeEdition)}
      />
      <fieldset className="space-y-2">
        <legend className="font-medium">Spares added to each bill of materials</legend>
        {SPARE_KINDS.map((k) => (
          <div key={k} className="flex flex-wrap items-end gap-3">
            <SelectField
              id={`spare-${k}-mode`}
              label={SPARE_KIND_LABELS[k]}
              value={rows[k].mode}
              options={optionsOf(MODES, MODE_LABELS)}
              onChange={(e) => setRows((r) => ({ ...r, [k]: { ...r[k], mode: e.target.value as Row["mode"] } }))}
            />
            {rows[k].mode !== "none" ? (
              <NumberInput
                id={`spare-${k}-value`}
                label={rows[k].mode === "percent" ? "Percent (%)" : "Count"}
                value={rows[k].value}
                storedDecimals={rows[k].mode === "percent" ? 1 : 0}
                error={errors[`spares.${k}`]}
                onValue={(v) => setRows((r) => ({ ...r, [k]: { ...r[k], value: v } }))}
              />
            ) : null}
          </div>
        ))}
      </fieldset>
      <SaveRow notice={save.notice} submit={{ label: "Save packet settings", pending: save.pending }} />
    </form>
  );
}
