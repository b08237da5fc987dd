"use client";
import { zodResolver } from "@hookform/resolvers/zod";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { useForm, type Path } from "react-hook-form";
import { Field, FormMessage } from "@/components/ui/field";
import { applyFieldErrors } from "@/lib/form-errors";
import {
  CELL_TECHNOLOGIES,
  CELL_TECHNOLOGY_LABELS,
  CONSTRUCTION_LABELS,
  CONSTRUCTIONS,
  moduleModelSchema,
  type ModuleModelInput,
  type ModuleModelValues,
} from "@/lib/schemas/catalog";
import { createModuleAction, updateModuleAction } from "./actions";
import { type ModuleView, withoutPrefix } from "./catalog-views";

const NUMBER_FIELDS: { name: Path<ModuleModelInput>; label: string; step: string }[] = [
  { name: "stcWatts", label: "STC watts (W)", step: "any" },
  { name: "vocV", label: "Voc (V)", step: "any" },
  { name: "iscA", label: "Isc (A)", step: "any" },
  { name: "vmpV", label: "Vmp (V)", step: "any" },
  { name: "impA", label: "Imp (A)", step: "any" },
  { name: "gammaPmaxPctPerC", label: "Pmax temperature coefficient (%/°C)", step: "any" },
  { name: "betaVocPctPerC", label: "Voc temperature coefficient (%/°C)", step: "any" },
  { name: "lengthMm", label: "Length (mm)", step: "1" },
  { name: "widthMm", label: "Width (mm)", step: "1" },
];

export function ModuleForm({ row, onClose, onSaved }: { row: ModuleView | null; onClose: () => void; onSaved: (message: string) => void }) {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  const {
    register,
    handleSubmit,
    setError: setFieldError,
    formState: { errors, isSubmitting },
  } = useForm<ModuleModelInput, unknown, ModuleModelValues>({
    resolver: zodResolver(moduleModelSchema),
    defaultValues: row
      ? { ...row, encapsulant: row.encapsulant ?? "" }
      : { manufacturer: "", model: "", cellTechnology: "topcon", construction: "glass_glass", encapsulant: "" },
  });

  const onSubmit = handleSubmit(async (values) => {
    setError(null);
    const result = row ? await updateModuleAction({ id: row.id, values }) : await createModuleAction(values);
    if (!result.ok) {
      applyFieldErrors(withoutPrefix(result.fieldErrors), setFieldError);
      setError(result.message);
      return;
    }
    router.refresh();
    onSaved(`${values.manufacturer} ${values.model} is ${row ? "saved" : "added to the catalog"}.`);
  });

  const title = row ? `Edit ${row.manufacturer} ${row.model}` : "Add a module";
  return (
    <section aria-label={title} className="card p-5">
      <h3 className="text-base font-semibold">{title}</h3>
      <p className="mt-1 text-sm text-graphite-soft">Datasheet values at STC. Temperature coefficients are negative, in %/°C.</p>
      <form onSubmit={onSubmit} noValidate className="mt-4 space-y-4">
        {error ? <FormMessage tone="error">{error}</FormMessage> : null}
        <div className="grid gap-4 md:grid-cols-2">
          <Field id="module-manufacturer" label="Manufacturer" autoComplete="off" error={errors.manufacturer?.message} {...register("manufacturer")} />
          <Field id="module-model" label="Model" autoComplete="off" error={errors.model?.message} {...register("model")} />
        </div>
        <div className="grid gap-4 sm:grid-cols-2 md:grid-cols-3 lg:grid-cols-5">
          {NUMBER_FIELDS.map((f) => (
            <Field
              key={f.name}
              id={`module-${f.name}`}
              label={f.label}
              type="number"
              inputMode="decimal"
              step={f.step}
              error={errors[f.name as keyof typeof errors]?.message}
              {...register(f.name, { valueAsNumber: true })}
            />
          ))}
        </div>
        <div className="grid gap-4 md:grid-cols-3">
          <div>
            <label htmlFor="module-cellTechnology" className="field-label">
              Cell technology
            </label>
            <select id="module-cellTechnology" className="field-input" aria-invalid={errors.cellTechnology ? true : undefined} {...register("cellTechnology")}>
              {CELL_TECHNOLOGIES.map((t) => (
                <option key={t} value={t}>
                  {CELL_TECHNOLOGY_LABELS[t]}
                </option>
              ))}
            </select>
            {errors.cellTechnology ? <p className="field-error">{errors.cellTechnology.message}</p> : null}
          </div>
          <div>
            <label htmlFor="module-construction" className="field-label">
              Construction
            </label>
            <select id="module-construction" className="field-input" aria-invalid={errors.construction ? true : undefined} {...register("construction")}>
              {CONSTRUCTIONS.map((c) => (
                <option key={c} value={c}>
                  {CONSTRUCTION_LABELS[c]}
                </option>
              ))}
            </select>
            {errors.construction ? <p className="field-error">{errors.construction.message}</p> : null}
          </div>
          <Field id="module-encapsulant" label="Encapsulant (optional)" autoComplete="off" error={errors.encapsulant?.message} {...register("encapsulant")} />
        </div>
        <div className="flex gap-2">
          <button type="submit" className="btn-primary" disabled={isSubmitting}>
            {isSubmitting ? "Saving…" : row ? "Save module" : "Add module"}
          </button>
          <button type="button" className="btn-quiet" onClick={onClose}>
            Cancel
          </button>
        </div>
      </form>
    </section>
  );
}
