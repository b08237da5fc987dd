"use client";
import type { UseFormReturn } from "react-hook-form";
import { Field, SelectField, optionsOf } from "@/components/ui/field";
import { LOCALES, LOCALE_NAMES } from "@/lib/i18n/locales";
import type { HouseholdInput } from "@/lib/schemas/deal";
import { numberFromField } from "@/lib/schemas/text";
import type { FieldLabels } from "@/lib/validation-messages";
import { SitePosition } from "./site-position";

export type UtilityChoices = { utilities: { id: string; name: string }[]; plans: { id: string; name: string; utilityId: string }[] };
export type UtilityPick = { utilityId: string; ratePlanId: string };

/**
 * The household's utility from the company's list, and one of that utility's rate plans (the
 * new-lead form and the Household tab). With no utility picked yet the plan list holds every
 * utility's plans by name, and picking one picks its utility too (one tap at the door).
 */
export function UtilityPlanSelects({ choices, value, onChange, errors }: { choices: UtilityChoices; value: UtilityPick; onChange: (next: UtilityPick) => void; errors: { utilityId?: string; ratePlanId?: string } }) {
  const utilityName = new Map(choices.utilities.map((u) => [u.id, u.name]));
  const plans = value.utilityId ? choices.plans.filter((p) => p.utilityId === value.utilityId) : choices.plans;
  return (
    <>
      <SelectField
        id="utilityId"
        label="Utility"
        error={errors.utilityId}
        hint={choices.utilities.length === 0 ? "The office adds utilities on the Utilities screen (Rate plans)." : undefined}
        options={[{ value: "", label: "Not known yet" }, ...choices.utilities.map((u) => ({ value: u.id, label: u.name }))]}
        value={value.utilityId}
        onChange={(e) => onChange({ utilityId: e.target.value, ratePlanId: e.target.value === value.utilityId ? value.ratePlanId : "" })}
      />
      <SelectField
        id="ratePlanId"
        label="Rate plan"
        error={errors.ratePlanId}
        options={[{ value: "", label: "Not known yet" }, ...plans.map((p) => ({ value: p.id, label: value.utilityId ? p.name : `${utilityName.get(p.utilityId) ?? ""} — ${p.name}` }))]}
        value={value.ratePlanId}
        onChange={(e) => onChange({ utilityId: choices.plans.find((p) => p.id === e.target.value)?.utilityId ?? value.utilityId, ratePlanId: e.target.value })}
      />
    </>
  );
}

/** The household's fields, shared by the new-lead form and the Household tab. */
export function HouseholdFields({ form }: { form: UseFormReturn<HouseholdInput> }) {
  const { register } = form;
  const errors = form.formState.errors;
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
        <SelectField
          id="language"
          label="Homeowner's language"
          hint="Their proposal page, PDF and e-mails."
          options={optionsOf(LOCALES, LOCALE_NAMES)}
          error={errors.language?.message}
          {...register("language")}
        />
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
        <SitePosition form={form} />
      </fieldset>
    </>
  );
}

/** The household's labels as the fields show them, for messages that name a field. */
export const HOUSEHOLD_LABELS: FieldLabels = {
  name: "Household name",
  contactName: "Main contact",
  email: "E-mail",
  phone: "Phone",
  secondContactName: "Second contact",
  secondContactEmail: "Second contact e-mail",
  secondContactPhone: "Second contact phone",
  street: "Street address",
  city: "City",
  region: "State",
  postalCode: "ZIP",
  latitude: "Latitude (°N)",
  longitude: "Longitude (°E)",
  utilityId: "Utility",
  ratePlanId: "Rate plan",
};
