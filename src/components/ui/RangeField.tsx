import type { ReactNode } from 'react';
import { get, useController, useFormState, type FieldError as FormError, type FieldPath, type FieldValues } from 'react-hook-form';
import { FieldError } from './FieldError';
import type { BoundField } from './form-field';

interface Props<T extends FieldValues> extends BoundField<T> {
  id: string;
  legend: string;
  /** Shown after the inputs: a unit, or a unit switch. */
  unit: ReactNode;
}

/**
 * A "from … to …" pair of number inputs sharing one unit, bound to a form field holding the two
 * ends as typed; one error, under the field's own name, speaks for the range or either end.
 */
export function RangeField<T extends FieldValues>({ control, name, id, legend, unit }: Props<T>) {
  const ends = [useController({ control, name: `${name}.0` as FieldPath<T> }).field, useController({ control, name: `${name}.1` as FieldPath<T> }).field];
  const { errors } = useFormState({ control, name });
  const error = (get(errors, name) as FormError | undefined)?.message;
  const input = (i: 0 | 1, label: string) => (
    <input
      {...ends[i]}
      className="input tabular min-w-0"
      id={`${id}-${i === 0 ? 'min' : 'max'}`}
      type="number"
      inputMode="decimal"
      step="any"
      aria-label={`${legend}: ${label}`}
      placeholder={label}
      aria-invalid={error ? true : undefined}
      aria-describedby={error ? `${id}-error` : undefined}
    />
  );
  return (
    <fieldset className="field">
      <legend className="field-label mb-1">{legend}</legend>
      <div className="flex items-center gap-2">
        {input(0, 'from')}
        <span className="text-sm text-ash-600">to</span>
        {input(1, 'to')}
        {unit}
      </div>
      <FieldError id={`${id}-error`} message={error} />
    </fieldset>
  );
}
