import type { SelectHTMLAttributes } from 'react';

/** A labelled select with its error messages announced beside it. */
export function SelectField({
  label,
  name,
  options,
  errors,
  ...select
}: SelectHTMLAttributes<HTMLSelectElement> & {
  label: string;
  name: string;
  options: { value: string; label: string }[];
  errors?: string[] | undefined;
}) {
  const id = select.id ?? `field-${name}`;
  return (
    <div>
      <label htmlFor={id} className="gw-label">
        {label}
      </label>
      <select
        id={id}
        name={name}
        aria-describedby={`${id}-error`}
        aria-invalid={errors?.length ? true : undefined}
        className="gw-input mt-1"
        {...select}
      >
        {options.map((option) => (
          <option key={option.value} value={option.value}>
            {option.label}
          </option>
        ))}
      </select>
      <p id={`${id}-error`} aria-live="polite" className="mt-1 min-h-4 text-xs text-signal-fail">
        {errors?.join(' ')}
      </p>
    </div>
  );
}
