"use client";
import { zodResolver } from "@hookform/resolvers/zod";
import type { ReactNode } from "react";
import { get, useForm, type FieldValues, type Path, type Resolver } from "react-hook-form";
import type { z } from "zod";
import { Field, SaveRow, SelectField } from "@/components/ui/field";
import { useSave } from "@/components/ui/use-save";
import { plainError, type FieldLabels } from "@/lib/validation-messages";

export type NumberField<F> = { name: Path<F> & string; label: string; step: string };
export type ChoiceField<F> = { name: Path<F> & string; label: string; options: readonly { value: string; label: string }[] };
export type TextField<F> = { name: Path<F> & string; label: string };

/** What differs between the module form and the inverter form; the rest is this one form. */
export type EquipmentFormSpec<F extends FieldValues> = {
  noun: "module" | "inverter";
  collection: string;
  schema: z.ZodType<unknown, F>;
  defaults: (row: (F & { id: string }) | null) => Partial<F>;
  description: (values: F) => ReactNode;
  /** Beside manufacturer and model. */
  headChoices: ChoiceField<F>[];
  numbers: (values: F) => NumberField<F>[];
  numberColumns: string;
  /** Below the figures. */
  tailChoices: ChoiceField<F>[];
  tailTexts: TextField<F>[];
};

type Props<F extends FieldValues, R> = {
  spec: EquipmentFormSpec<F>;
  row: R | null;
  onClose: () => void;
  onSaved: (message: string) => void;
};

/** The form's labels by field name, as the fields on screen show them. */
function equipmentLabels<F extends FieldValues>(spec: EquipmentFormSpec<F>, values: F): FieldLabels {
  const fields: { name: string; label: string }[] = [...spec.headChoices, ...spec.numbers(values), ...spec.tailChoices, ...spec.tailTexts];
  return { manufacturer: "Manufacturer", model: "Model", ...Object.fromEntries(fields.map((f) => [f.name, f.label])) };
}

/** Adds or edits one piece of equipment (POST to the collection, PATCH to the row). */
export function EquipmentForm<F extends FieldValues, R extends F & { id: string }>({ spec, row, onClose, onSaved }: Props<F, R>) {
  const { register, handleSubmit, setError, watch, getValues, formState } = useForm<F, unknown, F>({
    // The spec's schema parses F (the module or inverter schema); its output is what is sent.
    // The labels follow the fields on screen (a micro-inverter's differ from a string inverter's).
    resolver: zodResolver(spec.schema as z.ZodType<F, F>, { error: (iss): string => plainError(equipmentLabels(spec, getValues()))(iss) }) as unknown as Resolver<F, unknown, F>,
    defaultValues: spec.defaults(row) as never,
  });
  const values = watch();
  const { save, invalid, pending, notice } = useSave<F, unknown, F>({
    request: (json) => (row ? { url: `${spec.collection}/${row.id}`, method: "PATCH", json } : { url: spec.collection, method: "POST", json }),
    setError,
    labels: equipmentLabels(spec, values),
    onSaved: (_, v) => onSaved(`${v.manufacturer} ${v.model} is ${row ? "saved" : "added to the catalog"}.`),
  });
  // The inverter's union types only the common keys' errors; every message is looked up by its path (vocCoeff.value too).
  const errorOf = (name: string) => (get(formState.errors, name) as { message?: string } | undefined)?.message;
  const id = (name: string) => `${spec.noun}-${name}`;
  const choice = (c: ChoiceField<F>) => <SelectField key={c.name} id={id(c.name)} label={c.label} options={c.options} error={errorOf(c.name)} {...register(c.name)} />;
  const title = row ? `Edit ${row.manufacturer} ${row.model}` : `Add ${spec.noun === "module" ? "a module" : "an inverter"}`;
  const Noun = spec.noun === "module" ? "module" : "inverter";

  return (
    <section aria-label={title} className="card p-5">
      <h3 className="text-base font-semibold">{title}</h3>
      <p className="mt-1 text-sm text-graphite-soft">{spec.description(values)}</p>
      <form onSubmit={handleSubmit(save, invalid)} noValidate className="mt-4 space-y-4">
        <div className={`grid gap-4 ${spec.headChoices.length ? "md:grid-cols-3" : "md:grid-cols-2"}`}>
          <Field id={id("manufacturer")} label="Manufacturer" autoComplete="off" error={errorOf("manufacturer")} {...register("manufacturer" as Path<F>)} />
          <Field id={id("model")} label="Model" autoComplete="off" error={errorOf("model")} {...register("model" as Path<F>)} />
          {spec.headChoices.map(choice)}
        </div>
        <div className={`grid gap-4 sm:grid-cols-2 md:grid-cols-3 ${spec.numberColumns}`}>
          {spec.numbers(values).map((f) => (
            <Field
              key={f.name}
              id={id(f.name)}
              label={f.label}
              type="number"
              inputMode="decimal"
              step={f.step}
              error={errorOf(f.name)}
              {...register(f.name, { valueAsNumber: true })}
            />
          ))}
        </div>
        {spec.tailChoices.length + spec.tailTexts.length ? (
          <div className="grid gap-4 md:grid-cols-3">
            {spec.tailChoices.map(choice)}
            {spec.tailTexts.map((t) => (
              <Field key={t.name} id={id(t.name)} label={t.label} autoComplete="off" error={errorOf(t.name)} {...register(t.name)} />
            ))}
          </div>
        ) : null}
        <SaveRow notice={notice?.tone === "error" ? notice : null}>
          <button type="submit" className="btn-primary" disabled={pending}>
            {pending ? "Saving…" : row ? `Save ${Noun}` : `Add ${Noun}`}
          </button>
          <button type="button" className="btn-quiet" onClick={onClose}>
            Cancel
          </button>
        </SaveRow>
      </form>
    </section>
  );
}
