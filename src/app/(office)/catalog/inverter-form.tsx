"use client";
import { zodResolver } from "@hookform/resolvers/zod";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { useForm, type Path } from "react-hook-form";
import { Field, FormMessage } from "@/components/ui/field";
import { applyFieldErrors } from "@/lib/form-errors";
import { INVERTER_KIND_LABELS, INVERTER_KINDS, inverterModelSchema, type InverterModelInput, type InverterModelValues } from "@/lib/schemas/catalog";
import { createInverterAction, updateInverterAction } from "./actions";
import { type InverterView, withoutPrefix } from "./catalog-views";

type NumberField = { name: Path<InverterModelInput>; label: string; step: string };

const COMMON: NumberField[] = [
  { name: "acWatts", label: "AC watts (W)", step: "any" },
  { name: "efficiencyPct", label: "Efficiency (%)", step: "any" },
];
const STRING_FIELDS: NumberField[] = [
  { name: "maxDcVoltageV", label: "Max DC voltage (V)", step: "any" },
  { name: "mpptMinV", label: "MPPT minimum (V)", step: "any" },
  { name: "mpptMaxV", label: "MPPT maximum (V)", step: "any" },
  { name: "maxInputCurrentA", label: "Max input current per MPPT (A)", step: "any" },
  { name: "mpptCount", label: "MPPT count", step: "1" },
];
const MICRO_FIELDS: NumberField[] = [
  { name: "dcInputMinV", label: "DC input minimum (V)", step: "any" },
  { name: "dcInputMaxV", label: "DC input maximum (V)", step: "any" },
  { name: "modulesPerUnit", label: "Modules per unit", step: "1" },
];

/** The stored inverter as form values: the other kind's empty fields are left out. */
function defaultsOf(row: InverterView | null): Partial<InverterModelInput> {
  if (!row) return { kind: "string", manufacturer: "", model: "" };
  const out: Record<string, unknown> = {};
  for (const [k, v] of Object.entries(row)) if (v !== null && k !== "id" && k !== "active") out[k] = v;
  return out as Partial<InverterModelInput>;
}

export function InverterForm({ row, onClose, onSaved }: { row: InverterView | null; onClose: () => void; onSaved: (message: string) => void }) {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  const {
    register,
    handleSubmit,
    watch,
    setError: setFieldError,
    formState: { errors, isSubmitting },
  } = useForm<InverterModelInput, unknown, InverterModelValues>({
    resolver: zodResolver(inverterModelSchema),
    defaultValues: defaultsOf(row),
  });
  const kind = watch("kind");
  // The union's error object only types the common keys; every field's message is looked up by name.
  const errorOf = (name: string) => (errors as Record<string, { message?: string } | undefined>)[name]?.message;

  const onSubmit = handleSubmit(async (values) => {
    setError(null);
    const result = row ? await updateInverterAction({ id: row.id, values }) : await createInverterAction(values);
    if (!result.ok) {
      applyFieldErrors(withoutPrefix(result.fieldErrors), setFieldError);
      setError(result.message);
      return;
    }
    router.refresh();
    onSaved(`${values.manufacturer} ${values.model} is ${row ? "saved" : "added to the catalog"}.`);
  });

  const title = row ? `Edit ${row.manufacturer} ${row.model}` : "Add an inverter";
  const fields = [...COMMON, ...(kind === "micro" ? MICRO_FIELDS : STRING_FIELDS)];
  return (
    <section aria-label={title} className="card p-5">
      <h3 className="text-base font-semibold">{title}</h3>
      <p className="mt-1 text-sm text-graphite-soft">
        {kind === "micro"
          ? "A microinverter: its DC input range and how many modules one unit takes."
          : "A string inverter: the MPPT window must sit inside the max DC voltage (600 V for one- and two-family dwellings, NEC 690.7)."}
      </p>
      <form onSubmit={onSubmit} noValidate className="mt-4 space-y-4">
        {error ? <FormMessage tone="error">{error}</FormMessage> : null}
        <div className="grid gap-4 md:grid-cols-3">
          <Field id="inverter-manufacturer" label="Manufacturer" autoComplete="off" error={errorOf("manufacturer")} {...register("manufacturer")} />
          <Field id="inverter-model" label="Model" autoComplete="off" error={errorOf("model")} {...register("model")} />
          <div>
            <label htmlFor="inverter-kind" className="field-label">
              Kind
            </label>
            <select id="inverter-kind" className="field-input" aria-invalid={errorOf("kind") ? true : undefined} {...register("kind")}>
              {INVERTER_KINDS.map((k) => (
                <option key={k} value={k}>
                  {INVERTER_KIND_LABELS[k]}
                </option>
              ))}
            </select>
            {errorOf("kind") ? <p className="field-error">{errorOf("kind")}</p> : null}
          </div>
        </div>
        <div className="grid gap-4 sm:grid-cols-2 md:grid-cols-3 lg:grid-cols-4">
          {fields.map((f) => (
            <Field
              key={f.name}
              id={`inverter-${f.name}`}
              label={f.label}
              type="number"
              inputMode="decimal"
              step={f.step}
              error={errorOf(f.name)}
              {...register(f.name, { valueAsNumber: true })}
            />
          ))}
        </div>
        <div className="flex gap-2">
          <button type="submit" className="btn-primary" disabled={isSubmitting}>
            {isSubmitting ? "Saving…" : row ? "Save inverter" : "Add inverter"}
          </button>
          <button type="button" className="btn-quiet" onClick={onClose}>
            Cancel
          </button>
        </div>
      </form>
    </section>
  );
}
