/**
 * One choice among a few, as radio buttons in a row (wrapping on a phone). `legend` shows a
 * visible label; without it `label` names the group for screen readers only.
 */
export function RadioGroup<T extends string>(props: {
  name: string;
  label: string;
  legend?: boolean;
  options: readonly (readonly [value: T, label: string])[];
  value: T;
  onChange: (value: T) => void;
  disabled?: boolean;
}) {
  const choices = (
    <div className="flex flex-wrap gap-x-6 gap-y-1 text-sm" role={props.legend ? undefined : "radiogroup"} aria-label={props.legend ? undefined : props.label}>
      {props.options.map(([value, label]) => (
        <label key={value} className="flex min-h-touch items-center gap-2">
          <input type="radio" name={props.name} value={value} checked={props.value === value} disabled={props.disabled} onChange={() => props.onChange(value)} />
          {label}
        </label>
      ))}
    </div>
  );
  if (!props.legend) return choices;
  return (
    <fieldset>
      <legend className="field-label">{props.label}</legend>
      {choices}
    </fieldset>
  );
}
