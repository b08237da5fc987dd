"use client";
import type { FieldErrors, UseFormRegister } from "react-hook-form";
import { Field } from "@/components/ui/field";
import type { HouseholdInput } from "@/lib/schemas/deal";
import { numberFromField } from "@/lib/schemas/text";

export type RatePlanOption = { id: string; name: string; utilityName: string };

/** The company's rate plans for a select, "not known yet" first (the new-lead form and the Household tab). */
export function ratePlanOptions(plans: readonly RatePlanOption[]) {
  return [{ value: "", label: "Not known yet" }, ...plans.map((p) => ({ value: p.id, label: `${p.utilityName} — ${p.name}` }))];
}

/** The household's fields, shared by the new-lead form and the Household tab. */
export function HouseholdFields({ register, errors }: { register: UseFormRegister<HouseholdInput>; errors: FieldErrors<HouseholdInput> }) {
  return (
    <>
      <fieldset className="grid gap-4 sm:grid-cols-2">
        <legend className="mb-2 text-sm font-semibold uppercase tracking-wide text-graphite-soft">Household</legend>
        <Field id="name" label="Household name" placeholder="Rivera household" error={errors.name?.message} {...register("name")} />
        <Field id="contactName" label="Main contact" autoComplete="off" error={errors.contactName?.message} {...register("contactName")} />
        <Field id="email" label="E-mail" type="email" autoComplete="off" error={errors.email?.message} {...register("email")} />
        <Field id="phone" label="Phone" type="tel" autoComplete="off" error={errors.phone?.message} {...register("phone")} />
        <Field id="secondContactName" label="Second contact (optional)" error={errors.secondContactName?.message} {...register("secondContactName")} />
        <Field id="secondContactEmail" label="Second contact e-mail" type="email" error={errors.secondContactEmail?.message} {...register("secondContactEmail")} />
      </fieldset>
      <fieldset className="grid gap-4 sm:grid-cols-2">
        <legend className="mb-2 text-sm font-semibold uppercase tracking-wide text-graphite-soft">Site</legend>
        <div className="sm:col-span-2">
          <Field id="street" label="Street address" error={errors.street?.message} {...register("street")} />
        </div>
        <Field id="city" label="City" error={errors.city?.message} {...register("city")} />
        <div className="grid grid-cols-2 gap-4">
          <Field id="region" label="State" error={errors.region?.message} {...register("region")} />
          <Field id="postalCode" label="ZIP" inputMode="numeric" error={errors.postalCode?.message} {...register("postalCode")} />
        </div>
        <Field id="latitude" label="Latitude (°N)" inputMode="decimal" error={errors.latitude?.message} {...register("latitude", { setValueAs: numberFromField })} />
        <Field id="longitude" label="Longitude (°E, negative in the Americas)" inputMode="decimal" error={errors.longitude?.message} {...register("longitude", { setValueAs: numberFromField })} />
      </fieldset>
    </>
  );
}
